import type { NestExpressApplication } from '@nestjs/platform-express';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { DEMO_AS_BUILT } from '../../api/src/domain/as-built/demo-as-built.js';
import { createCompany, type TestCompany } from '../support/fixtures.js';
import { type Api, apiAs, createSite, insertRecordedJob } from '../support/records.js';
import { bearer, type Session, signIn } from '../support/session.js';

// Issue 18 §3: drawings are laid out in worker threads and kept by job, version and query, with an
// ETag; a repeated request is a cache hit, or a 304 when the client sends the ETag back.
describe('job drawings: worker threads, cache and ETag', () => {
  let app: NestExpressApplication;
  let company: TestCompany;
  let office: Session;
  let tech: Session;
  let api: Api;
  let jobId: string;
  let runId: string;

  const get = (session: Session, path: string, etag?: string) => {
    const req = request(app.getHttpServer()).get(path).set(bearer(session)).buffer(true);
    return etag === undefined ? req : req.set('If-None-Match', etag);
  };

  beforeAll(async () => {
    const { createTestApp } = await import('../support/test-app.js');
    app = await createTestApp();
    company = await createCompany('Drawing Cache Co');
    office = await signIn(app, company.users.office);
    tech = await signIn(app, company.users.tech);
    api = apiAs(app, office);
    const { siteId } = await createSite(api, DEMO_AS_BUILT.site);
    const job = await insertRecordedJob(company, siteId, { crewLeadUserId: company.users.lead.id, technicianUserIds: [company.users.tech.id] }, DEMO_AS_BUILT);
    jobId = job.id;
    runId = job.ids.get(DEMO_AS_BUILT.runs[0]!.id)!;
  });

  afterAll(async () => {
    await app?.close();
  });

  it.each([
    ['schematic', () => `/api/jobs/${jobId}/drawings/schematic.svg`],
    ['site plan', () => `/api/jobs/${jobId}/drawings/site-plan.svg?paper=a4`],
    ['depth profile', () => `/api/jobs/${jobId}/drawings/runs/${runId}/depth-profile.svg`],
  ])('should draw the %s once, answer a repeat from the cache and a known ETag with 304', async (_name, path) => {
    const first = await get(office, path());
    expect(first.status, first.text).toBe(200);
    expect(first.headers['content-type']).toBe('image/svg+xml; charset=utf-8');
    expect(first.headers['x-drawing-cache']).toBe('miss');
    const etag = first.headers.etag as string;
    expect(etag).toMatch(/^"drawing-[\w-]{32}"$/);
    expect(first.headers['cache-control']).toBe('private, no-cache');
    expect(String(first.body)).toContain('<svg');

    // Another user of the company with read access: the same drawing, from the cache.
    const again = await get(tech, path());
    expect(again.status).toBe(200);
    expect(again.headers['x-drawing-cache']).toBe('hit');
    expect(again.headers.etag).toBe(etag);
    expect(String(again.body)).toBe(String(first.body));

    const notModified = await get(office, path(), etag);
    expect(notModified.status).toBe(304);
    expect(notModified.headers.etag).toBe(etag);
    expect(notModified.text ?? '').toBe('');
    // Several validators, one of them weak, as browsers and proxies send them.
    expect((await get(office, path(), `"something-else", W/${etag}`)).status).toBe(304);
  });

  it('should give another ETag for other units, and after the job changes', async () => {
    const path = `/api/jobs/${jobId}/drawings/schematic.svg`;
    const metric = await get(office, `${path}?units=metric`);
    const imperial = await get(office, `${path}?units=imperial`);
    expect(metric.status).toBe(200);
    expect(imperial.status).toBe(200);
    expect(imperial.headers.etag).not.toBe(metric.headers.etag);

    const before = await get(office, path);
    const job = await api.expectOk('get', `/api/jobs/${jobId}`);
    await api.expectOk('patch', `/api/jobs/${jobId}`, { title: 'Renamed for the drawing cache' }, { 'If-Match': `"${job.version}"` });
    const stale = await get(office, path, before.headers.etag as string);
    expect(stale.status).toBe(200);
    expect(stale.headers.etag).not.toBe(before.headers.etag);
    expect(stale.headers['x-drawing-cache']).toBe('miss');
  });

  it('should answer 40 identical requests at once with one drawing, all 200', async () => {
    const path = `/api/jobs/${jobId}/drawings/site-plan.svg?paper=letter&layers=labels`;
    const answers = await Promise.all(Array.from({ length: 40 }, () => get(office, path)));
    expect(answers.map((a) => a.status)).toEqual(Array(40).fill(200));
    expect(new Set(answers.map((a) => a.headers.etag)).size).toBe(1);
    expect(new Set(answers.map((a) => String(a.body))).size).toBe(1);
    expect(answers.filter((a) => a.headers['x-drawing-cache'] === 'miss')).toHaveLength(1);
  });
});
