import { applyDecorators } from '@nestjs/common';
import { ApiHeader, ApiResponse } from '@nestjs/swagger';

/** OpenAPI for the optimistic-locking protocol of every write to a site or what belongs to it. */
export function ApiSiteVersion() {
  return applyDecorators(
    ApiHeader({
      name: 'If-Match',
      required: false,
      description:
        'The site `version` you last read (from GET /api/sites/:id, or `siteVersion` of your previous write), e.g. ' +
        '`If-Match: "4"`. May instead be sent as `expectedVersion` in a JSON body. Each successful write increments the ' +
        'site’s version and answers with it (`siteVersion`, or `version` on the whole site); a change to the site’s plan or ' +
        'reference points also bumps the version of every open job on the site (`jobVersions`).',
    }),
    ApiResponse({ status: 403, description: '`NOT_ON_SITE_CREW` / `ROLE_NOT_ALLOWED`: nothing was written.' }),
    ApiResponse({
      status: 412,
      description:
        '`VERSION_CONFLICT` (Precondition Failed, RFC 9110 §13.1.1): someone changed the site since you read it (body: ' +
        '`currentVersion`). Nothing was written.',
    }),
    ApiResponse({
      status: 409,
      description: '`SITE_JOBS_IN_REVIEW`: a job on the site is submitted or ready to issue (body: `jobs`). Nothing was written.',
    }),
    ApiResponse({ status: 428, description: '`VERSION_REQUIRED`: neither If-Match nor expectedVersion was sent.' }),
  );
}
