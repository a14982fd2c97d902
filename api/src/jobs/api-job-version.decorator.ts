import { applyDecorators } from '@nestjs/common';
import { ApiHeader, ApiResponse } from '@nestjs/swagger';

/**
 * OpenAPI for the optimistic-locking protocol shared by every write to a job or its children.
 */
export function ApiJobVersion() {
  return applyDecorators(
    ApiHeader({
      name: 'If-Match',
      required: false,
      description:
        'The job `version` you last read (from GET /api/jobs/:id, the as-built, or `jobVersion` of your previous write), ' +
        'e.g. `If-Match: "7"`. May instead be sent as `expectedVersion` in a JSON body. Each successful write increments ' +
        'the version and answers with the new one (`jobVersion`, or `version` for job-level writes).',
    }),
    ApiResponse({
      status: 412,
      description:
        '`VERSION_CONFLICT` (Precondition Failed, RFC 9110 §13.1.1): someone saved the job since you read it; nothing was ' +
        'written. The body carries `currentVersion`: reload (or merge) and retry.',
    }),
    ApiResponse({ status: 409, description: 'The job’s status does not allow the change (the code says why); nothing was written.' }),
    ApiResponse({ status: 428, description: '`VERSION_REQUIRED`: neither If-Match nor expectedVersion was sent.' }),
  );
}
