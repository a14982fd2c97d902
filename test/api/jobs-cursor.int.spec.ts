import { randomUUID } from 'node:crypto';

import type { NestExpressApplication } from '@nestjs/platform-express';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { JOB_SORTS } from '../../api/src/domain/jobs/job.schema.js';
import { encodeCursor, encodeSortedCursor } from '../../api/src/domain/paging/page.schema.js';
import { createCompany, withDb } from '../support/fixtures.js';
import { type Api, apiAs, createSite } from '../support/records.js';
import { signIn } from '../support/session.js';
import { createTestApp } from '../support/test-app.js';

type JobPage = { items: { id: string; title: string }[]; total: number; page: number; pageSize: number; nextCursor: string | null };

/**
 * `GET /api/jobs` by cursor (issue 20): in every sort, both directions, a walk by `nextCursor` gives the
 * same jobs in the same order as the page-number list, each once, with NULL start dates and tied keys
 * (titles, statuses, timestamps a microsecond apart) in the mix.
 */
describe('jobs list by cursor', () => {
  let app: NestExpressApplication;
  let office: Api;
  let otherOffice: Api;
  let siteIds: string[];

  /** Every page of `query` by cursor, `pageSize` at a time: the ids in order and the pages' numbers. */
  async function walk(query: string, pageSize: number, between?: (page: JobPage) => Promise<void>) {
    const ids: string[] = [];
    const pages: number[] = [];
    let cursor: string | null = null;
    do {
      const page: JobPage = await office.expectOk('get', `/api/jobs?${query}&pageSize=${pageSize}${cursor ? `&cursor=${cursor}` : ''}`);
      expect(page.items.length).toBeLessThanOrEqual(pageSize);
      ids.push(...page.items.map((job) => job.id));
      pages.push(page.page);
      cursor = page.nextCursor;
      if (between) await between(page);
    } while (cursor && pages.length < 50);
    return { ids, pages };
  }

  /** The ids of the whole list of `query` read by page number, `pageSize` at a time. */
  async function byPageNumber(query: string, pageSize: number): Promise<string[]> {
    const ids: string[] = [];
    for (let n = 1; ; n += 1) {
      const page: JobPage = await office.expectOk('get', `/api/jobs?${query}&pageSize=${pageSize}&page=${n}`);
      ids.push(...page.items.map((job) => job.id));
      if (n * pageSize >= page.total) return ids;
    }
  }

  beforeAll(async () => {
    app = await createTestApp();
    const c = await createCompany('Jobs cursor C');
    office = apiAs(app, await signIn(app, c.users.office));
    otherOffice = apiAs(app, await signIn(app, (await createCompany('Jobs cursor D')).users.office));
    siteIds = [];
    for (let i = 0; i < 3; i += 1) siteIds.push((await createSite(office)).siteId);

    // Ties on purpose: titles repeat, start dates repeat or are missing, statuses repeat, and two jobs
    // share an update time while a third is one microsecond later (a JavaScript Date cannot tell them apart).
    const specs: { title: string; startDate: string | null; status: string; updatedAt: string }[] = [
      { title: 'Trench east', startDate: '2026-04-01', status: 'draft', updatedAt: '2026-06-01 08:00:00.000001+00' },
      { title: 'Trench east', startDate: null, status: 'in_progress', updatedAt: '2026-06-01 08:00:00.000001+00' },
      { title: 'Conduit north', startDate: '2026-04-01', status: 'submitted', updatedAt: '2026-06-01 08:00:00.000002+00' },
      { title: 'Amplifier shed', startDate: null, status: 'draft', updatedAt: '2026-05-30 17:45:10.5+00' },
      { title: 'Bore under drive', startDate: '2026-03-15', status: 'in_progress', updatedAt: '2026-06-02 09:00:00+00' },
      { title: 'Trench east', startDate: '2026-05-20', status: 'issued', updatedAt: '2026-06-01 08:00:00.000001+00' },
      { title: 'Zone lights', startDate: null, status: 'ready_to_issue', updatedAt: '2026-05-01 00:00:00+00' },
      { title: 'Drip line', startDate: '2026-03-15', status: 'draft', updatedAt: '2026-06-03 12:00:00+00' },
    ];
    for (const [i, spec] of specs.entries()) {
      const job = await office.expectOk('post', '/api/jobs', { siteId: siteIds[i % 3], title: spec.title, startDate: spec.startDate });
      await withDb((db) => db.query('update jobs set status = $2, updated_at = $3 where id = $1', [job.id, spec.status, spec.updatedAt]));
    }
  });

  afterAll(async () => {
    await app.close();
  });

  const sorts = JOB_SORTS.flatMap((field) => [field, `-${field}`]);

  it.each(sorts)('should walk every job once, in the page-number order, sorted by %s', async (sort) => {
    const expected = await byPageNumber(`sort=${sort}`, 3);
    expect(expected).toHaveLength(8);
    expect(new Set(expected).size).toBe(8);
    for (const pageSize of [1, 3]) {
      const walked = await walk(`sort=${sort}`, pageSize);
      expect(walked.ids, `sort=${sort} pageSize=${pageSize}`).toEqual(expected);
      expect(walked.pages).toEqual(walked.pages.map((_, i) => i + 1));
    }
  });

  it.each(['startDate', '-startDate', '-status', 'updatedAt'])('should keep the status filter across the cursor, sorted by %s', async (sort) => {
    const query = `sort=${sort}&status=draft,in_progress`;
    const expected = await byPageNumber(query, 2);
    expect(expected).toHaveLength(5);
    expect((await walk(query, 2)).ids).toEqual(expected);
  });

  it.each(['title', '-startDate', 'startDate', '-updatedAt'])('should stay steady when a job is added between pages, sorted by %s', async (sort) => {
    const before = await byPageNumber(`sort=${sort}`, 100);
    let added = '';
    let addedVersion = 0;
    let cursorRow = '';
    const walked = await walk(`sort=${sort}`, 3, async (page) => {
      if (page.page !== 1) return;
      cursorRow = page.items.at(-1)!.id;
      // A job that sorts before the cursor where the test can choose (the first title, the earliest start,
      // the newest update); sorted by -startDate it joins the jobs without a start, before or after the
      // cursor by its random id.
      const job = await office.expectOk('post', '/api/jobs', { siteId: siteIds[0], title: 'Aardvark pit', startDate: sort === '-startDate' ? null : '2026-01-01' });
      added = job.id;
      addedVersion = job.version;
      await withDb((db) => db.query('update jobs set updated_at = $2 where id = $1', [job.id, '2027-01-01 00:00:00+00']));
    });
    const after = await byPageNumber(`sort=${sort}`, 100);
    // Every job there at the start comes once, in order; the new one only if it sorts after the cursor
    // (an offset's page 2 would repeat the last job of page 1 when it sorts before).
    const isAfterCursor = after.indexOf(added) > after.indexOf(cursorRow);
    if (sort !== '-startDate') expect(isAfterCursor).toBe(false);
    expect(walked.ids).toEqual(isAfterCursor ? after : before);
    await office.expectOk('delete', `/api/jobs/${added}`, undefined, { 'If-Match': String(addedVersion) });
  });

  it('should refuse a cursor it did not write, or sent with page, with 400 naming cursor', async () => {
    const first: JobPage = await office.expectOk('get', '/api/jobs?sort=title&pageSize=2');
    const forged = Buffer.from(JSON.stringify({ sort: 'title', key: 'a', id: 'not-a-uuid', page: 2 })).toString('base64url');
    const customersCursor = encodeCursor({ key: 'Trench east', id: randomUUID(), page: 2 });
    for (const query of [
      'cursor=nonsense!',
      `cursor=${forged}`,
      `cursor=${customersCursor}&sort=title`,
      `cursor=${'A'.repeat(2001)}`,
      `sort=title&page=2&cursor=${first.nextCursor}`,
    ]) {
      const res = await office.send('get', `/api/jobs?${query}`);
      expect(res.status, query).toBe(400);
      expect(res.body.issues.map((i: { path: string }) => i.path), query).toContain('cursor');
    }
  });

  it('should refuse a cursor from another sort, or without a key where the sort always has one, with 400 naming cursor', async () => {
    const byTitle: JobPage = await office.expectOk('get', '/api/jobs?sort=title&pageSize=2');
    const noKey = encodeSortedCursor({ sort: 'title', key: null, id: randomUUID(), page: 2 });
    for (const query of [`sort=-title&cursor=${byTitle.nextCursor}`, `cursor=${byTitle.nextCursor}`, `sort=startDate&cursor=${byTitle.nextCursor}`, `sort=title&cursor=${noKey}`]) {
      const res = await office.send('get', `/api/jobs?${query}`);
      expect(res.status, query).toBe(400);
      expect(res.body.issues[0]).toMatchObject({ path: 'cursor', message: expect.any(String) });
    }
    // The same cursor in its own sort is fine, and a NULL key is a cursor where the start date is missing.
    expect((await office.send('get', `/api/jobs?sort=title&cursor=${byTitle.nextCursor}`)).status).toBe(200);
    const lastDated = encodeSortedCursor({ sort: '-startDate', key: null, id: randomUUID(), page: 2 });
    expect((await office.send('get', `/api/jobs?sort=-startDate&cursor=${lastDated}`)).status).toBe(200);
  });

  it('should not show another company’s jobs after a cursor', async () => {
    const first: JobPage = await office.expectOk('get', '/api/jobs?sort=title&pageSize=1');
    const other: JobPage = await otherOffice.expectOk('get', `/api/jobs?sort=title&pageSize=100&cursor=${first.nextCursor}`);
    expect(other).toMatchObject({ items: [], total: 0, page: 2, nextCursor: null });
  });
});
