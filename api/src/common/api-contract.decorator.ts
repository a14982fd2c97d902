import { applyDecorators, SetMetadata } from '@nestjs/common';
import { ApiBody, ApiConsumes, ApiExtension, ApiQuery, ApiResponse, type OpenAPIObject } from '@nestjs/swagger';
import { z } from 'zod';

/** An OpenAPI schema object (the package does not export its own type). */
type SchemaObject = Exclude<NonNullable<NonNullable<OpenAPIObject['components']>['schemas']>[string], { $ref: string }>;

/** Metadata key under which a handler keeps its contract (read by the OpenAPI build and the contract tests). */
export const API_CONTRACT = 'loamline:api-contract';

/** A response that is not JSON: a file or drawing in one of these media types. */
export interface FileResponse {
  kind: 'file';
  contentTypes: string[];
}

/** A success without a body (204, or a 202 that only says "accepted"). */
export interface EmptyResponse {
  kind: 'empty';
}

/** A multipart/form-data upload: file fields (one file or several) and optional text fields. */
export interface MultipartBody {
  kind: 'multipart';
  files: Record<string, 'one' | 'many'>;
  fields?: z.ZodObject;
}

export type ContractResponse = z.ZodType | FileResponse | EmptyResponse;

export interface ApiContractSpec {
  /**
   * The JSON body the route takes (validated by `ZodValidationPipe` with the same schema), an upload,
   * or `'none'` for a write that takes no body (a resend, a restore).
   */
  body?: z.ZodType | MultipartBody | 'none';
  /** The query string the route takes. */
  query?: z.ZodObject;
  /** Every success status the route answers, with what it answers. Errors share `ErrorResponseSchema`. */
  responses: Record<number, ContractResponse>;
}

export const emptyResponse: EmptyResponse = { kind: 'empty' };

export function fileResponse(...contentTypes: string[]): FileResponse {
  return { kind: 'file', contentTypes };
}

export function multipartBody(files: MultipartBody['files'], fields?: z.ZodObject): MultipartBody {
  return { kind: 'multipart', files, fields };
}

export function isZodSchema(value: unknown): value is z.ZodType {
  return value instanceof z.ZodType;
}

/**
 * The JSON Schema (OpenAPI 3.0 dialect) of a zod schema: `input` for what a client sends (before
 * defaults and coercion), `output` for what the API answers. Recursive parts come out under
 * `definitions`; `buildOpenApiDocument` moves those into `components.schemas`.
 */
export function toOpenApiSchema(schema: z.ZodType, io: 'input' | 'output'): SchemaObject {
  const json = z.toJSONSchema(schema, { target: 'openapi-3.0', io, unrepresentable: 'any' }) as Record<string, unknown>;
  delete json.$schema;
  return json as SchemaObject;
}

function multipartSchema(body: MultipartBody): SchemaObject {
  const fields = body.fields ? toOpenApiSchema(body.fields, 'input') : { type: 'object', properties: {} };
  const properties: Record<string, SchemaObject> = { ...(fields.properties as Record<string, SchemaObject>) };
  for (const [name, count] of Object.entries(body.files)) {
    const file: SchemaObject = { type: 'string', format: 'binary' };
    properties[name] = count === 'one' ? file : { type: 'array', items: file };
  }
  return { ...fields, type: 'object', properties, required: [...(fields.required ?? []), ...Object.keys(body.files)] };
}

/**
 * The one place a route states what it takes and answers. The zod schemas are kept as metadata (the
 * contract tests parse real answers with them) and turned into the route's OpenAPI request body, query
 * parameters and responses, so the document cannot say something the schemas do not.
 */
export function ApiContract(spec: ApiContractSpec): MethodDecorator {
  const decorators: (MethodDecorator | ClassDecorator)[] = [SetMetadata(API_CONTRACT, spec)];
  if (spec.body === 'none') {
    decorators.push(ApiExtension('x-no-request-body', true));
  } else if (spec.body && isZodSchema(spec.body)) {
    decorators.push(ApiBody({ schema: toOpenApiSchema(spec.body, 'input') }));
  } else if (spec.body) {
    decorators.push(ApiConsumes('multipart/form-data'), ApiBody({ schema: multipartSchema(spec.body) }));
  }
  if (spec.query) {
    const query = toOpenApiSchema(spec.query, 'input');
    const required = new Set(query.required ?? []);
    for (const [name, schema] of Object.entries((query.properties ?? {}) as Record<string, SchemaObject>)) {
      decorators.push(ApiQuery({ name, required: required.has(name), schema }));
    }
  }
  const empty: string[] = [];
  for (const [status, response] of Object.entries(spec.responses)) {
    const code = Number(status);
    if (isZodSchema(response)) {
      decorators.push(ApiResponse({ status: code, description: 'Success', schema: toOpenApiSchema(response, 'output') }));
    } else if (response.kind === 'file') {
      const content = Object.fromEntries(response.contentTypes.map((type) => [type, { schema: { type: 'string', format: 'binary' } }]));
      decorators.push(ApiResponse({ status: code, description: `A file (${response.contentTypes.join(', ')})`, content }));
    } else {
      empty.push(status);
      decorators.push(ApiResponse({ status: code, description: 'Success, no body' }));
    }
  }
  if (empty.length > 0) decorators.push(ApiExtension('x-empty-responses', empty));
  return applyDecorators(...decorators);
}
