import { createHash } from 'node:crypto';

import type { INestApplication } from '@nestjs/common';
import { DocumentBuilder, type OpenAPIObject, SwaggerModule } from '@nestjs/swagger';

import { APP_VERSION } from '../config/env.schema.js';
import { ErrorResponseSchema } from '../domain/http/error-response.schema.js';
import { toOpenApiSchema } from './api-contract.decorator.js';

const ERROR_REF = { $ref: '#/components/schemas/ErrorResponse' };
const METHODS = ['get', 'put', 'post', 'delete', 'options', 'head', 'patch', 'trace'] as const;

/**
 * The API's OpenAPI document: routes from Nest's metadata, bodies and responses from each route's
 * `@ApiContract` zod schemas, and the one error shape (`ErrorResponse`) on every error answer.
 */
export function buildOpenApiDocument(app: INestApplication): OpenAPIObject {
  const document = SwaggerModule.createDocument(
    app,
    new DocumentBuilder()
      .setTitle('Loamline API')
      .setDescription('As-built records, cable and load computation, and handover packets.')
      .setVersion(APP_VERSION)
      .addBearerAuth()
      .build(),
  );
  return withContractSchemas(document);
}

/** Hoists zod's `definitions` into `components.schemas` and gives every error answer the error shape. */
export function withContractSchemas(document: OpenAPIObject): OpenAPIObject {
  const components = (document.components ??= {});
  const schemas = (components.schemas ??= {});
  schemas.ErrorResponse = toOpenApiSchema(ErrorResponseSchema, 'output');
  for (const pathItem of Object.values(document.paths)) {
    for (const method of METHODS) {
      const operation = pathItem[method];
      if (!operation) continue;
      hoistDefinitions(operation, schemas);
      operation.responses.default ??= { description: 'An error: the body names its `code` and, for a 400, each bad field' };
      for (const [status, response] of Object.entries(operation.responses)) {
        const isError = status === 'default' || Number(status) >= 400;
        if (isError && response && !('$ref' in response) && !response.content) {
          response.content = { 'application/json': { schema: ERROR_REF } };
        }
      }
    }
  }
  return document;
}

type Json = Record<string, unknown>;

/**
 * `z.toJSONSchema` writes a recursive schema's parts under a local `definitions` key with
 * `#/definitions/…` references, which mean nothing inside an OpenAPI document. Each set is moved into
 * `components.schemas` under a name made from its content (the same part used twice is stored once).
 */
function hoistDefinitions(node: unknown, schemas: Json): void {
  if (!node || typeof node !== 'object') return;
  if (Array.isArray(node)) {
    for (const child of node) hoistDefinitions(child, schemas);
    return;
  }
  const record = node as Json;
  const definitions = record.definitions as Json | undefined;
  if (definitions && typeof definitions === 'object') {
    delete record.definitions;
    const digest = createHash('sha256').update(JSON.stringify(definitions)).digest('hex').slice(0, 10);
    const names = new Map(Object.keys(definitions).map((name) => [name, `Contract_${digest}_${name.replace(/[^A-Za-z0-9_]/g, '')}`]));
    const rewrite = (value: unknown): unknown => {
      if (Array.isArray(value)) return value.map(rewrite);
      if (!value || typeof value !== 'object') return value;
      return Object.fromEntries(
        Object.entries(value as Json).map(([key, child]) => {
          if (key === '$ref' && typeof child === 'string' && child.startsWith('#/definitions/')) {
            return [key, `#/components/schemas/${names.get(child.slice('#/definitions/'.length)) ?? child}`];
          }
          return [key, rewrite(child)];
        }),
      );
    };
    Object.assign(record, rewrite({ ...record }));
    for (const [name, definition] of Object.entries(definitions)) schemas[names.get(name)!] = rewrite(definition);
  }
  for (const child of Object.values(record)) hoistDefinitions(child, schemas);
}
