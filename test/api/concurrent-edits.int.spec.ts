import type { NestExpressApplication } from '@nestjs/platform-express';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { createCompany, type TestCompany, withDb } from '../support/fixtures.js';
import { type Api, apiAs, createJob, createSite, moveJob } from '../support/records.js';
import { signIn } from '../support/session.js';
import { createTestApp } from '../support/test-app.js';

const EDITS_PER_CLIENT = 6;

/**
 * Two people editing the same job at once, each the way the web app does it: read the job (and its
 * version), change it, write with If-Match, and on 412 VERSION_CONFLICT read again and redo the change.
 * Optimistic locking must make every edit land exactly once: none lost, none doubled.
 */
describe('two users editing the same job at the same time', () => {
  let app: NestExpressApplication;
  let company: TestCompany;
  let office: Api;
  let lead: Api;
  let siteId: string;

  beforeAll(async () => {
    app = await createTestApp();
    company = await createCompany('Concurrent Edits');
    office = apiAs(app, await signIn(app, company.users.office));
    lead = apiAs(app, await signIn(app, company.users.lead));
    ({ siteId } = await createSite(office));
  });

  afterAll(async () => {
    await app.close();
  });

  /** Retries `attempt` after each 412 VERSION_CONFLICT; counts the conflicts; fails on any other status. */
  async function withRetries(attempt: () => Promise<{ status: number; body: { code?: string } }>): Promise<number> {
    for (let conflicts = 0; conflicts < 100; conflicts += 1) {
      const res = await attempt();
      if (res.status < 300) return conflicts;
      if (res.status !== 412 || res.body.code !== 'VERSION_CONFLICT') throw new Error(`unexpected ${res.status} ${JSON.stringify(res.body)}`);
    }
    throw new Error('still conflicting after 100 attempts');
  }

  it('should keep every line both users append to the notes (read-modify-write, retry on 412)', async () => {
    const job = await createJob(office, siteId, { crewLeadUserId: company.users.lead.id });
    const appendLoop = async (api: Api, who: string) => {
      let conflicts = 0;
      for (let i = 1; i <= EDITS_PER_CLIENT; i += 1) {
        conflicts += await withRetries(async () => {
          const current = await api.expectOk('get', `/api/jobs/${job.id}`);
          const notes = current.notes ? `${current.notes}\n${who}-${i}` : `${who}-${i}`;
          return api.send('patch', `/api/jobs/${job.id}`, { notes }, { 'If-Match': `"${current.version}"` });
        });
      }
      return conflicts;
    };

    const conflicts = await Promise.all([appendLoop(office, 'office'), appendLoop(lead, 'lead')]);

    const final = await office.expectOk('get', `/api/jobs/${job.id}`);
    const lines = (final.notes as string).split('\n');
    const expected = ['office', 'lead'].flatMap((who) => Array.from({ length: EDITS_PER_CLIENT }, (_, i) => `${who}-${i + 1}`));
    expect([...lines].sort()).toEqual([...expected].sort());
    // Each client's own lines stay in the order it wrote them.
    for (const who of ['office', 'lead']) expect(lines.filter((l) => l.startsWith(`${who}-`))).toEqual(expected.filter((l) => l.startsWith(`${who}-`)));
    // One version per successful write, whatever the number of refused ones.
    expect(final.version).toBe(job.version + 2 * EDITS_PER_CLIENT);
    console.log(`notes: ${2 * EDITS_PER_CLIENT} edits landed after ${conflicts[0]! + conflicts[1]!} conflicts (412)`);
  });

  it('should keep every zone both users add at once, each created exactly once', async () => {
    const draft = await createJob(office, siteId, { crewLeadUserId: company.users.lead.id });
    const job = await moveJob(office, draft, 'in_progress');
    const addLoop = async (api: Api, who: string) => {
      for (let i = 1; i <= EDITS_PER_CLIENT; i += 1) {
        await withRetries(async () => {
          const current = await api.expectOk('get', `/api/jobs/${job.id}`);
          return api.send('post', `/api/jobs/${job.id}/zones`, { name: `${who} zone ${i}` }, { 'If-Match': `"${current.version}"` });
        });
      }
    };

    await Promise.all([addLoop(office, 'office'), addLoop(lead, 'lead')]);

    const { rows } = await withDb((db) => db.query<{ name: string }>('select name from zones where job_id = $1 order by name', [job.id]));
    const expected = ['office', 'lead'].flatMap((who) => Array.from({ length: EDITS_PER_CLIENT }, (_, i) => `${who} zone ${i + 1}`));
    expect(rows.map((r) => r.name)).toEqual([...expected].sort());
    const final = await office.expectOk('get', `/api/jobs/${job.id}`);
    expect(final.version).toBe(job.version + 2 * EDITS_PER_CLIENT);
  });
});
