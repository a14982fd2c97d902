import { spawn } from 'node:child_process';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

import sharp from 'sharp';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';

import { DEMO_EMAILS, DEMO_PASSWORD } from '../../api/src/db/seed/demo-records.js';
// @ts-expect-error -- plain ESM script shared with `npm start`; no type declarations.
import { seedDemo } from '../../scripts/lib/seed.mjs';
import { makeFieldPhoto, makePixelBombPng } from '../fixtures/photos/make-photos.js';
import { type RunningApi, signInOverHttp, sleep, startApi } from './support/processes.js';

const UPLOADS_DIR = mkdtempSync(join(tmpdir(), 'loamline-hostile-'));

/** The 99th percentile of `samples` (nearest rank). */
function p99(samples: readonly number[]): number {
  const sorted = [...samples].sort((a, b) => a - b);
  return sorted[Math.min(sorted.length - 1, Math.ceil(sorted.length * 0.99) - 1)]!;
}

/**
 * Asks `/api/health` one request after another, 20 ms apart, until `until` settles; returns each
 * answer's latency. Sequential on purpose: it measures what one user waits, not how much we can pile on.
 * The poller is its own process, so that this test process reading 200 answers does not delay (and
 * so inflate) the health figures it takes.
 */
const POLLER = `
let isDone = false;
process.stdin.on('end', () => (isDone = true));
process.stdin.resume();
const latencies = [];
const statuses = [];
const deadline = Date.now() + 60_000;
while ((!isDone || latencies.length < 20) && Date.now() < deadline) {
  const started = performance.now();
  const res = await fetch(process.argv[1] + '/api/health');
  await res.arrayBuffer();
  latencies.push(performance.now() - started);
  statuses.push(res.status);
  await new Promise((r) => setTimeout(r, 20));
}
process.stdout.write(JSON.stringify({ latencies, statuses }));
`;

async function healthLatencies(baseUrl: string, until: Promise<unknown>): Promise<{ latencies: number[]; statuses: number[] }> {
  const child = spawn(process.execPath, ['--input-type=module', '-e', POLLER, baseUrl], { stdio: ['pipe', 'pipe', 'inherit'] });
  let output = '';
  child.stdout.on('data', (chunk: Buffer) => (output += chunk.toString()));
  const exited = new Promise<void>((resolve) => child.on('exit', () => resolve()));
  // Let the poller take a first sample before the load starts.
  await sleep(300);
  await until.catch(() => undefined);
  child.stdin.end();
  await exited;
  return JSON.parse(output) as { latencies: number[]; statuses: number[] };
}

/** A real PNG of one colour; a thin strip is a few hundred bytes. */
const strip = (width: number, height: number) =>
  sharp({ create: { width, height, channels: 3, background: { r: 30, g: 120, b: 200 } } })
    .png()
    .toBuffer();

/**
 * Issue 18 §1 and §3 against the built API (a real process on loopback): hostile images are refused
 * within a second each while `/api/health` keeps answering, and 200 drawing requests at once are all
 * answered with no 5xx. Latency figures beyond the two bounds belong in `npm run bench`.
 */
describe('the built API under hostile images and a burst of drawings', () => {
  let api: RunningApi | undefined;
  let token: string;
  let jobs: { id: string; version: number; status: string; site: { id: string } }[];

  /** A new job in progress on `siteId`, made through the API as the office would. */
  async function newJobInProgress(siteId: string): Promise<{ id: string; version: number }> {
    const headers = { Authorization: `Bearer ${token}`, 'Content-Type': 'application/json' };
    const created = await fetch(`${api!.baseUrl}/api/jobs`, { method: 'POST', headers, body: JSON.stringify({ siteId, title: 'Patio speakers, second visit' }) });
    const job = (await created.json()) as { id: string; version: number };
    const moved = await fetch(`${api!.baseUrl}/api/jobs/${job.id}/status`, {
      method: 'POST',
      headers,
      body: JSON.stringify({ to: 'in_progress', expectedVersion: job.version, comment: 'crew on site' }),
    });
    if (moved.status !== 200 && moved.status !== 201) throw new Error(`moving the job failed: ${moved.status} ${await moved.text()}`);
    return { id: job.id, version: ((await moved.json()) as { version: number }).version };
  }

  beforeAll(async () => {
    await seedDemo(inject('databaseUrl'));
    api = await startApi(inject('databaseUrl'), {
      PACKET_WORKER_IN_API: 'false',
      UPLOADS_DIR,
      SIGN_IN_LIMIT_PER_ADDRESS_PER_MINUTE: '100000',
      SIGN_IN_LIMIT_PER_ACCOUNT: '100000',
      SIGN_IN_LIMIT_PER_ACCOUNT_GLOBAL: '100000',
      // Eight hostile files from one user at once: each must meet its image limit, not the per-user cap.
      UPLOAD_MAX_CONCURRENT_PER_USER: '10',
    });
    token = await signInOverHttp(api.baseUrl, DEMO_EMAILS.office, DEMO_PASSWORD);
    const list = await fetch(`${api.baseUrl}/api/jobs?pageSize=100`, { headers: { Authorization: `Bearer ${token}` } });
    jobs = ((await list.json()) as { items: typeof jobs }).items;
  });

  afterAll(async () => {
    await api?.process.stop();
    rmSync(UPLOADS_DIR, { recursive: true, force: true });
  });

  async function upload(jobId: string, version: number, content: Buffer, name: string): Promise<{ status: number; code?: string; ms: number }> {
    const form = new FormData();
    form.append('files', new Blob([new Uint8Array(content)], { type: 'image/png' }), name);
    const started = performance.now();
    const res = await fetch(`${api!.baseUrl}/api/jobs/${jobId}/photos`, {
      method: 'POST',
      headers: { Authorization: `Bearer ${token}`, 'If-Match': `"${version}"` },
      body: form,
    });
    const body = (await res.json()) as { code?: string };
    return { status: res.status, code: body.code, ms: performance.now() - started };
  }

  it('should refuse eight hostile images at once while a real photo processes, health answering throughout (figures printed)', async () => {
    // Two jobs, so that the real photo's version bump cannot turn a hostile upload into a 409.
    const hostileJob = await newJobInProgress(jobs[0]!.site.id);
    const photoJob = await newJobInProgress(jobs[0]!.site.id);
    const hostile: [string, Buffer, number, string][] = [
      ['1x2400.png', await strip(1, 2400), 422, 'IMAGE_TOO_ELONGATED'],
      ['2400x1.png', await strip(2400, 1), 422, 'IMAGE_TOO_ELONGATED'],
      ['3x3000.png', await strip(3, 3000), 422, 'IMAGE_TOO_ELONGATED'],
      ['1x20000000.png', makePixelBombPng(1, 20_000_000), 413, 'IMAGE_SIDE_TOO_LONG'],
      ['20000000x1.png', makePixelBombPng(20_000_000, 1), 413, 'IMAGE_SIDE_TOO_LONG'],
      ['25000x4000.png', makePixelBombPng(25_000, 4000), 413, 'IMAGE_SIDE_TOO_LONG'],
      ['20000x20000.png', makePixelBombPng(20_000, 20_000), 413, 'IMAGE_TOO_MANY_PIXELS'],
      ['60000x60000.png', makePixelBombPng(60_000, 60_000), 413, 'IMAGE_TOO_MANY_PIXELS'],
    ];
    // Two real 12 MP photos go in first, so the image queue is busy while the hostile files arrive.
    const photo = await makeFieldPhoto();
    let startLoad: () => void = () => undefined;
    const started = new Promise<void>((resolve) => (startLoad = resolve));
    const work = (async () => {
      await started;
      const real = upload(photoJob.id, photoJob.version, photo, 'field.jpg');
      await sleep(50);
      const answers = await Promise.all(hostile.map(([name, content]) => upload(hostileJob.id, hostileJob.version, content, name)));
      return { answers, real: await real };
    })();
    const polling = healthLatencies(api!.baseUrl, work);
    setTimeout(startLoad, 400);
    const [health, { answers, real }] = await Promise.all([polling, work]);

    for (const [index, [name, , status, code]] of hostile.entries()) {
      expect({ name, status: answers[index]!.status, code: answers[index]!.code }).toEqual({ name, status, code });
        // The goal is 1 s (issue 18 §1); a timed test on a shared 2-core machine only guards against the
      // pathology measured before the fix (12–21 s of CPU per file), so the bound here is 3 s.
      expect(answers[index]!.ms, `${name} answered in ${Math.round(answers[index]!.ms)} ms`).toBeLessThan(3000);
    }
    expect(real.status).toBe(201);
    expect(health.statuses.every((s) => s === 200)).toBe(true);
    console.log(`health during hostile uploads: ${health.latencies.length} samples, p99 ${p99(health.latencies).toFixed(1)} ms`);
    // The 200 ms goal is reported above and tracked by `npm run bench`; the assertion only catches the
    // pathology from before the fix (health waited 7–14 s), so it allows 2 s on a noisy machine.
    expect(p99(health.latencies)).toBeLessThan(2000);
  });

  it('should answer 200 drawing requests at once with no 5xx, health answering throughout (figures printed)', async () => {
    const headers = { Authorization: `Bearer ${token}` };
    // Every job's drawings in both unit systems and both papers: most requests are distinct, so the
    // cache cannot answer them all; the rest are repeats arriving together.
    const paths: string[] = [];
    for (const job of jobs) {
      paths.push(`/api/jobs/${job.id}/drawings/schematic.svg`, `/api/jobs/${job.id}/drawings/schematic.svg?units=imperial`);
      paths.push(`/api/jobs/${job.id}/drawings/site-plan.svg?paper=a4`, `/api/jobs/${job.id}/drawings/site-plan.svg?paper=letter&units=imperial`);
    }
    const requests = Array.from({ length: 200 }, (_, i) => paths[i % paths.length]!);
    let startBurst: () => void = () => undefined;
    const started = new Promise<void>((resolve) => (startBurst = resolve));
    const burst = started.then(() =>
      Promise.all(
        requests.map(async (path) => {
          const res = await fetch(`${api!.baseUrl}${path}`, { headers });
          const body = Buffer.from(await res.arrayBuffer());
          return { path, status: res.status, body: res.status === 200 ? '' : body.toString('utf8', 0, 200) };
        }),
      ),
    );
    const polling = healthLatencies(api!.baseUrl, burst);
    setTimeout(startBurst, 400);
    const [health, answers] = await Promise.all([polling, burst]);
    const failed = answers.filter((a) => a.status !== 200);
    expect(failed, JSON.stringify(failed.slice(0, 5))).toEqual([]);
    expect(health.statuses.every((s) => s === 200)).toBe(true);
    console.log(`health during 200 drawings: ${health.latencies.length} samples, p99 ${p99(health.latencies).toFixed(1)} ms`);
    // The 200 ms goal is reported above and tracked by `npm run bench`; the assertion only catches the
    // pathology from before the fix (health waited 7–14 s), so it allows 2 s on a noisy machine.
    expect(p99(health.latencies)).toBeLessThan(2000);

    // A repeat is a cache hit; sending its ETag back is a 304.
    const again = await fetch(`${api!.baseUrl}${paths[0]}`, { headers });
    expect(again.headers.get('x-drawing-cache')).toBe('hit');
    const etag = again.headers.get('etag')!;
    await again.text();
    expect((await fetch(`${api!.baseUrl}${paths[0]}`, { headers: { ...headers, 'If-None-Match': etag } })).status).toBe(304);
  });
});
