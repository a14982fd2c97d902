import { existsSync, mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';

import pixelmatch from 'pixelmatch';
import type { Browser, Locator, Page } from 'playwright-core';
import { PNG } from 'pngjs';
import sharp from 'sharp';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';

import { DEMO_AS_BUILT } from '../../api/src/domain/as-built/demo-as-built.js';
import { launchChromium } from '../support/browser.js';
import { createCompany, TEST_PASSWORD, type TestCompany } from '../support/fixtures.js';
import { httpApiAs } from '../support/http-api.js';
import { insertRecordedJob } from '../support/records.js';

/**
 * Visual regression of the Drawings view: the demo job's site plan (over a calibrated plan image) and
 * wiring schematic, drawn in the browser by the shared drawing code, against committed reference PNGs.
 * `UPDATE_VISUAL=1` (re)writes the references; otherwise a missing one fails the test.
 */
const SCREENSHOTS = fileURLToPath(new URL('./__screenshots__/', import.meta.url));
const DIFFS = fileURLToPath(new URL('../../.data/visual-diffs/', import.meta.url));
const VIEWPORT = { width: 1280, height: 900 };
/** pixelmatch's per-pixel colour threshold (0–1) and the share of pixels allowed to differ. */
const PIXEL_THRESHOLD = 0.1;
const MAX_DIFF_RATIO = 0.005;
const isUpdating = process.env.UPDATE_VISUAL === '1';

/** A light grid with a darker "house" rectangle: a stand-in scan of a site plan, made at run time. */
async function makePlanImage(): Promise<Buffer> {
  const lines = Array.from({ length: 31 }, (_, i) => i * 100);
  const svg = `<svg xmlns="http://www.w3.org/2000/svg" width="3000" height="2000">
    <rect width="3000" height="2000" fill="#f4f1e8"/>
    ${lines.map((x) => `<line x1="${x}" y1="0" x2="${x}" y2="2000" stroke="#b9c7b0" stroke-width="3"/>`).join('')}
    ${lines.slice(0, 21).map((y) => `<line x1="0" y1="${y}" x2="3000" y2="${y}" stroke="#b9c7b0" stroke-width="3"/>`).join('')}
    <rect x="100" y="1900" width="1400" height="90" fill="#8a8f96"/>
    <rect x="1700" y="300" width="500" height="400" rx="60" fill="#9fc6de"/>
  </svg>`;
  return sharp(Buffer.from(svg)).png().toBuffer();
}

async function signIn(page: Page, email: string): Promise<void> {
  await page.getByRole('heading', { name: 'Sign in' }).waitFor();
  await page.getByLabel(/^E-mail/).fill(email);
  await page.getByLabel(/^Password/).fill(TEST_PASSWORD);
  await page.getByRole('button', { name: 'Sign in' }).click();
}

/** Compares a screenshot with its reference; writes the diff (and the actual image) on failure. */
function compareWithReference(name: string, actual: Buffer): void {
  const referencePath = join(SCREENSHOTS, `${name}.png`);
  if (isUpdating) {
    mkdirSync(SCREENSHOTS, { recursive: true });
    writeFileSync(referencePath, actual);
    return;
  }
  expect(
    existsSync(referencePath),
    `no reference image test/e2e/__screenshots__/${name}.png: run the e2e test once with UPDATE_VISUAL=1 to create it, look at it, and commit it`,
  ).toBe(true);
  const expected = PNG.sync.read(readFileSync(referencePath));
  const got = PNG.sync.read(actual);
  mkdirSync(DIFFS, { recursive: true });
  const actualPath = join(DIFFS, `${name}-actual.png`);
  if (expected.width !== got.width || expected.height !== got.height) {
    writeFileSync(actualPath, actual);
    expect.fail(
      `${name}: the screenshot is ${got.width}×${got.height} px, the reference ${expected.width}×${expected.height} px ` +
        `(actual written to .data/visual-diffs/${name}-actual.png; UPDATE_VISUAL=1 rewrites the reference if the change is intended)`,
    );
  }
  const diff = new PNG({ width: got.width, height: got.height });
  const differing = pixelmatch(expected.data, got.data, diff.data, got.width, got.height, { threshold: PIXEL_THRESHOLD });
  const ratio = differing / (got.width * got.height);
  if (ratio > MAX_DIFF_RATIO) {
    writeFileSync(join(DIFFS, `${name}-diff.png`), PNG.sync.write(diff));
    writeFileSync(actualPath, actual);
  }
  expect(
    ratio,
    `${name}: ${differing} pixels (${(ratio * 100).toFixed(2)} %) differ from the reference, more than ${MAX_DIFF_RATIO * 100} %; ` +
      `see .data/visual-diffs/${name}-diff.png and ${name}-actual.png (UPDATE_VISUAL=1 rewrites the reference if the change is intended)`,
  ).toBeLessThanOrEqual(MAX_DIFF_RATIO);
}

async function screenshot(locator: Locator): Promise<Buffer> {
  await locator.scrollIntoViewIfNeeded();
  return locator.screenshot({ animations: 'disabled', caret: 'hide' });
}

describe('drawings view (visual regression)', () => {
  const baseUrl = inject('baseUrl');
  let browser: Browser;
  let company: TestCompany;
  let jobId: string;

  beforeAll(async () => {
    browser = await launchChromium();
    company = await createCompany('Drawings Visual');
    const office = await httpApiAs(baseUrl, company.users.office);
    // Fixed texts: the title block prints them, so they must not change from run to run.
    const customer = await office.expectOk('post', '/api/customers', { name: 'Visual Customer' });
    const site = await office.expectOk('post', '/api/sites', {
      customerId: customer.id,
      label: 'Visual test yard',
      addressLine1: '1 Invented Row',
      city: 'Nowhereton',
      country: 'Testland',
      northAzimuthDeg: DEMO_AS_BUILT.site?.northAzimuthDeg ?? 0,
    });
    const job = await insertRecordedJob(company, site.id, { crewLeadUserId: company.users.lead.id, technicianUserIds: [] }, DEMO_AS_BUILT);
    jobId = job.id;

    // The plan image and its calibration: 2800 px between the points are 28 m, point A at the plan origin.
    const { accessToken } = (await (
      await fetch(`${baseUrl}/api/auth/sign-in`, {
        method: 'POST',
        headers: { 'Content-Type': 'application/json' },
        body: JSON.stringify({ email: company.users.office.email, password: TEST_PASSWORD }),
      })
    ).json()) as { accessToken: string };
    const form = new FormData();
    form.append('file', new Blob([new Uint8Array(await makePlanImage())], { type: 'image/png' }), 'plan.png');
    // Site writes name the site's version (If-Match): the upload builds on the site as created (1).
    const upload = await fetch(`${baseUrl}/api/sites/${site.id}/plan-image`, {
      method: 'PUT',
      headers: { Authorization: `Bearer ${accessToken}`, 'If-Match': '"1"' },
      body: form,
    });
    expect(upload.status, await upload.clone().text()).toBe(200);
    const { siteVersion } = (await upload.json()) as { siteVersion: number };
    await office.expectOk(
      'patch',
      `/api/sites/${site.id}`,
      { planCalibration: { a: { x: 100, y: 1900 }, b: { x: 2900, y: 1900 }, distanceM: 28 } },
      { 'If-Match': `"${siteVersion}"` },
    );
  });

  afterAll(async () => {
    await browser?.close();
  });

  it('should draw the site plan and the schematic as in the reference images', async () => {
    const context = await browser.newContext({ viewport: VIEWPORT, deviceScaleFactor: 1, reducedMotion: 'reduce', locale: 'en-US', timezoneId: 'UTC' });
    // Metric lengths whatever the browser's language; the drawings label in the user's units.
    await context.addInitScript(() => localStorage.setItem('loamline.units', JSON.stringify({ length: 'metric', gauge: 'mm2' })));
    const page = await context.newPage();
    const errors: string[] = [];
    page.on('pageerror', (error) => errors.push(error.message));

    await page.goto(`${baseUrl}/jobs/${jobId}/drawings`);
    await signIn(page, company.users.lead.email);
    await page.waitForURL(`**/jobs/${jobId}/drawings`);
    const plan = page.getByRole('img', { name: 'Site plan', exact: true });
    const schematic = page.getByRole('img', { name: 'Wiring schematic', exact: true });
    await plan.waitFor();
    await schematic.waitFor();
    expect(await plan.locator('image').count(), 'the calibrated plan image is drawn underneath').toBe(1);
    // No animation, and the app's sticky header hidden: a drawing taller than the window is captured in
    // parts, and the header would otherwise be painted over it.
    await page.addStyleTag({
      content: '*, *::before, *::after { animation: none !important; transition: none !important; } header { visibility: hidden !important; }',
    });
    await page.evaluate(() => document.fonts.ready.then(() => undefined));
    // The drawings use Inter, served by the app itself (fonts/): no system-font fallback.
    const interFaces = await page.evaluate(() => [...document.fonts].filter((f) => f.family.replace(/["']/g, '') === 'Inter' && f.status === 'loaded').length);
    expect(interFaces, 'Inter is loaded from the app').toBeGreaterThan(0);

    compareWithReference('drawings-site-plan', await screenshot(plan));
    compareWithReference('drawings-schematic', await screenshot(schematic));
    expect(errors).toEqual([]);
    await context.close();
  });
});
