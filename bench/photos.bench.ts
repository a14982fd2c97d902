/**
 * Photo upload benchmark: `npx tsx bench/photos.bench.ts` (part of `npm run bench`).
 *
 * Self-contained: creates a throwaway database (`loamline_bench_photos`), builds the API if needed and
 * starts the built server (`api/dist/main.js`) as a child process with disk storage in a temp folder
 * (tsx cannot run Nest's DI, see VERSIONS.md). It uploads 24 twelve-megapixel JPEGs (noisy, ~5 MB,
 * EXIF orientation 6 + GPS, like phone photos) one per request, as the phone client does, and reads the
 * server's VmRSS/VmHWM from /proc/<pid>/status throughout.
 *
 * Figures: upload + processing throughput, and the server's peak resident memory growth over its
 * idle, warmed-up level (goal: < 300 MB). Baseline: sharp decoding the same 24 files in this process
 * alone (upright, to print size), so figures from different machines compare as a ratio.
 */
import { randomBytes } from 'node:crypto';
import { spawn } from 'node:child_process';
import { mkdtemp, readFile, rm } from 'node:fs/promises';
import { createServer } from 'node:net';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

import { hash } from '@node-rs/argon2';
import pg from 'pg';
import sharp from 'sharp';

// @ts-expect-error -- plain ESM script shared with `npm start`; no type declarations.
import { ensureApiBuilt, ensureDatabase, ensurePostgres, migrate, root, stopPostgres } from '../scripts/lib/setup.mjs';
import { makeFieldPhoto, makePng } from '../test/fixtures/photos/make-photos.js';
import { recordResults } from './results.js';

const PHOTOS = 24;
const PASSWORD = 'bench-password-123';

async function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const server = createServer();
    server.once('error', reject);
    server.listen(0, '127.0.0.1', () => {
      const { port } = server.address() as { port: number };
      server.close(() => resolve(port));
    });
  });
}

async function memory(pid: number): Promise<{ rssMb: number; hwmMb: number }> {
  const status = await readFile(`/proc/${pid}/status`, 'utf8');
  const kb = (field: string) => Number(new RegExp(`^${field}:\\s+(\\d+) kB`, 'm').exec(status)?.[1] ?? Number.NaN);
  return { rssMb: kb('VmRSS') / 1024, hwmMb: kb('VmHWM') / 1024 };
}

const fmt = (value: number, digits = 1) => value.toFixed(digits).padStart(9);

async function main(): Promise<void> {
  const pgServer = ensurePostgres();
  const databaseUrl: string = await ensureDatabase(pgServer, 'loamline_bench_photos', { fresh: true });
  await migrate(databaseUrl);
  ensureApiBuilt();

  // An office user to sign in as (office may add photos to any job of the company).
  const email = `office.${randomBytes(4).toString('hex')}@bench.example`;
  const client = new pg.Client({ connectionString: databaseUrl });
  await client.connect();
  const company = await client.query("insert into companies (name) values ('Bench Photos') returning id");
  await client.query("insert into users (company_id, email, name, role, password_hash) values ($1, $2, 'Bench office', 'office', $3)", [
    company.rows[0].id,
    email,
    await hash(PASSWORD),
  ]);
  await client.end();

  process.stdout.write(`generating ${PHOTOS} 12 MP JPEGs… `);
  const files: Buffer[] = [];
  for (let i = 0; i < PHOTOS; i += 1) files.push(await makeFieldPhoto({ gps: { lat: 45.5 + i / 1000, lon: -122.675 } }));
  const totalMb = files.reduce((sum, f) => sum + f.length, 0) / 1024 / 1024;
  console.log(`${totalMb.toFixed(1)} MB in all`);

  // Baseline: sharp alone decodes each file upright to print size, one at a time, in this process.
  sharp.concurrency(1);
  sharp.cache(false);
  const decodeStart = performance.now();
  for (const file of files) await sharp(file).rotate().resize(2400, 2400, { fit: 'inside' }).raw().toBuffer();
  const decodeMs = performance.now() - decodeStart;

  const uploads = await mkdtemp(join(tmpdir(), 'loamline-bench-uploads-'));
  const port = await freePort();
  const server = spawn(process.execPath, [join(root, 'api/dist/main.js')], {
    cwd: root,
    stdio: ['ignore', 'ignore', 'inherit'],
    env: {
      ...process.env,
      NODE_ENV: 'production',
      DATABASE_URL: databaseUrl,
      JWT_ACCESS_SECRET: randomBytes(48).toString('base64url'),
      HOST: '127.0.0.1',
      PORT: String(port),
      LOCAL_SMTP_PORT: '0',
      LOG_LEVEL: 'warn',
      STORAGE_DRIVER: 'disk',
      UPLOADS_DIR: uploads,
    },
  });
  const base = `http://127.0.0.1:${port}/api`;
  try {
    for (let attempt = 0; ; attempt += 1) {
      try {
        if ((await fetch(`${base}/health`)).ok) break;
      } catch {
        // not listening yet
      }
      if (attempt > 150 || server.exitCode !== null) throw new Error('the API did not start');
      await new Promise((resolve) => setTimeout(resolve, 100));
    }
    const call = async (method: string, path: string, body?: unknown, headers: Record<string, string> = {}) => {
      const res = await fetch(`${base}${path}`, {
        method,
        headers: { ...(body instanceof FormData ? {} : { 'content-type': 'application/json' }), ...headers },
        body: body instanceof FormData ? body : body === undefined ? undefined : JSON.stringify(body),
      });
      const json = (await res.json()) as Record<string, any>;
      if (!res.ok) throw new Error(`${method} ${path} → ${res.status} ${JSON.stringify(json)}`);
      return json;
    };
    const { accessToken } = await call('POST', '/auth/sign-in', { email, password: PASSWORD });
    const auth = { authorization: `Bearer ${accessToken}` };
    const customer = await call('POST', '/customers', { name: 'Bench customer' }, auth);
    const site = await call(
      'POST',
      '/sites',
      { customerId: customer.id, label: 'Bench yard', addressLine1: '1 Imaginary Lane', city: 'Nowhereton', country: 'Testland' },
      auth,
    );
    const job = await call('POST', '/jobs', { siteId: site.id, title: 'Bench job' }, auth);
    let version = job.version as number;
    const upload = async (content: Buffer, name: string, type: string) => {
      const form = new FormData();
      form.append('files', new Blob([content], { type }), name);
      const res = await call('POST', `/jobs/${job.id}/photos`, form, { ...auth, 'if-match': `"${version}"` });
      version = res.jobVersion;
      return res;
    };

    const idle = await memory(server.pid!);
    // Warm up once with a small image: loads libvips and the code paths, so growth is what photos cost.
    await upload(await makePng(), 'warm-up.png', 'image/png');
    const warm = await memory(server.pid!);

    let peakRss = warm.rssMb;
    let sampling = true;
    const sampler = (async () => {
      while (sampling) {
        peakRss = Math.max(peakRss, (await memory(server.pid!)).rssMb);
        await new Promise((resolve) => setTimeout(resolve, 10));
      }
    })();
    const perPhoto: number[] = [];
    const start = performance.now();
    for (const [i, file] of files.entries()) {
      const t = performance.now();
      const res = await upload(file, `IMG_${String(i).padStart(4, '0')}.JPG`, 'image/jpeg');
      perPhoto.push(performance.now() - t);
      if (res.photos[0].width !== 3000 || res.photos[0].height !== 4000) throw new Error('unexpected photo size');
    }
    const totalMs = performance.now() - start;
    sampling = false;
    await sampler;
    const end = await memory(server.pid!);
    const sorted = [...perPhoto].sort((x, y) => x - y);

    console.log(`\nupload + processing of ${PHOTOS} × 12 MP JPEG (one photo per request, sequential)`);
    console.log(`  total                 ${fmt(totalMs / 1000, 2)} s`);
    console.log(`  throughput            ${fmt(PHOTOS / (totalMs / 1000), 2)} photos/s  (${fmt(totalMb / (totalMs / 1000), 1)} MB/s)`);
    console.log(`  per photo median      ${fmt(sorted[Math.floor(sorted.length / 2)]!)} ms   max ${fmt(sorted[sorted.length - 1]!)} ms`);
    console.log(`baseline: sharp decode only, same ${PHOTOS} files in-process`);
    console.log(`  total                 ${fmt(decodeMs / 1000, 2)} s   → upload/decode ratio ${fmt(totalMs / decodeMs, 2)}×`);
    console.log('API process resident memory (MB)');
    console.log(`  idle after start      ${fmt(idle.rssMb)}`);
    console.log(`  warmed up             ${fmt(warm.rssMb)}`);
    console.log(`  peak during uploads   ${fmt(Math.max(peakRss, end.hwmMb))}   (VmHWM ${fmt(end.hwmMb)})`);
    console.log(`  after uploads         ${fmt(end.rssMb)}`);
    const growth = Math.max(peakRss, end.hwmMb) - warm.rssMb;
    const growthFromIdle = Math.max(peakRss, end.hwmMb) - idle.rssMb;
    console.log(`  peak growth           ${fmt(growth)}   over warmed-up (${fmt(growthFromIdle)} over idle)  goal < 300: ${growthFromIdle < 300 ? 'met' : 'MISSED'}`);
    recordResults('photos', [
      { label: `photo upload + processing, ${PHOTOS} × 12 MP JPEG`, value: PHOTOS / (totalMs / 1000), unit: 'photos/s' },
      { label: 'photo upload, per photo median', value: sorted[Math.floor(sorted.length / 2)]!, unit: 'ms' },
      { label: 'upload / sharp decode alone', value: totalMs / decodeMs, unit: '×' },
      { label: 'API peak memory growth over idle', value: growthFromIdle, unit: 'MB', goal: '< 300 MB', isMet: growthFromIdle < 300 },
    ]);
  } finally {
    server.kill('SIGTERM');
    await new Promise((resolve) => (server.exitCode !== null ? resolve(null) : server.once('exit', resolve)));
    await rm(uploads, { recursive: true, force: true });
    stopPostgres(pgServer);
  }
}

main().catch((error: unknown) => {
  console.error(error);
  process.exit(1);
});
