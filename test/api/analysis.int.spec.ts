import type { NestExpressApplication } from '@nestjs/platform-express';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { DEMO_AS_BUILT } from '../../api/src/domain/as-built/demo-as-built.js';
import { createCompany, type TestCompany } from '../support/fixtures.js';
import { bearer, type Session, signIn } from '../support/session.js';
import { createTestApp } from '../support/test-app.js';

describe('POST /api/analysis', () => {
  let app: NestExpressApplication;
  let company: TestCompany;
  let lead: Session;
  const post = (body: unknown) =>
    request(app.getHttpServer()).post('/api/analysis').set(bearer(lead)).set('Content-Type', 'application/json').send(body as object);

  beforeAll(async () => {
    app = await createTestApp();
    company = await createCompany('Analysis Co');
    lead = await signIn(app, company.users.lead);
  });

  afterAll(async () => {
    await app.close();
  });

  it('should analyse the demo job and report its shallow station', async () => {
    const res = await post({ asBuilt: DEMO_AS_BUILT }).expect(200);
    expect(res.body.assumptions.conductorTemperatureC).toBe(20);
    expect(res.body.channels.length).toBeGreaterThan(0);
    const shallow = res.body.findings.filter((f: { path: (string | number)[] }) => f.path.join('.') === 'runs.3.depthReadings.1');
    expect(shallow).toHaveLength(1);
  });

  it.each<[string, (ab: typeof DEMO_AS_BUILT) => unknown, string]>([
    ['a negative length', (ab) => ({ ...ab, runs: ab.runs.map((r, i) => (i === 3 ? { ...r, measuredLengthM: -5 } : r)) }), 'asBuilt.runs.3.measuredLengthM'],
    ['an unknown gauge', (ab) => ({ ...ab, runs: ab.runs.map((r, i) => (i === 0 ? { ...r, gauge: { system: 'awg', awg: 13.5 } } : r)) }), 'asBuilt.runs.0.gauge.awg'],
    // The gauges the cable table has no row for (domain/cable/wire.ts): a 400 at the field, never a 500.
    ['an AWG past the table', (ab) => ({ ...ab, runs: ab.runs.map((r, i) => (i === 1 ? { ...r, gauge: { system: 'awg', awg: 41 } } : r)) }), 'asBuilt.runs.1.gauge.awg'],
    ['a metric size outside IEC 60228', (ab) => ({ ...ab, runs: ab.runs.map((r, i) => (i === 2 ? { ...r, gauge: { system: 'mm2', mm2: 3 } } : r)) }), 'asBuilt.runs.2.gauge.mm2'],
    ['a run to a missing item', (ab) => ({ ...ab, runs: ab.runs.map((r, i) => (i === 4 ? { ...r, toItemId: 'nowhere' } : r)) }), 'asBuilt.runs.4.toItemId'],
    // JSON has no NaN; a client that serialises NaN sends null, which must be refused at the field.
    ['a NaN (null) depth', (ab) => ({ ...ab, runs: ab.runs.map((r, i) => (i === 1 ? { ...r, depthReadings: r.depthReadings!.map((d, j) => (j === 0 ? { ...d, depthM: null } : d)) } : r)) }), 'asBuilt.runs.1.depthReadings.0.depthM'],
    ['a cycle', (ab) => ({ ...ab, runs: [...ab.runs, { ...ab.runs[2]!, id: 'run-back', fromItemId: ab.runs[2]!.toItemId, toItemId: ab.runs[2]!.fromItemId }] }), `asBuilt.runs.${DEMO_AS_BUILT.runs.length}.toItemId`],
  ])('should answer 400 naming the field for %s', async (_name, mutate, path) => {
    const res = await post({ asBuilt: mutate(structuredClone(DEMO_AS_BUILT)) }).expect(400);
    expect(res.body).toMatchObject({ statusCode: 400, error: 'Bad Request', code: 'VALIDATION_FAILED' });
    expect(res.body.issues.map((i: { path: string }) => i.path)).toContain(path);
  });

  it('should answer 400 in the common shape for malformed JSON', async () => {
    const res = await post('{"asBuilt": ').expect(400);
    expect(res.body).toMatchObject({ statusCode: 400, error: 'Bad Request' });
  });

  it('should answer 413 for a body over the limit', async () => {
    const res = await post({ asBuilt: DEMO_AS_BUILT, padding: 'x'.repeat(6 * 1024 * 1024) }).expect(413);
    expect(res.body).toMatchObject({ statusCode: 413 });
  });

  it('should refuse a homeowner', async () => {
    const homeowner = await signIn(app, company.users.homeowner);
    await request(app.getHttpServer()).post('/api/analysis').set(bearer(homeowner)).send({ asBuilt: DEMO_AS_BUILT }).expect(403);
  });
});
