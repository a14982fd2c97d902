import type { NestExpressApplication } from '@nestjs/platform-express';
import pg from 'pg';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { PG_POOL } from '../../api/src/db/db.module.js';
import { HealthResponseSchema } from '../../api/src/domain/health/health.schema.js';
import { createTestApp } from '../support/test-app.js';

describe('GET /api/health', () => {
  let app: NestExpressApplication;

  beforeAll(async () => {
    app = await createTestApp();
  });

  afterAll(async () => {
    await app.close();
  });

  it('should report ok with the database up and its latency', async () => {
    const res = await request(app.getHttpServer()).get('/api/health').expect(200);
    const body = HealthResponseSchema.parse(res.body);
    expect(body.status).toBe('ok');
    expect(body.database).toMatchObject({ status: 'up' });
    expect(body.database.status === 'up' && body.database.latencyMs).toBeGreaterThanOrEqual(0);
    expect(res.headers['cache-control']).toBe('no-store');
  });

  it('should send security headers from helmet', async () => {
    const res = await request(app.getHttpServer()).get('/api/health');
    expect(res.headers['content-security-policy']).toContain("default-src 'self'");
    expect(res.headers['x-content-type-options']).toBe('nosniff');
    expect(res.headers['x-powered-by']).toBeUndefined();
  });

  it('should answer unknown API routes with the common error body', async () => {
    const res = await request(app.getHttpServer()).get('/api/no-such-thing').expect(404);
    expect(res.body).toMatchObject({ statusCode: 404, error: 'Not Found' });
    expect(typeof res.body.message).toBe('string');
  });

  it('should serve the OpenAPI document with the health route', async () => {
    const res = await request(app.getHttpServer()).get('/api/docs-json').expect(200);
    expect(res.body.info.title).toBe('Loamline API');
    expect(Object.keys(res.body.paths)).toContain('/api/health');
  });
});

describe('GET /api/health with the database down', () => {
  let app: NestExpressApplication;
  let deadPool: pg.Pool;

  beforeAll(async () => {
    // A pool aimed at a loopback port where nothing listens stands in for a stopped database.
    deadPool = new pg.Pool({ connectionString: 'postgres://nobody:x@127.0.0.1:9/none', connectionTimeoutMillis: 500 });
    app = await createTestApp({ override: (b) => b.overrideProvider(PG_POOL).useValue(deadPool) });
  });

  afterAll(async () => {
    await app.close();
  });

  it('should answer 503 with the database reported down', async () => {
    const res = await request(app.getHttpServer()).get('/api/health').expect(503);
    expect(HealthResponseSchema.parse(res.body)).toMatchObject({ status: 'error', database: { status: 'down' } });
  });
});
