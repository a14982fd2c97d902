import { createHash } from 'node:crypto';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';

import { DEMO_AS_BUILT } from '../../api/src/domain/as-built/demo-as-built.js';
import { DiskStorage } from '../../api/src/storage/disk-storage.js';
import { createCompany, withDb } from '../support/fixtures.js';
import { httpApiAs } from '../support/http-api.js';
import { type Api, createSite, insertRecordedJob } from '../support/records.js';
import { type RunningApi, sleep, type Spawned, startApi, startWorker } from './support/processes.js';

const UPLOADS_DIR = mkdtempSync(join(tmpdir(), 'loamline-worker-kill-'));

// The API only issues (no in-process worker); rendering happens in `npm run worker` processes. A render
// abandoned by a dead worker is expired after PACKET_RENDER_STALE_SECONDS and retried by pg-boss, whose
// maintenance looks for expired jobs every QUEUE_MAINTENANCE_INTERVAL_SECONDS.
const ENV = {
  PACKET_WORKER_IN_API: 'false',
  UPLOADS_DIR,
  QUEUE_POLL_INTERVAL_SECONDS: '0.5',
  QUEUE_MAINTENANCE_INTERVAL_SECONDS: '1',
  PACKET_RENDER_STALE_SECONDS: '15',
  PACKET_RENDER_CONCURRENCY: '1',
};

interface RevisionRow {
  status: string;
  attempts: number;
  pdf_key: string | null;
  pdf_sha256: string | null;
  zip_key: string | null;
  zip_sha256: string | null;
}

describe('a render worker killed (SIGKILL) in the middle of a render', () => {
  const databaseUrl = inject('databaseUrl');
  const storage = new DiskStorage(UPLOADS_DIR);
  let api: RunningApi | undefined;
  const workers: Spawned[] = [];

  beforeAll(async () => {
    api = await startApi(databaseUrl, ENV);
  });

  afterAll(async () => {
    for (const worker of workers) await worker.stop();
    await api?.process.stop();
    rmSync(UPLOADS_DIR, { recursive: true, force: true });
  });

  /** The revision's row, and whether a `ready` row's files were really there when it was read. */
  async function observe(revisionId: string): Promise<{ row: RevisionRow; readyWithoutFiles: boolean }> {
    const { rows } = await withDb((db) =>
      db.query<RevisionRow>('select status, attempts, pdf_key, pdf_sha256, zip_key, zip_sha256 from packet_revisions where id = $1', [revisionId]),
    );
    const row = rows[0]!;
    const readyWithoutFiles =
      row.status === 'ready' &&
      !(row.pdf_key && row.zip_key && (await storage.exists(row.pdf_key)) && (await storage.exists(row.zip_key)));
    return { row, readyWithoutFiles };
  }

  it('should retry the revision on another worker and make it ready with both files, never ready without them', async () => {
    const company = await createCompany('Worker Kill');
    const office = (await httpApiAs(api!.baseUrl, company.users.office)) as unknown as Api;
    const { siteId } = await createSite(office, DEMO_AS_BUILT.site);
    const job = await insertRecordedJob(company, siteId, { crewLeadUserId: company.users.lead.id, technicianUserIds: [] }, DEMO_AS_BUILT);
    await withDb((db) => db.query(`update jobs set status = 'ready_to_issue' where id = $1`, [job.id]));

    // Only the first worker runs when the revision is issued, so it is the one that claims it.
    const first = await startWorker(databaseUrl, ENV);
    workers.push(first);
    const issued = await office.expectOk('post', `/api/jobs/${job.id}/packets`, undefined, { 'If-Match': `"${job.version}"` });
    const revisionId: string = issued.id;

    const seen: string[] = [];
    let readyWithoutFiles = 0;
    const poll = async () => {
      const observed = await observe(revisionId);
      if (seen.at(-1) !== observed.row.status) seen.push(observed.row.status);
      if (observed.readyWithoutFiles) readyWithoutFiles += 1;
      return observed.row;
    };

    // Kill the moment the worker has claimed the revision (its status turns `rendering`); the render
    // itself (Chromium start, layout, printing, the archive) takes seconds, so it is mid-render.
    let deadline = Date.now() + 60_000;
    for (;;) {
      const row = await poll();
      if (row.status === 'rendering') break;
      expect(row.status, 'the worker finished before it could be killed').toBe('queued');
      if (Date.now() > deadline) throw new Error(`the revision never started rendering:\n${first.tail()}`);
      await sleep(20);
    }
    await first.kill();
    const afterKill = await poll();
    expect(afterKill).toMatchObject({ status: 'rendering', attempts: 1, pdf_key: null, zip_key: null });

    const second = await startWorker(databaseUrl, ENV);
    workers.push(second);
    deadline = Date.now() + 120_000;
    let row: RevisionRow;
    for (;;) {
      row = await poll();
      if (row.status === 'ready' || row.status === 'failed') break;
      if (Date.now() > deadline) throw new Error(`the revision is still ${row.status} after the kill:\n${second.tail()}`);
      await sleep(200);
    }

    expect(readyWithoutFiles, 'polls that saw the revision ready before its files were stored').toBe(0);
    // `queued` is seen only if a poll came before the claim; after it, never back to queued or failed.
    expect(seen.slice(seen.indexOf('rendering'))).toEqual(['rendering', 'ready']);
    // The killed attempt and the retry on the second worker.
    expect(row).toMatchObject({ status: 'ready', attempts: 2 });
    const pdf = await storage.getBuffer(row.pdf_key!);
    const zip = await storage.getBuffer(row.zip_key!);
    expect(pdf.subarray(0, 5).toString()).toBe('%PDF-');
    expect(zip.subarray(0, 2).toString()).toBe('PK');
    expect(createHash('sha256').update(pdf).digest('hex')).toBe(row.pdf_sha256);
    expect(createHash('sha256').update(zip).digest('hex')).toBe(row.zip_sha256);

    // The queue message the dead worker held was retried and completed (not left active or failed).
    const jobs = await withDb((db) =>
      db.query(`select state, retry_count from pgboss.job where name = 'packet-render' and data->>'revisionId' = $1`, [revisionId]),
    );
    expect(jobs.rows).toEqual([{ state: 'completed', retry_count: 1 }]);
  });
});
