import { mkdirSync } from 'node:fs';
import { join } from 'node:path';

import type { Browser, Page } from 'playwright-core';
import { PNG } from 'pngjs';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';

import type { AsBuilt } from '../../api/src/domain/as-built/as-built.schema.js';
import { DEMO_AS_BUILT } from '../../api/src/domain/as-built/demo-as-built.js';
import { launchChromium } from '../support/browser.js';
import { createCompany, TEST_PASSWORD, type TestCompany } from '../support/fixtures.js';
import { httpApiAs } from '../support/http-api.js';
import { type Api, createJob, createSite, recordAsBuilt } from '../support/records.js';

const PHONE = { width: 390, height: 844 };
const DESK = { width: 1280, height: 800 };
/** Set PLAN_SHOTS=<folder> to save screenshots of the plan editor there. */
const SHOTS_DIR = process.env.PLAN_SHOTS;

/** The plan image: 800 × 600 px, two calibration marks 600 px apart on one row. */
const IMAGE = { width: 800, height: 600 };
const MARK_A = { x: 100, y: 500 };
const MARK_B = { x: 700, y: 500 };
/** The real distance between the marks, metres: 15 m over 600 px is 0.025 m per pixel. */
const MARK_DISTANCE_M = 15;

/** An amplifier placed by hand west of the house corner, a satellite still to place, and the run between them. */
const RECORD: AsBuilt = {
  zones: [],
  referencePoints: [],
  items: [
    {
      id: 'amp',
      kind: 'amplifier',
      label: 'Garage amp',
      channels: [{ id: 'ch1', name: 'Patio' }],
      ratedWatts8Ohm: 60,
      minimumImpedanceOhm: 4,
      position: { x: -2, y: 3, source: 'manual' },
    },
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
      measuredLengthM: 14,
      method: 'direct_burial',
      location: 'general',
    },
  ],
  checks: [],
};

/** A drawn site plan (our own, generated): beige ground, a grey house block and two red crosses as calibration marks. */
function makePlanImage(): Buffer {
  const png = new PNG({ width: IMAGE.width, height: IMAGE.height });
  const paint = (x: number, y: number, [r, g, b]: [number, number, number]) => {
    if (x < 0 || y < 0 || x >= IMAGE.width || y >= IMAGE.height) return;
    const i = (y * IMAGE.width + x) * 4;
    png.data[i] = r;
    png.data[i + 1] = g;
    png.data[i + 2] = b;
    png.data[i + 3] = 255;
  };
  for (let y = 0; y < IMAGE.height; y += 1) {
    for (let x = 0; x < IMAGE.width; x += 1) {
      const isGrid = x % 50 === 0 || y % 50 === 0;
      const isHouse = x >= 100 && x <= 380 && y >= 500 && y <= 590;
      paint(x, y, isHouse ? [170, 170, 175] : isGrid ? [215, 208, 190] : [238, 233, 218]);
    }
  }
  for (const mark of [MARK_A, MARK_B]) {
    for (let d = -14; d <= 14; d += 1) {
      for (let w = -1; w <= 1; w += 1) {
        paint(mark.x + d, mark.y + w, [200, 30, 30]);
        paint(mark.x + w, mark.y + d, [200, 30, 30]);
      }
    }
  }
  return PNG.sync.write(png);
}

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

/** Brings the plan to the middle of the screen and gives the screen position of plan point `p`, through the zoom the canvas reports. */
async function screenOf(page: Page, p: { x: number; y: number }): Promise<{ x: number; y: number }> {
  return page.evaluate(({ x, y }) => {
    const svg = document.querySelector('svg[role="application"]')!;
    svg.scrollIntoView({ block: 'center' });
    const rect = svg.getBoundingClientRect();
    const [k, tx, ty] = (svg.getAttribute('data-transform') ?? '1 0 0').split(' ').map(Number) as [number, number, number];
    return { x: rect.left + tx + k * x, y: rect.top + ty - k * y };
  }, p);
}

/** A finger tap on the plan at plan point `p`. */
async function tapPlan(page: Page, p: { x: number; y: number }): Promise<void> {
  const at = await screenOf(page, p);
  await page.touchscreen.tap(at.x, at.y);
}

async function chooseTool(page: Page, name: string): Promise<void> {
  // Chosen until it shows as chosen: a tap while the editor re-renders from a refetch can be lost.
  const radio = page.getByRole('toolbar', { name: 'Plan tools' }).getByRole('radio', { name });
  await expect
    .poll(async () => {
      if (!(await radio.isChecked())) await radio.click();
      return radio.isChecked();
    })
    .toBe(true);
}

async function waitForToast(page: Page, title: string): Promise<void> {
  await page.getByText(title, { exact: true }).first().waitFor();
}

describe('a crew lead maps a run on the plan with a phone', () => {
  const baseUrl = inject('baseUrl');
  let browser: Browser;
  let company: TestCompany;
  let jobId: string;
  let siteId: string;
  let ids: Map<string, string>;

  beforeAll(async () => {
    browser = await launchChromium();
    company = await createCompany('Plan Editor Flow');
    const office = (await httpApiAs(baseUrl, company.users.office)) as unknown as Api;
    const site = await createSite(office);
    siteId = site.siteId;
    const job = await createJob(office, siteId, { crewLeadUserId: company.users.lead.id });
    ids = (await recordAsBuilt(office, job, RECORD)).ids;
    jobId = job.id;
  });

  afterAll(async () => {
    await browser.close();
  });

  it('should upload and calibrate a plan image, place a speaker by ties and draw its run into the site plan', async () => {
    // Distances are typed with their unit, so they read the same whatever units the company shows.
    const context = await browser.newContext({ viewport: PHONE, hasTouch: true, isMobile: true, locale: 'en-GB' });
    const page = await context.newPage();
    const errors: string[] = [];
    page.on('pageerror', (error) => errors.push(error.message));

    // The lead follows the workspace's link to the plan.
    await page.goto(`${baseUrl}/jobs/${jobId}`);
    await signIn(page, company.users.lead.email);
    await page.getByRole('link', { name: 'Open the plan' }).click();
    await page.waitForURL(`**/jobs/${jobId}/plan`);
    await page.getByRole('application', { name: /^Plan of / }).waitFor();

    // Upload the plan image.
    await chooseTool(page, 'Plan image and scale');
    await page.getByTestId('plan-image-input').setInputFiles({ name: 'site-plan.png', mimeType: 'image/png', buffer: makePlanImage() });
    await waitForToast(page, 'Plan image uploaded');
    await page.getByTestId('plan-image').waitFor();

    // The lead sets its scale on the spot: two taps on the marks and the distance taped between them.
    await expect.poll(() => page.getByTestId('plan-hint').textContent()).toMatch(/Tap point A on the image/);

    // Not yet to scale, the image is shown 40 m wide with its top-left corner at the plan origin, so
    // image pixel (u, v) is at plan (u·0.05, −v·0.05). Tap both marks, then give the distance.
    const provisional = (p: { x: number; y: number }) => ({ x: p.x * (40 / IMAGE.width), y: -p.y * (40 / IMAGE.width) });
    await tapPlan(page, provisional(MARK_A));
    await expect.poll(() => page.getByTestId('plan-hint').textContent()).toMatch(/Now tap point B/);
    await tapPlan(page, provisional(MARK_B));
    await page.getByRole('textbox', { name: /Real distance from A to B/ }).fill(`${MARK_DISTANCE_M} m`);
    await shot(page, 'phone-calibrate');
    await page.getByRole('button', { name: 'Save scale' }).click();
    await waitForToast(page, 'Scale saved');

    const siteAfter = await (await httpApiAs(baseUrl, company.users.lead)).expectOk('get', `/api/sites/${siteId}`);
    expect(siteAfter.planCalibration.distanceM).toBeCloseTo(MARK_DISTANCE_M, 9);
    // A tap is good to about a screen pixel: a few image pixels at this zoom.
    expect(Math.abs(siteAfter.planCalibration.a.x - MARK_A.x)).toBeLessThan(4);
    expect(Math.abs(siteAfter.planCalibration.b.x - MARK_B.x)).toBeLessThan(4);
    expect(Math.abs(siteAfter.planCalibration.a.y - MARK_A.y)).toBeLessThan(4);

    // After a reload the image is to scale: mark A is the plan origin and mark B 15 m east of
    // it. Tap two reference points there.
    await page.reload();
    await page.getByRole('application', { name: /^Plan of / }).waitFor();
    await page.getByTestId('plan-image').waitFor();
    await chooseTool(page, 'Add a reference point');
    for (const [label, p] of [
      ['House corner', { x: 0, y: 0 }],
      ['Gate post', { x: MARK_DISTANCE_M, y: 0 }],
    ] as const) {
      await tapPlan(page, p);
      const dialog = page.getByRole('dialog');
      await dialog.getByRole('textbox', { name: /^Name/ }).fill(label);
      await dialog.getByRole('button', { name: 'Add point' }).click();
      await dialog.waitFor({ state: 'detached' });
      await page.locator('[data-hit="reference"]').nth(label === 'House corner' ? 0 : 1).waitFor();
    }

    // Place the satellite by ties: tap each reference point, type the taped distance, choose the side.
    // 9 m from the corner and 12 m from the post, which are 15 m apart: a 3-4-5 triangle, so the
    // satellite is at (5.4, 7.2), left of the line from the corner to the post.
    await chooseTool(page, 'Place by ties');
    await page.getByRole('combobox', { name: 'Item to place' }).selectOption({ label: 'Patio satellite (speaker)' });
    const references = await page.evaluate(() =>
      [...document.querySelectorAll('[data-hit="reference"]')].map((element) => element.getAttribute('data-id')!),
    );
    const site = await (await httpApiAs(baseUrl, company.users.lead)).expectOk('get', `/api/sites/${siteId}`);
    const pointOf = (id: string) => site.referencePoints.find((p: { id: string }) => p.id === id) as { x: number; y: number; label: string };
    const corner = references.map(pointOf).find((p) => p.label === 'House corner')!;
    const post = references.map(pointOf).find((p) => p.label === 'Gate post')!;
    await tapPlan(page, corner);
    await tapPlan(page, post);
    await expect.poll(() => page.getByRole('combobox', { name: 'Tie 2 from' }).inputValue()).not.toBe('');
    const distances = page.getByRole('textbox', { name: 'Distance' });
    await distances.nth(0).fill('9 m');
    await distances.nth(1).fill('12 m');
    await page.getByRole('radio', { name: 'Left' }).click();
    const solved = page.locator('[aria-live="polite"]').filter({ hasText: /Placed at|Cannot place/ });
    await expect.poll(() => solved.textContent()).toMatch(/^Placed at x .+, y .+, good to about ±/);
    await page.getByTestId('accuracy-circle').waitFor();
    await shot(page, 'phone-ties');
    await page.getByRole('button', { name: 'Save position' }).click();
    await waitForToast(page, 'Position saved');
    const speakerId = ids.get('sat')!;
    await page.locator(`[data-hit="item"][data-id="${speakerId}"]`).waitFor();

    // Draw the run: from the amplifier (the tap snaps onto it), one bend, to the satellite.
    await chooseTool(page, 'Draw a run route');
    await page.getByRole('combobox', { name: 'Run' }).selectOption({ label: 'Patio trunk (no route yet)' });
    const lead = await httpApiAs(baseUrl, company.users.lead);
    const before = await lead.expectOk('get', `/api/jobs/${jobId}/as-built`);
    const speakerAt = before.analysis.positions.find((p: { itemId: string }) => p.itemId === speakerId) as { x: number; y: number };
    const bend = { x: 1.5, y: 8 };
    await tapPlan(page, { x: -2 + 0.05, y: 3 - 0.05 });
    await tapPlan(page, bend);
    await tapPlan(page, { x: 2, y: 0 });
    await expect.poll(() => page.getByTestId('draft-route').getAttribute('data-points')).toBe('3');
    // A wrong tap: undo it, then finish on the satellite.
    await page.getByRole('button', { name: 'Undo last point' }).click();
    await expect.poll(() => page.getByTestId('draft-route').getAttribute('data-points')).toBe('2');
    await tapPlan(page, speakerAt);
    await expect.poll(() => page.getByTestId('draft-route').getAttribute('data-points')).toBe('3');
    await shot(page, 'phone-route');
    await page.getByRole('button', { name: 'Finish route' }).click();
    await waitForToast(page, 'Route saved');

    // The saved route: snapped onto both ends, the bend where it was tapped.
    const after = await lead.expectOk('get', `/api/jobs/${jobId}/as-built`);
    const runId = ids.get('run')!;
    const route = after.asBuilt.runs.find((run: { id: string }) => run.id === runId).route as { x: number; y: number }[];
    expect(route).toHaveLength(3);
    expect(route[0]!.x).toBeCloseTo(-2, 3);
    expect(route[0]!.y).toBeCloseTo(3, 3);
    expect(Math.hypot(route[1]!.x - bend.x, route[1]!.y - bend.y)).toBeLessThan(0.2);
    expect(route[2]!.x).toBeCloseTo(speakerAt.x, 3);
    expect(route[2]!.y).toBeCloseTo(speakerAt.y, 3);

    // The server's site plan draws that route: the same points, scaled into paper points with y down.
    const token = (await (
      await fetch(`${baseUrl}/api/auth/sign-in`, {
        method: 'POST',
        headers: { 'Content-Type': 'application/json' },
        body: JSON.stringify({ email: company.users.lead.email, password: TEST_PASSWORD }),
      })
    ).json()) as { accessToken: string };
    const svgResponse = await fetch(`${baseUrl}/api/jobs/${jobId}/drawings/site-plan.svg`, { headers: { Authorization: `Bearer ${token.accessToken}` } });
    expect(svgResponse.status).toBe(200);
    const svg = await svgResponse.text();
    const group = new RegExp(`<g[^>]*data-id="${runId}"[^>]*>([\\s\\S]*?)</g>`).exec(svg);
    expect(group?.[0]).toContain('data-route="recorded"');
    const points = /points="([^"]+)"/
      .exec(group![1]!)![1]!
      .trim()
      .split(/\s+/)
      .map((pair) => pair.split(',').map(Number) as [number, number]);
    expect(points).toHaveLength(route.length);
    // paper = c + k·(x, −y): k from the first and last points, then every point must fit.
    const [p0, pn] = [points[0]!, points[points.length - 1]!];
    const k = Math.hypot(pn[0] - p0[0], pn[1] - p0[1]) / Math.hypot(route[2]!.x - route[0]!.x, route[2]!.y - route[0]!.y);
    expect(k).toBeGreaterThan(0);
    route.forEach((p, i) => {
      expect(points[i]![0]).toBeCloseTo(p0[0] + k * (p.x - route[0]!.x), 1);
      expect(points[i]![1]).toBeCloseTo(p0[1] - k * (p.y - route[0]!.y), 1);
    });
    // The calibrated plan image lies underneath.
    expect(svg).toContain('data-layer="plan-image"');

    if (SHOTS_DIR) {
      await chooseTool(page, 'Select and move');
      await tapPlan(page, speakerAt);
      await page.getByRole('region', { name: 'Item Patio satellite' }).waitFor();
      await shot(page, 'phone-select');
      const desk = await browser.newContext({ viewport: DESK, locale: 'en-GB' });
      const deskPage = await desk.newPage();
      await deskPage.goto(`${baseUrl}/jobs/${jobId}/plan`);
      await signIn(deskPage, company.users.lead.email);
      await deskPage.getByRole('application', { name: /^Plan of / }).waitFor();
      await deskPage.getByTestId('plan-image').waitFor();
      await shot(deskPage, 'desk-plan');
      await desk.close();
    }

    expect(errors).toEqual([]);
    await context.close();
  });

  it.runIf(SHOTS_DIR !== undefined)('should show the demo as-built on the plan (screenshots)', async () => {
    const office = (await httpApiAs(baseUrl, company.users.office)) as unknown as Api;
    const { siteId: demoSite } = await createSite(office, { northAzimuthDeg: 20 });
    const job = await createJob(office, demoSite, { crewLeadUserId: company.users.lead.id });
    await recordAsBuilt(office, job, DEMO_AS_BUILT);
    for (const [name, viewport] of [
      ['demo-phone', PHONE],
      ['demo-desk', DESK],
    ] as const) {
      const context = await browser.newContext({ viewport, hasTouch: name === 'demo-phone', isMobile: name === 'demo-phone', locale: 'en-US' });
      const page = await context.newPage();
      await page.goto(`${baseUrl}/jobs/${job.id}/plan`);
      await signIn(page, company.users.lead.email);
      await page.getByRole('application', { name: /^Plan of / }).waitFor();
      await page.locator('[data-hit="item"]').first().waitFor();
      await shot(page, name);
      await chooseTool(page, 'Draw a run route');
      await page.getByRole('combobox', { name: 'Run' }).selectOption({ index: 1 });
      await shot(page, `${name}-route`);
      await context.close();
    }
  });
});
