import { mkdirSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';

import type { Browser, BrowserContext, Page, Route } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';

import type { AsBuilt } from '../../api/src/domain/as-built/as-built.schema.js';
import { makeFieldPhoto } from '../fixtures/photos/make-photos.js';
import { launchChromium, tempDir } from '../support/browser.js';
import { createCompany, TEST_PASSWORD, type TestCompany } from '../support/fixtures.js';
import { httpApiAs } from '../support/http-api.js';
import { type Api, createJob, createSite, moveJob, recordAsBuilt } from '../support/records.js';

const PHONE = { width: 390, height: 844 };
const DESK = { width: 1280, height: 800 };
/** Set PHOTOS_SHOTS=<folder> to save screenshots of the photo screens there. */
const SHOTS_DIR = process.env.PHOTOS_SHOTS;

/** An amplifier, a satellite and the buried run between them, recorded by the office. */
const RECORD: AsBuilt = {
  zones: [],
  referencePoints: [],
  items: [
    { id: 'amp', kind: 'amplifier', label: 'Garage amp', channels: [{ id: 'ch1', name: 'Patio' }], ratedWatts8Ohm: 60, minimumImpedanceOhm: 4 },
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
      depthReadings: [{ stationM: 2, depthM: 0.2 }],
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

async function shot(page: Page, name: string): Promise<void> {
  if (!SHOTS_DIR) return;
  mkdirSync(SHOTS_DIR, { recursive: true });
  await page.screenshot({ path: join(SHOTS_DIR, `${name}.png`), fullPage: false });
}

const isPhotoPost = (route: Route) => route.request().method() === 'POST';

describe('a technician photographs a run on a phone with a weak signal', () => {
  const baseUrl = inject('baseUrl');
  let browser: Browser;
  let company: TestCompany;
  let office: Api;
  let jobId: string;
  let runId: string;
  const files = tempDir('loamline-photos-');
  const paths: string[] = [];

  beforeAll(async () => {
    browser = await launchChromium();
    company = await createCompany('Photos Flow');
    office = (await httpApiAs(baseUrl, company.users.office)) as unknown as Api;
    const { siteId } = await createSite(office);
    const created = await createJob(office, siteId, { crewLeadUserId: company.users.lead.id, technicianUserIds: [company.users.tech.id] });
    const { ids, version } = await recordAsBuilt(office, created, RECORD);
    await moveJob(office, { ...created, version }, 'in_progress');
    jobId = created.id;
    runId = ids.get('run')!;
    // Small but real JPEGs with noise (a few hundred KB), so the upload takes long enough to show progress.
    for (const name of ['trench-tape.jpg', 'wall-entry.jpg', 'amp-rack.jpg', 'late-shot.jpg']) {
      const path = join(files.path, name);
      writeFileSync(path, await makeFieldPhoto({ width: 1200, height: 900, orientation: 1 }));
      paths.push(path);
    }
  });

  afterAll(async () => {
    await browser.close();
    files.remove();
  });

  async function openJobAsTech(context: BrowserContext): Promise<Page> {
    const page = await context.newPage();
    await page.goto(`${baseUrl}/jobs/${jobId}`);
    await signIn(page, company.users.tech.email);
    await page.waitForURL(`**/jobs/${jobId}`);
    return page;
  }

  it('should upload three photos to a run, survive a dropped connection mid-way, and attach each once', async () => {
    const context = await browser.newContext({ viewport: PHONE, hasTouch: true, isMobile: true });
    const page = await openJobAsTech(context);
    const errors: string[] = [];
    page.on('pageerror', (error) => errors.push(error.message));

    // The second upload reaches the server, but its answer is lost as the signal drops; the phone then
    // stays offline for a while.
    let posts = 0;
    let dropped!: () => void;
    const hasDropped = new Promise<void>((resolve) => (dropped = resolve));
    await page.route('**/api/jobs/*/photos', async (route) => {
      if (!isPhotoPost(route)) return route.continue();
      posts += 1;
      if (posts !== 2) return route.continue();
      await route.fetch();
      await context.setOffline(true);
      await route.abort('internetdisconnected');
      dropped();
    });

    // Web fonts load on first use; a screenshot waits for them, which offline would be forever.
    await page.evaluate(() => Promise.all([...document.fonts].map((face) => face.load().catch(() => undefined))));
    const run = page.getByRole('listitem', { name: 'Run Patio trunk' });
    await run.getByRole('button', { name: 'Add photos' }).click();
    const dialog = page.getByRole('dialog', { name: 'Add photos' });
    await expect.poll(() => dialog.getByLabel('The photos show').inputValue()).toBe(`run:${runId}`);
    await dialog.getByLabel('Choose photos from the library').setInputFiles(paths.slice(0, 3));
    await dialog.waitFor({ state: 'detached' });

    const uploads = run.getByRole('list', { name: 'Uploads to Run Patio trunk' });
    await hasDropped;
    const second = uploads.getByRole('listitem', { name: 'wall-entry.jpg' });
    await expect.poll(() => second.getAttribute('data-upload-state'), { timeout: 15_000 }).toBe('retrying');
    await second.getByText(/No connection: it is sent when the connection returns|Retrying in \d+ s/).waitFor();
    await expect.poll(() => uploads.getByRole('listitem', { name: 'amp-rack.jpg' }).getAttribute('data-upload-state')).toMatch(/waiting|retrying/);
    await shot(page, 'phone-run-queue-offline');

    // The connection returns: the lost one is answered with the photo already stored, the third goes.
    await context.setOffline(false);
    const gallery = run.getByRole('list', { name: 'Photos of Run Patio trunk' });
    await expect.poll(() => gallery.getByRole('listitem').count(), { timeout: 30_000 }).toBe(3);
    await expect.poll(() => uploads.count()).toBe(0);

    const listed = await office.expectOk('get', `/api/jobs/${jobId}/photos`);
    expect(listed.items).toHaveLength(3);
    expect(listed.items.map((photo: { target: unknown }) => photo.target)).toEqual(Array(3).fill({ type: 'run', id: runId }));
    expect(listed.items.map((photo: { original: { name: string } }) => photo.original.name).sort()).toEqual(['amp-rack.jpg', 'trench-tape.jpg', 'wall-entry.jpg']);
    expect(new Set(listed.items.map((photo: { original: { sha256: string } }) => photo.original.sha256)).size).toBe(3);
    await shot(page, 'phone-run-gallery');

    // The viewer: full screen, arrow keys, Escape closes.
    await gallery.getByRole('button', { name: /^Open photo/ }).first().click();
    const viewer = page.getByRole('dialog', { name: 'Photo viewer' });
    await viewer.getByRole('heading', { name: 'Photo 1 of 3' }).waitFor();
    await viewer.getByRole('img').first().waitFor();
    await viewer.getByText('Shows: Run Patio trunk').waitFor();
    await page.keyboard.press('ArrowRight');
    await viewer.getByRole('heading', { name: 'Photo 2 of 3' }).waitFor();
    if (SHOTS_DIR) await page.waitForTimeout(500); // Let the dialog finish fading in.
    await shot(page, 'phone-viewer');
    await page.keyboard.press('Escape');
    await viewer.waitFor({ state: 'detached' });

    await page.unrouteAll({ behavior: 'ignoreErrors' });
    expect(errors).toEqual([]);
    await context.close();
  });

  it('should resume a queued photo after a reload', async () => {
    const context = await browser.newContext({ viewport: PHONE, hasTouch: true, isMobile: true });
    const page = await openJobAsTech(context);
    // No upload gets through until the route is lifted, across the reload too.
    await page.route('**/api/jobs/*/photos', (route) => (isPhotoPost(route) ? route.abort('internetdisconnected') : route.continue()));

    await page.getByRole('tab', { name: 'Photos' }).click();
    await page.getByRole('button', { name: 'Add photos' }).click();
    const dialog = page.getByRole('dialog', { name: 'Add photos' });
    await dialog.getByLabel('Caption (optional, for every photo picked now)').fill('Wall entry before sealing');
    await dialog.getByLabel('Choose photos from the library').setInputFiles(paths[3]!);
    await dialog.waitFor({ state: 'detached' });
    const row = page.getByRole('list', { name: 'Uploads' }).getByRole('listitem', { name: 'late-shot.jpg' });
    await expect.poll(() => row.getAttribute('data-upload-state'), { timeout: 15_000 }).toBe('retrying');

    await page.reload();
    await page.getByRole('heading', { name: /^Photos \(\d+\)/ }).waitFor();
    // Back from IndexedDB and tried again at once (still no connection); between attempts no request
    // is in flight, so lifting the route now cannot strand one.
    await expect.poll(() => row.getAttribute('data-upload-state'), { timeout: 15_000 }).toBe('retrying');
    await page.unrouteAll({ behavior: 'wait' });
    await row.getByRole('button', { name: 'Try late-shot.jpg again now' }).click();

    const jobGallery = page.getByRole('list', { name: 'Photos of The job as a whole' });
    await expect.poll(() => jobGallery.getByRole('listitem').count(), { timeout: 60_000 }).toBe(1);
    const listed = await office.expectOk('get', `/api/jobs/${jobId}/photos`);
    const late = listed.items.filter((photo: { original: { name: string } }) => photo.original.name === 'late-shot.jpg');
    expect(late).toHaveLength(1);
    expect(late[0]).toMatchObject({ caption: 'Wall entry before sealing', target: { type: 'job' } });
    await shot(page, 'phone-photos-section');

    // Deleted by mistake, and brought back with Undo.
    await jobGallery.getByRole('button', { name: 'Open photo: Wall entry before sealing' }).click();
    const viewer = page.getByRole('dialog', { name: 'Photo viewer' });
    await viewer.getByRole('button', { name: 'Delete' }).click();
    await viewer.waitFor({ state: 'detached' });
    await expect.poll(() => jobGallery.count()).toBe(0);
    await page.getByRole('button', { name: 'Undo' }).click();
    await expect.poll(() => jobGallery.getByRole('listitem').count(), { timeout: 15_000 }).toBe(1);
    await context.close();
  }, 120_000);

  it.runIf(SHOTS_DIR)('should look finished on a desk screen (screenshots only)', async () => {
    const context = await browser.newContext({ viewport: DESK });
    const page = await context.newPage();
    await page.goto(`${baseUrl}/jobs/${jobId}?section=photos`);
    await signIn(page, company.users.lead.email);
    await page.getByRole('heading', { name: /^Photos \(4\)/ }).waitFor();
    // Hold one upload in the queue so the progress list shows.
    await page.route('**/api/jobs/*/photos', (route) => (isPhotoPost(route) ? route.abort('internetdisconnected') : route.continue()));
    await page.getByRole('button', { name: 'Add photos' }).click();
    await page.getByRole('dialog', { name: 'Add photos' }).getByLabel('Choose photos from the library').setInputFiles(paths[0]!);
    await page.getByRole('list', { name: 'Uploads' }).getByRole('listitem').first().waitFor();
    await page.waitForTimeout(1500);
    await shot(page, 'desk-photos-section-queue');
    await page.getByRole('button', { name: 'Discard trench-tape.jpg' }).click();
    await page.getByRole('button', { name: /^Open photo/ }).first().click();
    await page.getByRole('dialog', { name: 'Photo viewer' }).getByRole('img').first().waitFor();
    await page.waitForTimeout(500);
    await shot(page, 'desk-viewer');
    await page.getByRole('button', { name: 'Change caption or target' }).click();
    await shot(page, 'desk-viewer-edit');
    await context.close();
  });
});
