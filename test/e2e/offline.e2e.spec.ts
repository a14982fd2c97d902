import { writeFileSync } from 'node:fs';
import { join } from 'node:path';

import type { Browser, BrowserContext, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';

import type { AsBuilt } from '../../api/src/domain/as-built/as-built.schema.js';
import { makeFieldPhoto } from '../fixtures/photos/make-photos.js';
import { launchChromium, tempDir } from '../support/browser.js';
import { createCompany, TEST_PASSWORD, type TestCompany } from '../support/fixtures.js';
import { httpApiAs } from '../support/http-api.js';
import { type Api, createJob, createSite, moveJob, recordAsBuilt } from '../support/records.js';

// With the app's service worker, as users get it (the other browser tests block it: test/support/browser.ts).
const PHONE = { viewport: { width: 390, height: 844 }, hasTouch: true, isMobile: true, locale: 'en-US', serviceWorkers: 'allow' as const };

/** The office's start: an amplifier, a satellite, the trunk between them, and two taped corners. */
const START: AsBuilt = {
  zones: [],
  referencePoints: [
    { id: 'nw', label: 'House NW corner', x: 0, y: 0 },
    { id: 'ne', label: 'House NE corner', x: 10, y: 0 },
  ],
  items: [
    { id: 'amp', kind: 'amplifier', label: 'Garage amp', channels: [{ id: 'ch1', name: 'Patio' }], ratedWatts8Ohm: 60, ratedWatts4Ohm: 100, minimumImpedanceOhm: 4 },
    { id: 'sat', kind: 'speaker', label: 'Patio satellite', nominalImpedanceOhm: 8 },
  ],
  runs: [
    {
      id: 'run',
      label: 'Patio trunk',
      fromItemId: 'amp',
      toItemId: 'sat',
      cableType: '14/2 direct burial',
      gauge: { system: 'awg', awg: 14 },
      conductors: 2,
      pairs: [{ pairIndex: 1, channel: { amplifierItemId: 'amp', channelId: 'ch1' } }],
      measuredLengthM: 12,
      method: 'direct_burial',
      location: 'general',
      depthReadings: [],
    },
  ],
  checks: [],
};

async function signIn(page: Page, email: string): Promise<void> {
  await page.getByRole('heading', { name: 'Sign in' }).waitFor();
  await page.getByLabel(/^E-mail/).fill(email);
  await page.getByLabel(/^Password/).fill(TEST_PASSWORD);
  await page.getByRole('button', { name: 'Sign in' }).click();
}

/** Until the service worker controls the page and the job is kept in IndexedDB (both asynchronous). */
async function untilReadyOffline(page: Page, jobId: string): Promise<void> {
  await page.evaluate(() => navigator.serviceWorker.ready.then(() => undefined));
  await expect
    .poll(
      () =>
        page.evaluate(
          (id) =>
            new Promise<boolean>((resolve) => {
              const open = indexedDB.open('loamline-cache');
              open.onsuccess = () => {
                const db = open.result;
                if (!db.objectStoreNames.contains('queries')) return resolve(false);
                const get = db.transaction('queries').objectStore('queries').get('query-cache');
                get.onsuccess = () => resolve(JSON.stringify(get.result?.clientState?.queries?.map((q: { queryKey: unknown }) => q.queryKey) ?? []).includes(id));
                get.onerror = () => resolve(false);
              };
              open.onerror = () => resolve(false);
            }),
          jobId,
        ),
      { timeout: 15_000 },
    )
    .toBe(true);
}

describe('a crew lead records with no signal (issue 17)', () => {
  const baseUrl = inject('baseUrl');
  let browser: Browser;
  let company: TestCompany;
  let office: Api;
  const files = tempDir('loamline-offline-');
  const photoPath = join(files.path, 'trench-open.jpg');

  beforeAll(async () => {
    browser = await launchChromium();
    company = await createCompany('Offline Yard');
    office = (await httpApiAs(baseUrl, company.users.office)) as unknown as Api;
    writeFileSync(photoPath, await makeFieldPhoto({ width: 800, height: 600, orientation: 1 }));
  });

  afterAll(async () => {
    await browser.close();
    files.remove();
  });

  async function startedJob(): Promise<{ jobId: string; title: string }> {
    const { siteId } = await createSite(office);
    const draft = await createJob(office, siteId, { crewLeadUserId: company.users.lead.id });
    const { version } = await recordAsBuilt(office, draft, START);
    await moveJob(office, { ...draft, version }, 'in_progress');
    const job = await office.expectOk('get', `/api/jobs/${draft.id}`);
    return { jobId: draft.id, title: job.title as string };
  }

  /** Signs the lead in on a phone, lands on Today, opens the job there and gets it ready for no signal. */
  async function openJobOnPhone(jobId: string, title: string): Promise<{ context: BrowserContext; page: Page }> {
    const context = await browser.newContext(PHONE);
    const page = await context.newPage();
    await page.goto(`${baseUrl}/`);
    await signIn(page, company.users.lead.email);
    await page.getByRole('heading', { name: 'Today' }).waitFor();
    await page.getByRole('link', { name: new RegExp(title) }).first().click();
    await page.waitForURL(`**/jobs/${jobId}**`);
    await page.getByRole('heading', { name: title }).first().waitFor();
    await untilReadyOffline(page, jobId);
    return { context, page };
  }

  it('should open a job with no signal after a reload, keep what the lead records, and send it once, in order, when the signal returns', async () => {
    const { jobId, title } = await startedJob();
    const { context, page } = await openJobOnPhone(jobId, title);
    const errors: string[] = [];
    page.on('pageerror', (error) => errors.push(error.message));
    // Writes the server refused, apart from the expected: 401 (the session kept offline is refreshed and
    // the request sent again) and a photo's 412 (sent again on top while the changes replay).
    const refused: string[] = [];
    page.on('response', (response) => {
      const path = new URL(response.url()).pathname;
      const status = response.status();
      if (!path.startsWith('/api/jobs/') || status < 400 || status === 401 || (status === 412 && path.endsWith('/photos'))) return;
      refused.push(`${response.request().method()} ${path} ${status}`);
    });
    const before = (await office.expectOk('get', `/api/jobs/${jobId}`)).version as number;

    // No signal; the page reloads from the service worker, the job from the kept cache.
    await context.setOffline(true);
    await page.reload();
    await page.getByRole('heading', { name: title }).first().waitFor();

    // A speaker with two taped ties.
    await page.goto(`${baseUrl}/jobs/${jobId}?section=equipment`).catch(() => undefined);
    await page.getByRole('button', { name: 'Add equipment' }).click();
    const itemForm = page.locator('form').filter({ has: page.getByLabel(/^Name/) }).first();
    await itemForm.getByLabel(/^Kind/).selectOption({ label: 'Speaker' });
    await itemForm.getByLabel(/^Name/).fill('Lawn speaker L1');
    await itemForm.getByRole('button', { name: 'Add a tie' }).click();
    await itemForm.getByLabel('Tie 1 from').selectOption({ label: 'House NW corner' });
    await itemForm.getByLabel(/^Distance/).first().fill(`19' 8"`);
    await itemForm.getByRole('button', { name: 'Add a tie' }).click();
    await itemForm.getByLabel('Tie 2 from').selectOption({ label: 'House NE corner' });
    await itemForm.getByLabel(/^Distance/).nth(1).fill(`26' 3"`);
    await itemForm.getByRole('radio', { name: 'Right' }).check();
    await itemForm.getByRole('button', { name: 'Add', exact: true }).click();
    await page.getByText('Waiting to send (1)').first().waitFor();

    // A run from the amplifier to that speaker, which the server has not seen yet: the speaker is there
    // to choose under the id this phone gave it.
    await page.getByRole('tab', { name: /^Runs/ }).click();
    await page.getByRole('button', { name: 'Add run' }).first().click();
    const runForm = page.getByRole('form', { name: 'New run' });
    await runForm.getByLabel(/^Name/).fill('Lawn run');
    await runForm.getByLabel(/^From/).selectOption({ label: 'Garage amp (amplifier)' });
    await runForm.getByLabel(/^To/).selectOption({ label: 'Lawn speaker L1 (speaker)' });
    await runForm.getByLabel(/^Cable type/).fill('14/2 direct burial');
    await runForm.getByLabel(/^Gauge/).fill('14');
    await runForm.getByLabel(/^Measured length/).fill(`40'`);
    await runForm.getByLabel('Pair 1 carries').selectOption({ index: 1 });
    await runForm.getByRole('button', { name: 'Add run' }).click();
    await page.getByText('Waiting to send (2)').first().waitFor();

    // Three depth readings on the trunk, typed as feet-inches.
    await page.goto(`${baseUrl}/jobs/${jobId}?section=runs`).catch(() => undefined);
    const run = page.getByRole('listitem', { name: 'Run Patio trunk' });
    await run.getByRole('button', { name: 'Add depth reading' }).click();
    for (const [station, depth] of [[`6' 6"`, `1' 6"`], [`19' 8"`, `18"`], [`32' 10"`, `1' 8"`]] as const) {
      await run.getByLabel('Station (from the start)').fill(station);
      await run.getByLabel('Cover depth').fill(depth);
      await run.getByRole('button', { name: 'Save reading' }).click();
      await expect.poll(() => run.getByLabel('Station (from the start)').inputValue()).toBe('');
    }
    await page.getByText('Waiting to send (5)').first().waitFor();

    // A check of the channel.
    await page.goto(`${baseUrl}/jobs/${jobId}?section=checks`).catch(() => undefined);
    await page.getByRole('button', { name: 'Add check' }).click();
    const check = page.getByRole('form', { name: 'New check' });
    await check.getByLabel(/^Channel/).selectOption({ index: 1 });
    await check.getByLabel(/^Reading/).fill('7.4');
    await check.getByRole('button', { name: 'Save check' }).click();
    await page.getByText('Waiting to send (6)').first().waitFor();

    // A photo of the open trench: kept in IndexedDB, counted with the changes.
    await page.goto(`${baseUrl}/jobs/${jobId}?section=photos`).catch(() => undefined);
    await page.getByRole('button', { name: 'Add photos' }).first().click();
    const photoDialog = page.getByRole('dialog', { name: 'Add photos' });
    await photoDialog.getByLabel('Choose photos from the library').setInputFiles(photoPath);
    await photoDialog.waitFor({ state: 'detached' });
    await page.getByText('Waiting to send (7)').first().waitFor();

    // The lead moves on to Today; nothing reached the server yet.
    await page.goto(`${baseUrl}/`).catch(() => undefined);
    await page.getByRole('heading', { name: 'Today' }).waitFor();
    await page.getByText('Waiting to send (7)').first().waitFor();
    expect((await office.expectOk('get', `/api/jobs/${jobId}`)).version).toBe(before);

    // Signal again, still on Today: everything goes out from there, once, in the order it was recorded.
    await context.setOffline(false);
    await expect.poll(() => page.getByText(/Waiting to send/).count(), { timeout: 30_000 }).toBe(0);
    expect(new URL(page.url()).pathname, 'sent from the page the lead was on').toBe('/');
    const { asBuilt, job } = await office.expectOk('get', `/api/jobs/${jobId}/as-built`);
    expect(refused, 'no write refused').toEqual([]);
    expect(job.version, 'six changes and one photo').toBe(before + 7);
    const photos = await office.expectOk('get', `/api/jobs/${jobId}/photos`);
    expect(photos.items.map((photo: { original: { name: string } }) => photo.original.name)).toEqual(['trench-open.jpg']);
    const speakers = (asBuilt.items as { label: string; position: unknown }[]).filter((item) => item.label === 'Lawn speaker L1');
    expect(speakers).toHaveLength(1);
    expect(speakers[0]!.position, 'the ties solved on the server too').not.toBeNull();
    const lawnRun = (asBuilt.runs as { label: string; toItemId: string }[]).filter((r) => r.label === 'Lawn run');
    expect(lawnRun.map((r) => r.toItemId), 'the run ends at the speaker under the id the server gave it').toEqual([(speakers[0] as unknown as { id: string }).id]);
    const readings = (asBuilt.runs as { label: string; depthReadings: { stationM: number; depthM: number }[] }[]).find((r) => r.label === 'Patio trunk')!.depthReadings;
    // 6' 6" = 1.9812 m, 19' 8" = 5.9944 m, 32' 10" = 10.0076 m; 1' 6" = 0.4572 m, 18" = 0.4572 m, 1' 8" = 0.508 m
    // (1 ft = 0.3048 m exactly: NIST SP 811, appendix B).
    expect(readings.map((r) => [Number(r.stationM.toFixed(3)), Number(r.depthM.toFixed(3))])).toEqual([
      [1.981, 0.457],
      [5.994, 0.457],
      [10.008, 0.508],
    ]);
    expect(asBuilt.checks).toHaveLength(1);
    expect(errors).toEqual([]);
    await context.close();
  });

  it('should show the sign-in page with no signal once the app is installed (the precached sign-in.html), not the browser’s offline error', async () => {
    const context = await browser.newContext(PHONE);
    const page = await context.newPage();
    await page.goto(`${baseUrl}/sign-in`);
    await signIn(page, company.users.lead.email);
    await page.getByRole('heading', { name: 'Today' }).waitFor();
    // The app registers its worker once loaded and idle; it precaches the build, sign-in.html included.
    await page.evaluate(() => navigator.serviceWorker.ready.then(() => undefined));
    await expect
      .poll(() => page.evaluate(async () => (await caches.keys()).length > 0 && !!(await caches.match('/sign-in.html', { ignoreSearch: true }))), { timeout: 30_000 })
      .toBe(true);

    // The session ends with no signal: the app sends the lead to sign-in, a page of its own.
    await context.setOffline(true);
    await page.goto(`${baseUrl}/sign-in?${new URLSearchParams({ next: '/jobs', expired: '1' })}`);
    await page.getByRole('heading', { name: 'Sign in' }).waitFor();
    await page.getByText('Your session ended. Sign in again to carry on where you were.').waitFor();
    await page.getByLabel(/^E-mail/).fill(company.users.lead.email);
    await page.getByLabel(/^Password/).fill(TEST_PASSWORD);
    await page.getByRole('button', { name: 'Sign in' }).click();
    await page.getByText(/Cannot reach the server\. Check your connection and try again\./).waitFor();
    await context.close();
  });

  it('should open the conflict dialog when the office changed the job meanwhile, and lose neither change', async () => {
    const { jobId, title } = await startedJob();
    const { context, page } = await openJobOnPhone(jobId, title);

    await context.setOffline(true);
    await page.goto(`${baseUrl}/jobs/${jobId}?section=notes`).catch(() => undefined);
    await page.getByLabel('Notes for the office and the packet').fill('Trench backfilled by hand near the roses.');
    await page.getByRole('button', { name: 'Save notes' }).click();
    await page.getByText('Waiting to send (1)').first().waitFor();

    // Meanwhile the office edits the job from the desk.
    const current = await office.expectOk('get', `/api/jobs/${jobId}`);
    await office.expectOk('patch', `/api/jobs/${jobId}`, { endDate: '2026-12-31' }, { 'If-Match': `"${current.version}"` });

    await context.setOffline(false);
    const dialog = page.getByRole('alertdialog', { name: 'Someone saved this job first' });
    await dialog.waitFor({ timeout: 30_000 });
    await dialog.getByRole('button', { name: 'Keep mine and save' }).click();
    await dialog.waitFor({ state: 'detached' });
    await expect.poll(() => page.getByText(/Waiting to send/).count(), { timeout: 30_000 }).toBe(0);

    const after = await office.expectOk('get', `/api/jobs/${jobId}`);
    expect(after.notes).toBe('Trench backfilled by hand near the roses.');
    expect(after.endDate).toBe('2026-12-31');
    await context.close();
  });
});
