import type { NestExpressApplication } from '@nestjs/platform-express';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { DEMO_AS_BUILT } from '../../api/src/domain/as-built/demo-as-built.js';
import { createCompany, type TestCompany } from '../support/fixtures.js';
import { withQueryCount } from '../support/query-count.js';
import { type Api, apiAs, createJob, createSite, type JobFixture, recordAsBuilt, siteWrite } from '../support/records.js';
import { signIn } from '../support/session.js';
import { createTestApp } from '../support/test-app.js';

/*
 * The as-built read path (issue 20): the computed as-built is kept in process under job version, site
 * version and the company's depth rule table, so a repeated read costs one query (besides the token's user); any write makes a
 * fresh answer. Versioned GETs answer with an ETag and 304 on If-None-Match.
 */
describe('as-built cache and ETags on versioned GETs', () => {
  let app: NestExpressApplication;
  let company: TestCompany;
  let office: Api;
  let lead: Api;
  let admin: Api;
  let job: JobFixture;
  let ids: Map<string, string>;

  beforeAll(async () => {
    app = await createTestApp();
    company = await createCompany('Read Path');
    office = apiAs(app, await signIn(app, company.users.office));
    lead = apiAs(app, await signIn(app, company.users.lead));
    admin = apiAs(app, await signIn(app, company.users.admin));
    const { siteId } = await createSite(office, DEMO_AS_BUILT.site);
    job = await createJob(office, siteId, { crewLeadUserId: company.users.lead.id });
    let version: number;
    ({ ids, version } = await recordAsBuilt(lead, job, DEMO_AS_BUILT));
    job = { ...job, version };
  });

  afterAll(async () => {
    await app.close();
  });

  const asBuiltPath = () => `/api/jobs/${job.id}/as-built`;

  it('should answer a repeated as-built read from the cache in one query, equal to the first answer', async () => {
    const first = await lead.send('get', asBuiltPath());
    expect(first.status).toBe(200);
    expect(first.headers['content-type']).toMatch(/^application\/json/);
    const queries = await withQueryCount(async () => {
      const again = await lead.send('get', asBuiltPath());
      expect(again.status).toBe(200);
      expect(again.body).toEqual(first.body);
      expect(again.headers.etag).toBe(first.headers.etag);
    });
    // One for the signed-in user behind the bearer token (AuthService.validateAccessToken), one for the
    // job with its site version and depth rules; the record, its analysis and its JSON come from the cache.
    expect(queries).toBe(2);
  });

  it('should answer 304 without a body to If-None-Match naming the current ETag, and 200 to a stale one', async () => {
    const first = await lead.send('get', asBuiltPath());
    const etag = first.headers.etag as string;
    expect(etag).toMatch(/^"[A-Za-z0-9_-]+"$/);
    expect(first.headers['cache-control']).toBe('no-store');
    const notModified = await lead.send('get', asBuiltPath(), undefined, { 'If-None-Match': etag });
    expect(notModified.status).toBe(304);
    expect(notModified.text ?? '').toBe('');
    expect((await lead.send('get', asBuiltPath(), undefined, { 'If-None-Match': `W/${etag}, "other"` })).status).toBe(304);
    expect((await lead.send('get', asBuiltPath(), undefined, { 'If-None-Match': '"stale"' })).status).toBe(200);
  });

  it('should compute a fresh as-built and analysis after a record write bumps the job version', async () => {
    const before = await lead.send('get', asBuiltPath());
    const zone = await lead.expectOk('post', `/api/jobs/${job.id}/zones`, { name: 'Fixture side lawn' }, { 'If-Match': `"${job.version}"` });
    job = { ...job, version: zone.jobVersion };
    const after = await lead.send('get', asBuiltPath(), undefined, { 'If-None-Match': before.headers.etag as string });
    expect(after.status).toBe(200);
    expect(after.headers.etag).not.toBe(before.headers.etag);
    expect(after.body.job.version).toBe(job.version);
    expect(after.body.asBuilt.zones.map((z: { name: string }) => z.name)).toContain('Fixture side lawn');

    // A run recorded far longer than its route: the analysis must be the new one, not a kept one.
    const runId = ids.get(DEMO_AS_BUILT.runs[0]!.id)!;
    const { id: _id, ...run } = after.body.asBuilt.runs.find((r: { id: string }) => r.id === runId) as { id: string; measuredLengthM: number };
    const findingsOf = (body: { analysis: { findings: { runId?: string; code: string }[] } }) =>
      body.analysis.findings.filter((f) => f.runId === runId).map((f) => f.code).sort();
    const written = await lead.expectOk('put', `/api/jobs/${job.id}/runs/${runId}`, { ...run, measuredLengthM: run.measuredLengthM * 40 }, { 'If-Match': `"${job.version}"` });
    job = { ...job, version: written.jobVersion };
    const analysed = await lead.expectOk('get', asBuiltPath());
    expect(analysed.asBuilt.runs.find((r: { id: string }) => r.id === runId).measuredLengthM).toBe(run.measuredLengthM * 40);
    expect(findingsOf(analysed)).not.toEqual(findingsOf(after.body));
  });

  it('should show a moved reference point (site geometry) on the next read', async () => {
    const before = await lead.expectOk('get', asBuiltPath());
    const point = before.asBuilt.referencePoints[0] as { id: string; x: number };
    const moved = await siteWrite(office, 'patch', job.siteId, `/reference-points/${point.id}`, { x: point.x + 1.5 });
    job = { ...job, version: moved.jobVersions?.[job.id] ?? job.version };
    const after = await lead.expectOk('get', asBuiltPath());
    expect(after.asBuilt.referencePoints.find((p: { id: string }) => p.id === point.id).x).toBeCloseTo(point.x + 1.5, 9);
  });

  it('should compute a fresh analysis when the company changes its depth rules', async () => {
    const before = await lead.send('get', asBuiltPath());
    const { table } = await admin.expectOk('get', '/api/company/depth-rules');
    const deeper = { ...table, rules: table.rules.map((r: { minCoverM: number | null }) => ({ ...r, minCoverM: r.minCoverM === null ? null : Math.min(3, r.minCoverM + 0.3) })) };
    const saved = await admin.send('put', '/api/company/depth-rules', deeper);
    expect(saved.status).toBe(200);
    try {
      const after = await lead.send('get', asBuiltPath());
      expect(after.headers.etag).not.toBe(before.headers.etag);
      expect(after.body.analysis).not.toEqual(before.body.analysis);
    } finally {
      await admin.expectOk('delete', '/api/company/depth-rules');
    }
  });

  it('should send a fresh job part (a renamed crew lead) even when the record is unchanged', async () => {
    const before = await lead.send('get', asBuiltPath());
    await admin.expectOk('patch', `/api/users/${company.users.lead.id}`, { name: 'Fixture Renamed Lead' });
    const after = await lead.send('get', asBuiltPath(), undefined, { 'If-None-Match': before.headers.etag as string });
    expect(after.status).toBe(200);
    expect(after.body.job.crewLead.name).toBe('Fixture Renamed Lead');
  });

  const versionedGets: [string, () => string, (api: { office: Api; lead: Api; admin: Api }) => Api][] = [
    ['GET /api/jobs/:id', () => `/api/jobs/${job.id}`, (a) => a.lead],
    ['GET /api/sites/:id', () => `/api/sites/${job.siteId}`, (a) => a.office],
    ['GET /api/company/settings', () => '/api/company/settings', (a) => a.office],
    ['GET /api/company/profile', () => '/api/company/profile', (a) => a.admin],
    ['GET /api/company/depth-rules', () => '/api/company/depth-rules', (a) => a.admin],
  ];
  for (const [name, path, who] of versionedGets) {
    it(`${name} should answer with an ETag and 304 on If-None-Match`, async () => {
      const api = who({ office, lead, admin });
      const first = await api.send('get', path());
      expect(first.status).toBe(200);
      const etag = first.headers.etag as string;
      expect(etag).toMatch(/^"[A-Za-z0-9_-]+"$/);
      expect(first.headers['cache-control']).toBe('no-store');
      const again = await api.send('get', path(), undefined, { 'If-None-Match': etag });
      expect(again.status).toBe(304);
      expect(again.text ?? '').toBe('');
      expect((await api.send('get', path(), undefined, { 'If-None-Match': '"not-this-one"' })).status).toBe(200);
    });
  }

  it('GET /api/sites/:id should change its ETag when the site changes', async () => {
    const first = await office.send('get', `/api/sites/${job.siteId}`);
    await siteWrite(office, 'patch', job.siteId, '', { label: 'Fixture yard renamed' });
    const after = await office.send('get', `/api/sites/${job.siteId}`, undefined, { 'If-None-Match': first.headers.etag as string });
    expect(after.status).toBe(200);
    expect(after.body.label).toBe('Fixture yard renamed');
  });
});
