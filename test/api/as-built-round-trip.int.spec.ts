import type { NestExpressApplication } from '@nestjs/platform-express';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { analyzeAsBuilt } from '../../api/src/domain/analysis/analyze.js';
import { AsBuiltSchema } from '../../api/src/domain/as-built/as-built.schema.js';
import { DEMO_AS_BUILT } from '../../api/src/domain/as-built/demo-as-built.js';
import { createCompany, type TestCompany } from '../support/fixtures.js';
import { type Api, apiAs, createJob, createSite, recordAsBuilt, translateIds } from '../support/records.js';
import { signIn } from '../support/session.js';
import { createTestApp } from '../support/test-app.js';

type FindingLike = { code: string; severity: string; path: (string | number)[]; itemId?: string; runId?: string };

const findingKeys = (findings: FindingLike[]) =>
  findings.map((f) => `${f.severity} ${f.code} ${f.path.join('.')} ${f.itemId ?? ''} ${f.runId ?? ''}`).sort();

describe('GET /api/jobs/:id/as-built (the demo job recorded through the API)', () => {
  let app: NestExpressApplication;
  let company: TestCompany;
  let office: Api;
  let lead: Api;
  let jobId: string;
  let ids: Map<string, string>;
  let version: number;

  beforeAll(async () => {
    app = await createTestApp();
    company = await createCompany('Round Trip');
    office = apiAs(app, await signIn(app, company.users.office));
    lead = apiAs(app, await signIn(app, company.users.lead));
    const { siteId } = await createSite(office, DEMO_AS_BUILT.site);
    const job = await createJob(office, siteId, { crewLeadUserId: company.users.lead.id });
    ({ ids, version } = await recordAsBuilt(lead, job, DEMO_AS_BUILT));
    jobId = job.id;
  });

  afterAll(async () => {
    await app.close();
  });

  it('should return the recorded as-built, equal to the demo with database ids', async () => {
    const body = await lead.expectOk('get', `/api/jobs/${jobId}/as-built`);
    expect(AsBuiltSchema.parse(body.asBuilt)).toEqual(body.asBuilt);
    const { units: _units, ...expected } = translateIds(DEMO_AS_BUILT, ids);
    expect(body.asBuilt).toEqual(expected);
    expect(body.job).toMatchObject({ id: jobId, status: 'draft', version, revision: 1 });
  });

  it('should return the same analysis findings as the demo, including the shallow station', async () => {
    const body = await lead.expectOk('get', `/api/jobs/${jobId}/as-built`);
    const expected = translateIds(analyzeAsBuilt(DEMO_AS_BUILT).findings, ids) as FindingLike[];
    expect(findingKeys(body.analysis.findings)).toEqual(findingKeys(expected));
    expect(body.analysis.findings.some((f: FindingLike) => f.path.join('.') === 'runs.3.depthReadings.1')).toBe(true);
    expect(body.analysis.channels).toHaveLength(2);
  });

  it('should give every depth reading an id, parallel to the as-built', async () => {
    const body = await lead.expectOk('get', `/api/jobs/${jobId}/as-built`);
    for (const run of body.asBuilt.runs as { id: string; depthReadings?: unknown[] }[]) {
      expect(body.records.depthReadingIds[run.id] ?? []).toHaveLength(run.depthReadings?.length ?? 0);
    }
  });

  it('should read the as-built in a fixed number of queries whatever its size', async () => {
    const { withQueryCount } = await import('../support/query-count.js');
    const small = await createJob(office, (await createSite(office)).siteId);
    const smallCount = await withQueryCount(() => lead.expectOk('get', `/api/jobs/${small.id}/as-built`));
    // A notes change bumps the demo job's version, so its next read is computed afresh (not from the as-built cache).
    const { version: current } = await lead.expectOk('get', `/api/jobs/${jobId}`);
    await lead.expectOk('patch', `/api/jobs/${jobId}`, { notes: 'Fixture note' }, { 'If-Match': `"${current}"` });
    const demoCount = await withQueryCount(() => lead.expectOk('get', `/api/jobs/${jobId}/as-built`));
    expect(smallCount).toBeGreaterThan(10);
    expect(demoCount).toBe(smallCount);
  });
});
