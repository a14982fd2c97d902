/**
 * Lighthouse benchmark (issue 17, "fast on a weak signal"): `npx tsx bench/lighthouse.bench.ts` (part of
 * `npm run bench`). A benchmark, not a timed test: it prints and records figures, it never fails on them.
 *
 * Self-contained: a throwaway database (`loamline_bench_lighthouse`) with the demo seed, the web app and
 * the API built as `npm start` builds them, and the built server started as `npm start` starts it
 * (`api/dist/main.js`, NODE_ENV=production, serving web/dist with its precompressed copies). Lighthouse
 * 12 then loads four pages in Debian Chromium with its default **mobile** preset (emulated mid-range
 * phone, simulated slow 4G, 4× CPU slowdown), performance category only, each in a fresh profile (cold
 * cache): the sign-in page, Today (the crew lead's home), a job page, and the public locate view. The
 * signed-in pages carry the lead's refresh cookie from a sign-in of their own (the app restores the
 * session from it as on any reload; each refresh cookie is used once). Figures per page: the
 * performance score (goal ≥ 90) and the largest contentful paint (goal < 2.5 s).
 *
 * For finding out why a page is slow (environment variables, passed through by `npm run bench`):
 * - `LIGHTHOUSE_PAGES=locate,sign-in` measures only the pages whose name contains one of the words
 *   (figures are then printed but not recorded, so a partial run never replaces a whole one);
 * - `LIGHTHOUSE_DETAIL=1` prints, per page, the LCP element and its breakdown (TTFB, load delay, load
 *   time, render delay), the requests in the order they started with their sizes, which block
 *   rendering, the script boot-up time per file and the main-thread work by kind;
 * - `LIGHTHOUSE_WEB_DIST=/tmp/some-dist` serves that web build (e.g. `npx vite build --outDir …` of a
 *   change being tried) instead of building and serving web/dist.
 */
import { randomBytes } from 'node:crypto';
import { mkdtemp, rm } from 'node:fs/promises';
import { loadavg, tmpdir } from 'node:os';
import { join } from 'node:path';

import * as chromeLauncher from 'chrome-launcher';
import lighthouse from 'lighthouse';

import { DEMO_EMAILS, DEMO_PASSWORD } from '../api/src/db/seed/demo-records.js';
// @ts-expect-error -- plain ESM script shared with `npm start`; no type declarations.
import { seedDemo } from '../scripts/lib/seed.mjs';
// @ts-expect-error -- plain ESM script shared with `npm start`; no type declarations.
import { chromiumPath, ensureApiBuilt, ensureDatabase, ensurePostgres, ensureWebBuilt, migrate, root, stopPostgres } from '../scripts/lib/setup.mjs';
import { startApi } from '../test/system/support/processes.js';
import { type BenchFigure, recordResults } from './results.js';

const SCORE_GOAL = 90;
const LCP_GOAL_S = 2.5;
const CHROME_FLAGS = [
  '--headless=new',
  '--no-sandbox',
  '--disable-gpu',
  '--disable-dev-shm-usage',
  '--disable-background-networking',
  '--disable-extensions',
  '--disable-sync',
  '--no-first-run',
  '--no-default-browser-check',
  '--mute-audio',
];

/** Signs in over HTTP and returns the access token and the refresh cookie (`name=value`). */
async function signIn(baseUrl: string, email: string): Promise<{ accessToken: string; cookie: string }> {
  const res = await fetch(`${baseUrl}/api/auth/sign-in`, {
    method: 'POST',
    headers: { 'Content-Type': 'application/json' },
    body: JSON.stringify({ email, password: DEMO_PASSWORD }),
  });
  if (res.status !== 200) throw new Error(`sign-in as ${email} failed: ${res.status} ${await res.text()}`);
  const cookie = res.headers.getSetCookie().map((c) => c.split(';')[0]!).join('; ');
  if (!cookie) throw new Error('sign-in set no refresh cookie');
  return { accessToken: ((await res.json()) as { accessToken: string }).accessToken, cookie };
}

async function getJson<T>(url: string, accessToken: string, init: RequestInit = {}): Promise<T> {
  const res = await fetch(url, { ...init, headers: { Authorization: `Bearer ${accessToken}`, 'Content-Type': 'application/json', ...init.headers } });
  if (!res.ok) throw new Error(`${init.method ?? 'GET'} ${url}: ${res.status} ${await res.text()}`);
  return (await res.json()) as T;
}

type Page = { name: string; path: string; signedIn: boolean };

const ONLY_PAGES = (process.env.LIGHTHOUSE_PAGES ?? '').split(',').map((p) => p.trim()).filter(Boolean);
const DETAIL = process.env.LIGHTHOUSE_DETAIL === '1';
const WEB_DIST = process.env.LIGHTHOUSE_WEB_DIST;

type Lhr = NonNullable<Awaited<ReturnType<typeof lighthouse>>>['lhr'];
type Row = Record<string, unknown>;

function detailRows(lhr: Lhr, id: string): Row[] {
  const details = lhr.audits[id]?.details as { items?: Row[] } | undefined;
  return details?.items ?? [];
}

const kb = (bytes: unknown) => (typeof bytes === 'number' ? (bytes / 1024).toFixed(1) : '-');
const ms = (value: unknown) => (typeof value === 'number' ? value.toFixed(0) : '-');
const shortUrl = (url: unknown, base: string) => String(url).replace(base, '').slice(0, 70);

/** The why of one page's figures (LIGHTHOUSE_DETAIL=1). */
function printDetail(lhr: Lhr, base: string): void {
  // LCP element: a list of two tables, the element, then the phases.
  const [elementTable, phaseTable] = detailRows(lhr, 'largest-contentful-paint-element') as { items?: Row[] }[];
  const node = elementTable?.items?.[0]?.node as { nodeLabel?: string; snippet?: string } | undefined;
  console.log(`  LCP element: ${node?.snippet ?? '(none)'} "${(node?.nodeLabel ?? '').slice(0, 60)}"`);
  for (const phase of phaseTable?.items ?? []) console.log(`    ${String(phase.phase).padEnd(22)} ${ms(phase.timing).padStart(6)} ms`);
  const metrics = detailRows(lhr, 'metrics')[0] ?? {};
  console.log(`  simulated: FCP ${ms(metrics.firstContentfulPaint)} ms, LCP ${ms(metrics.largestContentfulPaint)} ms, TTI ${ms(metrics.interactive)} ms, SI ${ms(metrics.speedIndex)}; observed (unthrottled) LCP ${ms(metrics.observedLargestContentfulPaint)} ms`);
  const blocking = new Set([...detailRows(lhr, 'render-blocking-insight'), ...detailRows(lhr, 'render-blocking-resources')].map((r) => String(r.url)));
  console.log('  requests (observed, unthrottled; start/end ms after navigation, transfer/resource KB, priority, B = render-blocking):');
  const requests = detailRows(lhr, 'network-requests');
  const t0 = Math.min(...requests.map((r) => Number(r.networkRequestTime ?? Infinity)));
  for (const r of requests) {
    console.log(
      `    ${ms(Number(r.networkRequestTime) - t0).padStart(6)} ${ms(Number(r.networkEndTime) - t0).padStart(6)} ${kb(r.transferSize).padStart(7)} ${kb(r.resourceSize).padStart(7)} ${String(r.priority ?? '').padEnd(8)} ${blocking.has(String(r.url)) ? 'B' : ' '} ${String(r.resourceType ?? '').padEnd(10)} ${shortUrl(r.url, base)}`,
    );
  }
  console.log('  boot-up time per script (ms: total / scripting / parse+compile):');
  for (const r of detailRows(lhr, 'bootup-time')) console.log(`    ${ms(r.total).padStart(6)} ${ms(r.scripting).padStart(6)} ${ms(r.scriptParseCompile).padStart(6)}  ${shortUrl(r.url, base)}`);
  console.log('  main-thread work (ms):');
  for (const r of detailRows(lhr, 'mainthread-work-breakdown')) console.log(`    ${ms(r.duration).padStart(6)}  ${String(r.groupLabel ?? r.group)}`);
  const failing = Object.values(lhr.audits).filter((a) => a.score !== null && a.score < 0.9 && a.scoreDisplayMode !== 'informative' && a.scoreDisplayMode !== 'notApplicable' && a.scoreDisplayMode !== 'manual');
  console.log(`  audits below 0.9: ${failing.map((a) => `${a.id} (${a.displayValue ?? a.score})`).join('; ')}`);
}
type Measured = { name: string; score: number; lcpS: number; fcpS: number; tbtMs: number; transferKb: number };

async function measure(baseUrl: string, page: Page): Promise<Measured> {
  const userDataDir = await mkdtemp(join(tmpdir(), 'loamline-lighthouse-profile-'));
  const chrome = await chromeLauncher.launch({ chromePath: chromiumPath as string, userDataDir, chromeFlags: CHROME_FLAGS, logLevel: 'silent' });
  try {
    const extraHeaders = page.signedIn ? { Cookie: (await signIn(baseUrl, DEMO_EMAILS.lead)).cookie } : undefined;
    const result = await lighthouse(
      `${baseUrl}${page.path}`,
      { port: chrome.port, output: 'json', logLevel: 'error', onlyCategories: ['performance'], extraHeaders },
    );
    if (!result) throw new Error(`Lighthouse returned nothing for ${page.path}`);
    const { lhr } = result;
    if (lhr.runtimeError) throw new Error(`Lighthouse on ${page.path}: ${lhr.runtimeError.code} ${lhr.runtimeError.message}`);
    const final = lhr.finalDisplayedUrl;
    if (new URL(final).pathname !== new URL(`${baseUrl}${page.path}`).pathname) {
      throw new Error(`${page.name}: Lighthouse ended on ${final}, not ${page.path} (not signed in?)`);
    }
    const numeric = (id: string) => {
      const value = lhr.audits[id]?.numericValue;
      if (typeof value !== 'number') throw new Error(`${page.name}: no ${id} figure (${lhr.audits[id]?.errorMessage ?? 'missing'})`);
      return value;
    };
    if (DETAIL) {
      console.log(`${page.name}:`);
      printDetail(lhr, baseUrl);
    }
    const score = lhr.categories.performance?.score;
    if (typeof score !== 'number') throw new Error(`${page.name}: no performance score`);
    return {
      name: page.name,
      score: score * 100,
      lcpS: numeric('largest-contentful-paint') / 1000,
      fcpS: numeric('first-contentful-paint') / 1000,
      tbtMs: numeric('total-blocking-time'),
      transferKb: numeric('total-byte-weight') / 1024,
    };
  } finally {
    chrome.kill();
    await rm(userDataDir, { recursive: true, force: true });
  }
}

async function main(): Promise<void> {
  const pgServer = ensurePostgres();
  const databaseUrl: string = await ensureDatabase(pgServer, 'loamline_bench_lighthouse', { fresh: true });
  const uploads = await mkdtemp(join(tmpdir(), 'loamline-bench-lighthouse-'));
  let api: Awaited<ReturnType<typeof startApi>> | undefined;
  try {
    await migrate(databaseUrl);
    ensureApiBuilt();
    if (!WEB_DIST) ensureWebBuilt();
    await seedDemo(databaseUrl);
    api = await startApi(databaseUrl, {
      NODE_ENV: 'production',
      LOG_FORMAT: 'json',
      JWT_ACCESS_SECRET: randomBytes(32).toString('hex'),
      PACKET_WORKER_IN_API: 'false',
      UPLOADS_DIR: uploads,
      WEB_DIST_DIR: WEB_DIST ?? join(root as string, 'web/dist'),
      SIGN_IN_LIMIT_PER_ADDRESS_PER_MINUTE: '1000',
      SIGN_IN_LIMIT_PER_ACCOUNT: '1000',
    });
    const base = api.baseUrl;

    // A job the demo lead is on, and a locate link to its site (made by the office).
    const lead = await signIn(base, DEMO_EMAILS.lead);
    const mine = await getJson<{ items: { id: string; site: { id: string } }[] }>(`${base}/api/jobs?mine=true&pageSize=100`, lead.accessToken);
    const job = mine.items[0];
    if (!job) throw new Error('the demo lead is on no job');
    const office = await signIn(base, DEMO_EMAILS.office);
    const link = await getJson<{ token: string }>(`${base}/api/sites/${job.site.id}/locate-links`, office.accessToken, {
      method: 'POST',
      body: JSON.stringify({ expiresInDays: 7, note: 'Lighthouse bench' }),
    });

    const allPages: Page[] = [
      { name: 'sign-in', path: '/sign-in', signedIn: false },
      { name: 'Today', path: '/', signedIn: true },
      { name: 'job page', path: `/jobs/${job.id}`, signedIn: true },
      { name: 'locate view', path: `/locate/${encodeURIComponent(link.token)}`, signedIn: false },
    ];
    const pages = ONLY_PAGES.length === 0 ? allPages : allPages.filter((p) => ONLY_PAGES.some((word) => p.name.includes(word)));
    console.log(`Loamline Lighthouse benchmark — lighthouse mobile preset (simulated slow 4G, 4× CPU), ${chromiumPath as string}, node ${process.version}`);
    console.log(`load average at the start: ${loadavg().map((l) => l.toFixed(2)).join(' ')} (Lighthouse's simulated figures still drift on a busy machine)`);
    console.log('');
    console.log('page          score   LCP s   FCP s   TBT ms   transfer KB');
    const results: Measured[] = [];
    for (const page of pages) {
      const m = await measure(base, page);
      results.push(m);
      console.log(
        `${m.name.padEnd(12)} ${m.score.toFixed(0).padStart(6)} ${m.lcpS.toFixed(2).padStart(7)} ${m.fcpS.toFixed(2).padStart(7)} ${m.tbtMs.toFixed(0).padStart(8)} ${m.transferKb.toFixed(0).padStart(13)}`,
      );
    }
    console.log('');
    const figures: BenchFigure[] = [];
    for (const m of results) {
      const scoreMet = m.score >= SCORE_GOAL;
      const lcpMet = m.lcpS < LCP_GOAL_S;
      console.log(`goal ${m.name}: score ≥ ${SCORE_GOAL} ${scoreMet ? 'MET' : 'NOT MET'}, LCP < ${LCP_GOAL_S} s ${lcpMet ? 'MET' : 'NOT MET'}`);
      figures.push({ label: `${m.name}: performance score (mobile)`, value: m.score, unit: 'points', goal: `≥ ${SCORE_GOAL}`, isMet: scoreMet });
      figures.push({ label: `${m.name}: largest contentful paint`, value: m.lcpS, unit: 's', goal: `< ${LCP_GOAL_S} s`, isMet: lcpMet });
      figures.push({ label: `${m.name}: bytes transferred`, value: m.transferKb, unit: 'KB' });
    }
    if (ONLY_PAGES.length === 0 && !WEB_DIST) recordResults('lighthouse', figures);
    else console.log('(a partial run or another build: figures not recorded in bench/results.json)');
  } finally {
    await api?.process.stop();
    await rm(uploads, { recursive: true, force: true });
    stopPostgres(pgServer);
  }
}

await main();
