import type { Browser, BrowserContext, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';

import { DEMO_AS_BUILT } from '../../api/src/domain/as-built/demo-as-built.js';
import { createLocalFrame, planToWgs84 } from '../../api/src/domain/geometry/local-tangent-plane.js';
import type { LocateViewResponse } from '../../api/src/domain/locate/locate-link.schema.js';
import { DEMO_SITE_FEATURES } from '../../api/src/domain/sites/demo-site-features.js';
import { pdfPages } from '../print/packet-pdf.js';
import { launchChromium } from '../support/browser.js';
import { createCompany, type TestCompany, withDb } from '../support/fixtures.js';
import { httpApiAs } from '../support/http-api.js';
import { type Api, createJob, createSite, issueAndWaitForPacket, moveJob, recordAsBuilt, siteVersion } from '../support/records.js';
import { compareWithReference } from '../support/visual.js';

const PHONE = { width: 390, height: 844 };
const DESK = { width: 1280, height: 800 };
const INSTALLER_PHONE = '+1 555 0177';
/** Where the mocked phone fix lies on the plan: 3 m right and 2 m up from the west house corner (0, 0). */
const FIX_ON_PLAN = { x: 3, y: 2 };

type LabelBox = { id: string; left: number; top: number; right: number; bottom: number };

/** Every placed map label's box on screen (the browser's own text layout). */
function labelBoxes(page: Page): Promise<LabelBox[]> {
  return page.locator('[data-testid="locate-map"] [data-label]').evaluateAll((els) =>
    els.map((el) => {
      const r = el.getBoundingClientRect();
      return { id: el.getAttribute('data-label') ?? '', left: r.left, top: r.top, right: r.right, bottom: r.bottom };
    }),
  );
}

/** No two label boxes intersect (0.5 px of anti-aliasing allowed) and none sticks out of the map. */
async function expectLabelsApartAndInside(page: Page, where: string): Promise<number> {
  const boxes = await labelBoxes(page);
  const frame = (await page.getByTestId('locate-map').boundingBox())!;
  const clash: string[] = [];
  for (let i = 0; i < boxes.length; i += 1) {
    const a = boxes[i]!;
    expect(a.left >= frame.x - 0.5 && a.right <= frame.x + frame.width + 0.5 && a.top >= frame.y - 0.5 && a.bottom <= frame.y + frame.height + 0.5, `${where}: ${a.id} clipped`).toBe(true);
    for (const b of boxes.slice(i + 1)) {
      if (a.left < b.right - 0.5 && b.left < a.right - 0.5 && a.top < b.bottom - 0.5 && b.top < a.bottom - 0.5) clash.push(`${a.id} × ${b.id}`);
    }
  }
  expect(clash, `${where}: overlapping labels`).toEqual([]);
  return boxes.length;
}

async function zoomOf(page: Page): Promise<number> {
  return Number(await page.getByTestId('locate-map').getAttribute('data-zoom'));
}

/** The map once it has fitted the site and placed its labels, in the shipped font. */
async function mapReady(page: Page): Promise<void> {
  await page.locator('[data-testid="locate-map"] [data-label]').first().waitFor();
  await page.evaluate(() => document.fonts.ready.then(() => undefined));
}

describe('locate view on a phone: touch, position, labels, print (issue 15)', () => {
  const baseUrl = inject('baseUrl');
  let browser: Browser;
  let company: TestCompany;
  let locatePath: string;
  let token: string;

  beforeAll(async () => {
    browser = await launchChromium();
    company = await createCompany('Locate Phone');
    await withDb((db) => db.query(`insert into company_settings (company_id, units, contact_phone) values ($1, 'imperial', $2)`, [company.id, INSTALLER_PHONE]));
    const office = (await httpApiAs(baseUrl, company.users.office)) as unknown as Api;
    const lead = (await httpApiAs(baseUrl, company.users.lead)) as unknown as Api;
    const { siteId } = await createSite(office, DEMO_AS_BUILT.site);
    // The demo site's landmarks (house, fences, patio …), drawn in grey under the runs.
    for (const feature of DEMO_SITE_FEATURES) {
      await office.expectOk('post', `/api/sites/${siteId}/features`, feature, { 'If-Match': `"${await siteVersion(office, siteId)}"` });
    }
    const created = await createJob(office, siteId, { crewLeadUserId: company.users.lead.id });
    const recorded = await recordAsBuilt(lead, created, DEMO_AS_BUILT);
    const ready = await moveJob(office, await moveJob(lead, { ...created, version: recorded.version }, 'in_progress', 'submitted'), 'ready_to_issue');
    await issueAndWaitForPacket(office, ready);
    const link = await office.expectOk('post', `/api/sites/${siteId}/locate-links`, { expiresInDays: 7, note: 'Fence crew' });
    locatePath = new URL(link.url as string).pathname;
    token = link.token as string;
  }, 180_000);

  afterAll(async () => {
    await browser?.close();
  });

  it('should pinch, tap a run, show ties, place my position within 0.5 m, copy the link and print one page', async () => {
    const origin = DEMO_AS_BUILT.site!.origin!;
    const fix = planToWgs84(createLocalFrame(origin, DEMO_AS_BUILT.site!.northAzimuthDeg ?? 0), FIX_ON_PLAN);
    const context: BrowserContext = await browser.newContext({
      viewport: PHONE,
      deviceScaleFactor: 1,
      isMobile: true,
      hasTouch: true,
      geolocation: { latitude: fix.lat, longitude: fix.lon, accuracy: 5 },
      permissions: ['geolocation'],
      locale: 'en-US',
      timezoneId: 'UTC',
      reducedMotion: 'reduce',
    });
    // No Web Share API here (as on most desktop browsers): the button must fall back to copying.
    await context.addInitScript(() => {
      const copied: string[] = [];
      Object.assign(window, { __copied: copied });
      Object.defineProperty(navigator, 'share', { value: undefined, configurable: true });
      Object.defineProperty(navigator, 'clipboard', { value: { writeText: async (text: string) => void copied.push(text) }, configurable: true });
    });
    const page = await context.newPage();
    const errors: string[] = [];
    page.on('pageerror', (error) => errors.push(error.message));
    // The page's data: started by the answer's Link preload, taken by the page's own fetch (one open logged).
    const viewRequests: string[] = [];
    page.on('request', (request) => {
      if (new URL(request.url()).pathname === `/api/locate/${token}`) viewRequests.push(request.url());
    });
    await page.goto(`${baseUrl}${locatePath}`);
    const map = page.getByTestId('locate-map');
    await map.scrollIntoViewIfNeeded();
    await mapReady(page);
    // No animation, and no tooltip of the zoom buttons over the map in the screenshots.
    await page.addStyleTag({ content: '*, *::before, *::after { animation: none !important; transition: none !important; } [role="tooltip"] { display: none !important; }' });

    // The whole site, then one step in: labels apart and inside, and the map as in the references.
    const fitted = await zoomOf(page);
    expect(await expectLabelsApartAndInside(page, 'demo site, fitted')).toBeGreaterThan(5);
    compareWithReference('locate-map-phone-fit', await map.screenshot({ animations: 'disabled', caret: 'hide' }), { pixelThreshold: 0.1, maxDiffRatio: 0.01 });
    await page.getByRole('button', { name: 'Zoom in' }).click();
    await expect.poll(() => zoomOf(page)).toBeCloseTo(fitted * 1.6, 3);
    await expectLabelsApartAndInside(page, 'demo site, zoomed in');
    compareWithReference('locate-map-phone-zoom', await map.screenshot({ animations: 'disabled', caret: 'hide' }), { pixelThreshold: 0.1, maxDiffRatio: 0.01 });

    // Pinch out with two fingers (touch events through the DevTools protocol): the zoom and the scale bar follow.
    await page.getByRole('button', { name: 'Show the whole site' }).click();
    await expect.poll(() => zoomOf(page)).toBeCloseTo(fitted, 3);
    const scaleLabel = page.getByTestId('scale-bar-label');
    const scaleBefore = await scaleLabel.textContent();
    const box = (await map.boundingBox())!;
    const cdp = await context.newCDPSession(page);
    await cdp.send('Input.synthesizePinchGesture', { x: box.x + box.width / 2, y: box.y + box.height / 2, scaleFactor: 3, gestureSourceType: 'touch' });
    await expect.poll(() => zoomOf(page)).toBeGreaterThan(fitted * 1.5);
    await expect.poll(() => scaleLabel.textContent()).not.toBe(scaleBefore);
    await expectLabelsApartAndInside(page, 'demo site, pinched');

    // Tap a run on the map: it is highlighted and its depth profile opens.
    await page.getByRole('button', { name: 'Show the whole site' }).click();
    await expect.poll(() => zoomOf(page)).toBeCloseTo(fitted, 3);
    await map.scrollIntoViewIfNeeded();
    const target = await page.evaluate(() => {
      const svg = document.querySelector('[data-testid="locate-map"]')!.getBoundingClientRect();
      // The middle of the longest segment of any drawn run whose spot is not covered by another run's hit line.
      for (const stroke of document.querySelectorAll<SVGPolylineElement>('[data-run-id] [data-role="run-stroke"]')) {
        const pts = stroke.getAttribute('points')!.split(' ').map((p) => p.split(',').map(Number) as [number, number]);
        for (let i = 0; i + 1 < pts.length; i += 1) {
          const [a, b] = [pts[i]!, pts[i + 1]!];
          if (Math.hypot(b[0] - a[0], b[1] - a[1]) < 40) continue;
          const x = svg.left + (a[0] + b[0]) / 2;
          const y = svg.top + (a[1] + b[1]) / 2;
          const hit = document.elementFromPoint(x, y)?.closest('[data-run-id]');
          if (hit && hit === stroke.closest('[data-run-id]')) return { x, y, label: hit.getAttribute('aria-label')!.split(': ')[0]! };
        }
      }
      return null;
    });
    expect(target, 'a run with a free spot to tap').not.toBeNull();
    await page.touchscreen.tap(target!.x, target!.y);
    await page.locator('[data-selected="true"] [data-role="highlight"]').waitFor({ state: 'attached' });
    const profile = page.getByRole('img', { name: `Depth profile of ${target!.label}` });
    await profile.waitFor();
    await expect.poll(() => profile.evaluate((img: HTMLImageElement) => img.complete && img.naturalWidth > 0)).toBe(true);

    // Ties on the map, with their distances in feet and inches.
    await map.scrollIntoViewIfNeeded();
    expect(await page.locator('[data-tie]').count()).toBe(0);
    await page.getByRole('switch', { name: 'Show taped ties on the map' }).click();
    expect(await page.locator('[data-tie]').count()).toBeGreaterThan(0);
    await expect.poll(() => page.locator('[data-label^="tie:"]').count()).toBeGreaterThan(0);
    expect(await page.locator('[data-label^="tie:"]').first().textContent()).toMatch(/^\d+ ft \d+ in$/);
    await page.getByRole('switch', { name: 'Show taped ties on the map' }).click();

    // Show my position: the dot lands within 0.5 m of where the mocked fix lies on the plan.
    await page.getByRole('button', { name: 'Show my position' }).click();
    const dot = page.locator('[data-role="my-position"] [data-role="dot"]');
    await dot.waitFor();
    await page.getByText(/^Your phone puts you within about 16 ft 5 in of the black dot\.$/).waitFor();
    const k = await zoomOf(page);
    const [dx, dy] = [Number(await dot.getAttribute('cx')), Number(await dot.getAttribute('cy'))];
    const ref = page.getByRole('img', { name: /Site plan/ }).locator('g[aria-label="Reference point House corner, west"] circle');
    const [rx, ry] = [Number(await ref.getAttribute('cx')), Number(await ref.getAttribute('cy'))];
    // Screen x grows with plan x, screen y shrinks as plan y grows; both at k px per metre.
    const onPlan = { x: (dx - rx) / k, y: -(dy - ry) / k };
    expect(Math.hypot(onPlan.x - FIX_ON_PLAN.x, onPlan.y - FIX_ON_PLAN.y)).toBeLessThan(0.5);
    expect(await page.getByText(/never in place of the taped ties/).count()).toBe(1);

    // Share without a share sheet: the link is copied.
    await page.getByRole('button', { name: 'Share this map' }).click();
    await page.getByText('Link copied: paste it in a message to whoever is digging.').waitFor();
    expect(await page.evaluate(() => (window as unknown as { __copied: string[] }).__copied)).toEqual([`${baseUrl}${locatePath}`]);

    // The printable locate sheet: one page, with the installer's phone.
    const href = await page.getByRole('link', { name: /Print locate sheet/ }).getAttribute('href');
    expect(href).toBe(`/api/locate/${token}/sheet.pdf`);
    const sheet = await context.request.get(`${baseUrl}${href}`);
    expect(sheet.status()).toBe(200);
    const pages = await pdfPages(Buffer.from(await sheet.body()));
    expect(pages).toHaveLength(1);
    expect(pages[0]!.replace(/\s+/g, '')).toContain(INSTALLER_PHONE.replace(/\s+/g, ''));

    expect(viewRequests).toHaveLength(1);
    expect(errors).toEqual([]);
    await context.close();
  }, 120_000);

  it('should keep labels apart on a crowded site at two zoom levels (a desk screen)', async () => {
    const real = (await (await fetch(`${baseUrl}/api/locate/${token}`)).json()) as LocateViewResponse;
    // Forty more short runs and items packed into a 10 m square beside the house: far more labels than fit.
    const crowded: LocateViewResponse = structuredClone(real);
    const template = crowded.map.runs[0]!;
    for (let i = 0; i < 40; i += 1) {
      const x = 2 + (i % 8) * 1.3;
      const y = 3 + Math.floor(i / 8) * 1.9;
      crowded.map.runs.push({ ...template, id: `crowd-run-${i}`, label: `Crowd run ${i}`, minDepthM: 0.2 + i * 0.003, route: [{ x, y }, { x: x + 1.1, y: y + 0.6 }] });
      crowded.map.items.push({ ...crowded.map.items[0]!, id: `crowd-item-${i}`, label: `Crowd speaker ${i}`, position: { x: x + 1.1, y: y + 0.6, source: 'manual', accuracyM: null }, ties: [] });
    }
    const context = await browser.newContext({ viewport: DESK, deviceScaleFactor: 1, locale: 'en-US', timezoneId: 'UTC' });
    const page = await context.newPage();
    await page.route(`**/api/locate/${token}`, (route) => route.fulfill({ status: 200, contentType: 'application/json', body: JSON.stringify(crowded) }));
    await page.goto(`${baseUrl}${locatePath}`);
    await page.getByTestId('locate-map').scrollIntoViewIfNeeded();
    await mapReady(page);
    const shownFitted = await expectLabelsApartAndInside(page, 'crowded site, fitted');
    // Not every label fits: the least important are left out rather than overlapping.
    expect(shownFitted).toBeLessThan(crowded.map.runs.length + crowded.map.items.length + crowded.map.referencePoints.length);
    const fitted = await zoomOf(page);
    for (let i = 0; i < 3; i += 1) await page.getByRole('button', { name: 'Zoom in' }).click();
    await expect.poll(() => zoomOf(page)).toBeGreaterThan(fitted * 4);
    await expectLabelsApartAndInside(page, 'crowded site, zoomed in');
    await context.close();
  }, 60_000);
});
