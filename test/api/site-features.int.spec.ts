import type { NestExpressApplication } from '@nestjs/platform-express';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { createCompany, type TestCompany, withDb } from '../support/fixtures.js';
import { type Api, apiAs, createJob, createSite, siteVersion } from '../support/records.js';
import { signIn } from '../support/session.js';
import { createTestApp } from '../support/test-app.js';

/** Site features (issue 15): landmarks per site, written as site geometry, carried into every job's as-built. */
describe('site features', () => {
  let app: NestExpressApplication;
  let a: TestCompany;
  let office: Api;
  let tech: Api;
  let otherAdmin: Api;

  beforeAll(async () => {
    app = await createTestApp();
    a = await createCompany('Features A');
    const b = await createCompany('Features B');
    office = apiAs(app, await signIn(app, a.users.office));
    tech = apiAs(app, await signIn(app, a.users.tech));
    otherAdmin = apiAs(app, await signIn(app, b.users.admin));
  });

  afterAll(async () => {
    await app.close();
  });

  const ifMatch = async (siteId: string) => ({ 'If-Match': `"${await siteVersion(office, siteId)}"` });
  const house = { kind: 'house', name: 'House', shape: 'polygon', points: [{ x: 0, y: 0 }, { x: 12, y: 0 }, { x: 12, y: -8 }, { x: 0, y: -8 }] };

  it('should add, list, reshape, rename and delete features, bumping the site version each time', async () => {
    const { siteId } = await createSite(office);
    expect(await office.expectOk('get', `/api/sites/${siteId}/features`)).toEqual([]);
    const v1 = await siteVersion(office, siteId);
    const created = await office.expectOk('post', `/api/sites/${siteId}/features`, house, await ifMatch(siteId));
    expect(created).toMatchObject({ kind: 'house', name: 'House', shape: 'polygon', points: house.points, siteVersion: v1 + 1 });
    const fence = await office.expectOk(
      'post',
      `/api/sites/${siteId}/features`,
      { kind: 'fence', name: 'East fence', shape: 'line', points: [{ x: 14, y: 0 }, { x: 14, y: 20 }] },
      await ifMatch(siteId),
    );
    expect((await office.expectOk('get', `/api/sites/${siteId}/features`)).map((f: { name: string }) => f.name)).toEqual(['House', 'East fence']);

    const renamed = await office.expectOk('patch', `/api/sites/${siteId}/features/${fence.id}`, { name: 'East fence (cedar)', points: [{ x: 14, y: -1 }, { x: 14, y: 21 }] }, await ifMatch(siteId));
    expect(renamed).toMatchObject({ name: 'East fence (cedar)', shape: 'line', points: [{ x: 14, y: -1 }, { x: 14, y: 21 }] });

    // Turning a two-point line into an outline without new points is refused, naming the field.
    const tooFew = await office.send('patch', `/api/sites/${siteId}/features/${fence.id}`, { shape: 'polygon' }, await ifMatch(siteId));
    expect(tooFew.status).toBe(400);
    expect(tooFew.body.issues[0].path).toBe('shape');

    expect((await office.send('delete', `/api/sites/${siteId}/features/${fence.id}`, undefined, await ifMatch(siteId))).status).toBe(200);
    expect((await office.expectOk('get', `/api/sites/${siteId}/features`)).map((f: { id: string }) => f.id)).toEqual([created.id]);
    expect((await office.send('delete', `/api/sites/${siteId}/features/${fence.id}`, undefined, await ifMatch(siteId))).status).toBe(404);
  });

  it('should refuse bad shapes, a missing or stale version, other roles and other companies, writing nothing', async () => {
    const { siteId } = await createSite(office);
    const count = () => withDb(async (db) => Number((await db.query('select count(*) from site_features where site_id = $1', [siteId])).rows[0].count));

    const outline = await office.send('post', `/api/sites/${siteId}/features`, { ...house, points: house.points.slice(0, 2) }, await ifMatch(siteId));
    expect(outline.status).toBe(400);
    expect(outline.body.issues.map((i: { path: string }) => i.path)).toContain('points');
    const repeated = await office.send('post', `/api/sites/${siteId}/features`, { ...house, points: [{ x: 1, y: 1 }, { x: 1, y: 1 }, { x: 2, y: 2 }] }, await ifMatch(siteId));
    expect(repeated.status).toBe(400);
    const kind = await office.send('post', `/api/sites/${siteId}/features`, { ...house, kind: 'volcano' }, await ifMatch(siteId));
    expect(kind.status).toBe(400);
    expect(kind.body.issues[0].path).toBe('kind');

    expect((await office.send('post', `/api/sites/${siteId}/features`, house)).status).toBe(428);
    expect((await office.send('post', `/api/sites/${siteId}/features`, house, { 'If-Match': '"999"' })).status).toBe(412);
    expect((await tech.send('post', `/api/sites/${siteId}/features`, house, await ifMatch(siteId))).status).toBe(403);
    expect((await otherAdmin.send('post', `/api/sites/${siteId}/features`, house, { 'If-Match': '"1"' })).status).toBe(404);
    expect((await otherAdmin.send('get', `/api/sites/${siteId}/features`)).status).toBe(404);
    expect(await count()).toBe(0);
  });

  it("should carry the site's features into a job's as-built", async () => {
    const { siteId } = await createSite(office);
    const job = await createJob(office, siteId, { crewLeadUserId: a.users.lead.id });
    await office.expectOk('post', `/api/sites/${siteId}/features`, house, await ifMatch(siteId));
    const { asBuilt } = await office.expectOk('get', `/api/jobs/${job.id}/as-built`);
    expect(asBuilt.site.features).toEqual([expect.objectContaining({ kind: 'house', name: 'House', shape: 'polygon', points: house.points })]);
  });
});
