import type { NestExpressApplication } from '@nestjs/platform-express';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { contractRoutes } from '../support/contract.js';
import { createTestApp } from '../support/test-app.js';


/**
 * Issue 20: the OpenAPI document is generated from each route's zod contract (`@ApiContract`). Every
 * route must say what it answers on success (a JSON schema, a file's media type, or explicitly no body),
 * every write must say what it takes (a schema, an upload, or explicitly nothing), and every error
 * answer carries the one error shape. Offenders are listed by route.
 */
type Operation = {
  requestBody?: { content?: Record<string, { schema?: object }> };
  responses: Record<string, { content?: Record<string, { schema?: object }>; $ref?: string }>;
  'x-empty-responses'?: string[];
  'x-no-request-body'?: boolean;
};

describe('OpenAPI contract', () => {
  let app: NestExpressApplication;
  let document: { paths: Record<string, Record<string, Operation>>; components: { schemas: Record<string, object> } };

  beforeAll(async () => {
    app = await createTestApp();
    const res = await request(app.getHttpServer()).get('/api/docs-json');
    expect(res.status).toBe(200);
    document = res.body;
  });

  afterAll(async () => {
    await app?.close();
  });

  function operations() {
    return Object.entries(document.paths)
      .flatMap(([path, item]) => Object.entries(item).map(([method, operation]) => ({ route: `${method.toUpperCase()} ${path}`, method, operation })));
  }

  it('has an @ApiContract on every route the API serves', () => {
    const missing = [...contractRoutes(app)].filter(([, contract]) => !contract).map(([route]) => route);
    expect(missing).toEqual([]);
  });

  it('has many routes (the walk below is not vacuous)', () => {
    expect(operations().length).toBeGreaterThan(100);
  });

  it('gives every route a response schema for each success it answers', () => {
    const offenders: string[] = [];
    for (const { route, operation } of operations()) {
      const successes = Object.entries(operation.responses).filter(([status]) => /^2\d\d$/.test(status));
      if (successes.length === 0) offenders.push(`${route}: no success response`);
      for (const [status, response] of successes) {
        const isEmpty = operation['x-empty-responses']?.includes(status);
        const schemas = Object.values(response.content ?? {}).filter((media) => media.schema);
        if (!isEmpty && schemas.length === 0) offenders.push(`${route}: ${status} has no schema`);
      }
    }
    expect(offenders).toEqual([]);
  });

  it('gives every write route a request schema (or says it takes no body)', () => {
    const offenders = operations()
      .filter(({ method }) => ['post', 'put', 'patch'].includes(method))
      .filter(({ operation }) => !operation['x-no-request-body'])
      .filter(({ operation }) => !Object.values(operation.requestBody?.content ?? {}).some((media) => media.schema))
      .map(({ route }) => route);
    expect(offenders).toEqual([]);
  });

  it('answers every error with the shared error shape (or the schema the route declares for it)', () => {
    expect(document.components.schemas.ErrorResponse).toMatchObject({ type: 'object', required: ['statusCode', 'error', 'message'] });
    const offenders: string[] = [];
    for (const { route, operation } of operations()) {
      if (!operation.responses.default) offenders.push(`${route}: no default (error) response`);
      for (const [status, response] of Object.entries(operation.responses)) {
        if (status !== 'default' && Number(status) < 400) continue;
        const schema = response.content?.['application/json']?.schema;
        // A route may answer an error with its own body (health's 503 is a HealthResponse saying what is down).
        const isErrorShape = JSON.stringify(schema) === JSON.stringify({ $ref: '#/components/schemas/ErrorResponse' });
        if (!schema || (status === 'default' && !isErrorShape)) offenders.push(`${route}: ${status} is not an ErrorResponse`);
      }
    }
    expect(offenders).toEqual([]);
  });

  it('leaves no reference that points nowhere (zod definitions are moved into components)', () => {
    const refs = [...JSON.stringify(document).matchAll(/"\$ref":"([^"]+)"/g)].map((m) => m[1]!);
    const dangling = [...new Set(refs)].filter(
      (ref) => !ref.startsWith('#/components/schemas/') || !(ref.slice('#/components/schemas/'.length) in document.components.schemas),
    );
    expect(dangling).toEqual([]);
  });
});
