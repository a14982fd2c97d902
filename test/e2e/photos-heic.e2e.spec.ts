import { fileURLToPath } from 'node:url';

import exifr from 'exifr';
import type { Browser } from 'playwright-core';
import sharp from 'sharp';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';

import { makeHeicHeader } from '../fixtures/photos/make-photos.js';
import { launchChromium } from '../support/browser.js';
import { createCompany, TEST_PASSWORD, type TestCompany } from '../support/fixtures.js';
import { httpApiAs } from '../support/http-api.js';
import { type Api, createJob, createSite, moveJob } from '../support/records.js';

/**
 * A real HEIC from a phone set to high efficiency (test/fixtures/photos/README.md): 640×480, a red block
 * in the top-left corner on green, EXIF taken 2024:05:01 10:11:12 at 40.0003 N 105.0004 W.
 */
const HEIC_PATH = fileURLToPath(new URL('../fixtures/photos/field-photo.heic', import.meta.url));
/** Set PHOTOS_SHOTS=<folder> to save a screenshot of the refusal there. */
const SHOTS_DIR = process.env.PHOTOS_SHOTS;

describe('a technician adds a HEIC photo from a phone', () => {
  const baseUrl = inject('baseUrl');
  let browser: Browser;
  let company: TestCompany;
  let office: Api;
  let jobId: string;

  beforeAll(async () => {
    browser = await launchChromium();
    company = await createCompany('HEIC Photos');
    office = (await httpApiAs(baseUrl, company.users.office)) as unknown as Api;
    const { siteId } = await createSite(office);
    const created = await createJob(office, siteId, { crewLeadUserId: company.users.lead.id, technicianUserIds: [company.users.tech.id] });
    await moveJob(office, created, 'in_progress');
    jobId = created.id;
  });

  afterAll(async () => {
    await browser?.close();
  });

  it('should convert it to JPEG in the browser and store a JPEG with the capture time and position', async () => {
    const context = await browser.newContext({ viewport: { width: 390, height: 844 }, hasTouch: true, isMobile: true });
    const page = await context.newPage();
    const problems: string[] = [];
    page.on('pageerror', (error) => problems.push(error.message));
    // A refused worker or WebAssembly compile (Content-Security-Policy) shows as a console error.
    page.on('console', (message) => {
      if (message.type() === 'error' && /Content Security Policy|WebAssembly|worker/i.test(message.text())) problems.push(message.text());
    });
    const posted: string[] = [];
    page.on('request', (request) => {
      if (request.method() === 'POST' && request.url().endsWith(`/api/jobs/${jobId}/photos`)) posted.push(request.headers()['content-type'] ?? '');
    });

    await page.goto(`${baseUrl}/jobs/${jobId}?section=photos`);
    await page.getByRole('heading', { name: 'Sign in' }).waitFor();
    await page.getByLabel(/^E-mail/).fill(company.users.tech.email);
    await page.getByLabel(/^Password/).fill(TEST_PASSWORD);
    await page.getByRole('button', { name: 'Sign in' }).click();
    await page.getByRole('heading', { name: /^Photos \(0\)/ }).waitFor();

    await page.getByRole('button', { name: 'Add photos' }).click();
    const dialog = page.getByRole('dialog', { name: 'Add photos' });
    await dialog.getByLabel('Choose photos from the library').setInputFiles(HEIC_PATH);
    await dialog.waitFor({ state: 'detached', timeout: 30_000 });

    const gallery = page.getByRole('list', { name: 'Photos of The job as a whole' });
    await expect.poll(() => gallery.getByRole('listitem').count(), { timeout: 60_000 }).toBe(1);
    expect(posted).toHaveLength(1);

    const listed = await office.expectOk('get', `/api/jobs/${jobId}/photos`);
    expect(listed.items).toHaveLength(1);
    const photo = listed.items[0];
    expect(photo).toMatchObject({
      width: 640,
      height: 480,
      exifTakenAt: '2024-05-01T10:11:12',
      takenAt: '2024-05-01T10:11:12',
      original: { contentType: 'image/jpeg', name: 'field-photo.jpg' },
    });
    expect(photo.exifLocation.lat).toBeCloseTo(40.0003, 6);
    expect(photo.exifLocation.lon).toBeCloseTo(-105.0004, 6);

    // The stored original is the browser's JPEG: its own EXIF holds the time and position, and its
    // pixels are the photo's (the red block still at the top left, green elsewhere).
    const signIn = await fetch(`${baseUrl}/api/auth/sign-in`, {
      method: 'POST',
      headers: { 'Content-Type': 'application/json' },
      body: JSON.stringify({ email: company.users.office.email, password: TEST_PASSWORD }),
    });
    const { accessToken } = (await signIn.json()) as { accessToken: string };
    const res = await fetch(`${baseUrl}${photo.original.url}`, { headers: { Authorization: `Bearer ${accessToken}` } });
    expect(res.status).toBe(200);
    const original = Buffer.from(await res.arrayBuffer());
    expect([...original.subarray(0, 3)]).toEqual([0xff, 0xd8, 0xff]);
    const exif = (await exifr.parse(original, { reviveValues: false })) as Record<string, unknown>;
    expect(exif.DateTimeOriginal).toBe('2024:05:01 10:11:12');
    expect(exif.GPSLatitudeRef).toBe('N');
    expect(exif.GPSLongitudeRef).toBe('W');
    const { data, info } = await sharp(original).raw().toBuffer({ resolveWithObject: true });
    const pixel = (x: number, y: number) => [...data.subarray((y * info.width + x) * info.channels, (y * info.width + x) * info.channels + 3)];
    const [r1, g1, b1] = pixel(20, 20);
    expect(r1).toBeGreaterThan(200);
    expect(g1).toBeLessThan(60);
    expect(b1).toBeLessThan(60);
    const [r2, g2, b2] = pixel(400, 300);
    expect(Math.abs(r2! - 70)).toBeLessThan(20);
    expect(Math.abs(g2! - 120)).toBeLessThan(20);
    expect(Math.abs(b2! - 60)).toBeLessThan(20);

    expect(problems).toEqual([]);
    await context.close();
  }, 120_000);

  it('should say plainly when a HEIC cannot be converted, send nothing for it, and stay open', async () => {
    const context = await browser.newContext({ viewport: { width: 390, height: 844 }, hasTouch: true, isMobile: true });
    const page = await context.newPage();
    let posts = 0;
    page.on('request', (request) => {
      if (request.method() === 'POST' && request.url().endsWith(`/api/jobs/${jobId}/photos`)) posts += 1;
    });
    await page.goto(`${baseUrl}/jobs/${jobId}?section=photos`);
    await page.getByRole('heading', { name: 'Sign in' }).waitFor();
    await page.getByLabel(/^E-mail/).fill(company.users.lead.email);
    await page.getByLabel(/^Password/).fill(TEST_PASSWORD);
    await page.getByRole('button', { name: 'Sign in' }).click();
    await page.getByRole('heading', { name: /^Photos \(1\)/ }).waitFor();

    await page.getByRole('button', { name: 'Add photos' }).click();
    const dialog = page.getByRole('dialog', { name: 'Add photos' });
    // A HEIC file's header with nothing behind it, as a photo cut off in a transfer.
    await dialog.getByLabel('Choose photos from the library').setInputFiles({ name: 'IMG_0007.HEIC', mimeType: 'image/heic', buffer: makeHeicHeader() });
    await dialog.getByText(/^IMG_0007\.HEIC is a HEIC photo that this browser could not turn into a JPEG\./).waitFor({ timeout: 30_000 });
    if (SHOTS_DIR) await page.screenshot({ path: `${SHOTS_DIR}/phone-heic-not-converted.png` });
    await dialog.getByRole('button', { name: 'Close' }).click();
    await dialog.waitFor({ state: 'detached' });
    expect(posts).toBe(0);
    await context.close();
  }, 60_000);
});
