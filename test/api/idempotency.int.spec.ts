import { createHash, randomUUID } from 'node:crypto';

import type { NestExpressApplication } from '@nestjs/platform-express';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { createCompany, type TestCompany, withDb } from '../support/fixtures.js';
import { type Api, apiAs, createJob, createSite, type JobFixture, moveJob } from '../support/records.js';
import { signIn } from '../support/session.js';
import { createTestApp } from '../support/test-app.js';

/**
 * `Idempotency-Key` on writes (issue 17): the phone's offline queue re-sends a change whose answer was
 * lost; the server must write it once and answer the repeat with the kept answer.
 */
describe('Idempotency-Key on job writes', () => {
  let app: NestExpressApplication;
  let company: TestCompany;
  let office: Api;
  let lead: Api;
  let siteId: string;

  beforeAll(async () => {
    app = await createTestApp();
    company = await createCompany('Idempotent Writes');
    office = apiAs(app, await signIn(app, company.users.office));
    lead = apiAs(app, await signIn(app, company.users.lead));
    ({ siteId } = await createSite(office));
  });

  afterAll(async () => {
    await app.close();
  });

  async function startedJob(): Promise<JobFixture> {
    const draft = await createJob(office, siteId, { crewLeadUserId: company.users.lead.id });
    return moveJob(office, draft, 'in_progress');
  }
  const versionOf = async (jobId: string): Promise<number> => (await lead.expectOk('get', `/api/jobs/${jobId}`)).version;
  const zoneNames = async (jobId: string): Promise<string[]> =>
    ((await lead.expectOk('get', `/api/jobs/${jobId}/as-built`)).asBuilt.zones as { name: string }[]).map((zone) => zone.name);
  const addZone = (api: Api, jobId: string, name: string, version: number, key?: string) =>
    api.send('post', `/api/jobs/${jobId}/zones`, { name }, { 'If-Match': `"${version}"`, ...(key ? { 'Idempotency-Key': key } : {}) });

  it('should write a change sent twice with the same key once, and answer the repeat with the kept answer', async () => {
    const job = await startedJob();
    const key = randomUUID();
    const first = await addZone(lead, job.id, 'Patio', job.version, key);
    expect(first.status).toBe(201);
    expect(first.headers['idempotent-replayed']).toBeUndefined();

    // The answer was lost on the way; the queue sends the same change again on the same base version.
    const repeat = await addZone(lead, job.id, 'Patio', job.version, key);
    expect(repeat.status).toBe(201);
    expect(repeat.headers['idempotent-replayed']).toBe('true');
    expect(repeat.body).toEqual(first.body);
    expect(await zoneNames(job.id)).toEqual(['Patio']);
    expect(await versionOf(job.id)).toBe(job.version + 1);

    // Without a key the same request is a second, separate change (here refused by the version check).
    const plain = await addZone(lead, job.id, 'Patio', job.version);
    expect(plain.status).toBe(412);
    expect(plain.body.code).toBe('VERSION_CONFLICT');
  });

  it('should refuse a key reused for another change (422) and a malformed key (400 naming the header), writing nothing', async () => {
    const job = await startedJob();
    const key = randomUUID();
    expect((await addZone(lead, job.id, 'Lawn', job.version, key)).status).toBe(201);
    const reused = await addZone(lead, job.id, 'Pool deck', job.version + 1, key);
    expect(reused.status).toBe(422);
    expect(reused.body.code).toBe('IDEMPOTENCY_KEY_REUSED');
    expect(reused.body.message).toContain('Idempotency-Key');

    for (const bad of ['short', 'x'.repeat(129), 'has spaces in it', 'semi;colon;key']) {
      const res = await addZone(lead, job.id, 'Side yard', job.version + 1, bad);
      expect(res.status, bad).toBe(400);
      expect(res.body.issues?.[0]?.path, bad).toBe('Idempotency-Key');
    }
    expect(await zoneNames(job.id)).toEqual(['Lawn']);
    expect(await versionOf(job.id)).toBe(job.version + 1);
  });

  it('should free the key after a refused write, so "keep mine" re-sends the same change under it', async () => {
    const job = await startedJob();
    // The office changed the job meanwhile: the lead's queued change meets a conflict.
    expect((await addZone(office, job.id, 'Front beds', job.version)).status).toBe(201);
    const key = randomUUID();
    const conflict = await addZone(lead, job.id, 'Back fence', job.version, key);
    expect(conflict.status).toBe(412);
    expect(conflict.body.code).toBe('VERSION_CONFLICT');
    const kept = await addZone(lead, job.id, 'Back fence', job.version + 1, key);
    expect(kept.status).toBe(201);
    expect(await zoneNames(job.id)).toEqual(['Front beds', 'Back fence']);
  });

  it('should keep keys per user and for 24 hours, and say when the first request is still running', async () => {
    const job = await startedJob();
    const key = randomUUID();
    expect((await addZone(lead, job.id, 'Orchard', job.version, key)).status).toBe(201);
    // Another person's key of the same text is theirs alone.
    const byOffice = await addZone(office, job.id, 'Orchard', job.version + 1, key);
    expect(byOffice.status).toBe(201);
    expect(byOffice.headers['idempotent-replayed']).toBeUndefined();

    // After a day the kept answer is gone and the key is free.
    await withDb((db) => db.query(`update idempotency_keys set created_at = now() - interval '25 hours' where key = $1`, [key]));
    const afterADay = await addZone(lead, job.id, 'Orchard', job.version + 2, key);
    expect(afterADay.status).toBe(201);
    expect(afterADay.headers['idempotent-replayed']).toBeUndefined();
    expect(await zoneNames(job.id)).toEqual(['Orchard', 'Orchard', 'Orchard']);

    // A first request still running (claimed, no answer yet): the repeat is told to try later…
    const running = randomUUID();
    const path = `/api/jobs/${job.id}/zones`;
    const hash = createHash('sha256').update(JSON.stringify({ name: 'Herb garden' })).digest('hex');
    await withDb((db) =>
      db.query(`insert into idempotency_keys (user_id, key, method, path, request_hash) values ($1, $2, 'POST', $3, $4)`, [company.users.lead.id, running, path, hash]),
    );
    const busy = await addZone(lead, job.id, 'Herb garden', job.version + 3, running);
    expect(busy.status).toBe(409);
    expect(busy.body.code).toBe('IDEMPOTENCY_IN_PROGRESS');
    // …and a claim abandoned minutes ago (the process died) is taken over.
    await withDb((db) => db.query(`update idempotency_keys set created_at = now() - interval '5 minutes' where key = $1`, [running]));
    const retaken = await addZone(lead, job.id, 'Herb garden', job.version + 3, running);
    expect(retaken.status).toBe(201);
    expect(await zoneNames(job.id)).toEqual(['Orchard', 'Orchard', 'Orchard', 'Herb garden']);
  });
});
