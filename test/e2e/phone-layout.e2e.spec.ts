import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';

import type { AsBuilt } from '../../api/src/domain/as-built/as-built.schema.js';
import { launchChromium } from '../support/browser.js';
import { createCompany, TEST_PASSWORD, type TestCompany } from '../support/fixtures.js';
import { httpApiAs } from '../support/http-api.js';
import { type Api, createJob, createSite, recordAsBuilt } from '../support/records.js';

const PHONE = { width: 390, height: 844 };
/** WCAG 2.2 success criterion 2.5.5 (Target Size, enhanced): 44 × 44 CSS px. */
const MIN_TARGET_PX = 44;

const EQUIPMENT: AsBuilt = {
  zones: [],
  referencePoints: [],
  items: [
    {
      id: 'amp',
      kind: 'amplifier',
      label: 'Garage amp',
      channels: [
        { id: 'ch1', name: 'Patio' },
        { id: 'ch2', name: 'Lawn' },
      ],
      ratedWatts8Ohm: 60,
      ratedWatts4Ohm: 100,
      minimumImpedanceOhm: 4,
    },
    { id: 'sat', kind: 'speaker', label: 'Patio satellite', nominalImpedanceOhm: 8 },
  ],
  runs: [],
  checks: [],
};

type Problem = { what: string; width: number; height: number };

/**
 * Measures the rendered page: does it scroll sideways, and which visible interactive targets are smaller
 * than 44 px either way. A checkbox or radio is measured by its whole clickable row (Fluent lays the
 * native input over the box only); a link inside a sentence is exempt, as WCAG 2.5.5 allows.
 */
async function measure(page: Page): Promise<{ overflowPx: number; small: Problem[] }> {
  return page.evaluate((min) => {
    const root = document.documentElement;
    const overflowPx = root.scrollWidth - root.clientWidth;
    const selector = 'a[href], button, input:not([type="hidden"]), select, textarea, [role="button"], [role="tab"], [role="checkbox"], [role="radio"], [role="combobox"], [role="link"]';
    const small: { what: string; width: number; height: number }[] = [];
    for (const element of Array.from(document.querySelectorAll<HTMLElement>(selector))) {
      const style = getComputedStyle(element);
      if (style.visibility === 'hidden' || style.display === 'none' || element.closest('[aria-hidden="true"], [hidden]')) continue;
      const input = element as HTMLInputElement;
      const target = input.type === 'checkbox' || input.type === 'radio' ? (element.closest('label') ?? element.parentElement ?? element) : element;
      const box = target.getBoundingClientRect();
      // Not on screen at all (a skip link parked off-screen, a visually hidden file input).
      if (box.width <= 2 || box.height <= 2 || box.right <= 0 || box.bottom <= 0) continue;
      if (element.tagName === 'A' && element.closest('p')) continue;
      if (box.width < min - 0.5 || box.height < min - 0.5) {
        const name = (element.getAttribute('aria-label') ?? element.textContent ?? (input.name || element.id || '')).trim().slice(0, 40);
        small.push({ what: `${element.tagName.toLowerCase()}${element.getAttribute('role') ? `[role=${element.getAttribute('role')}]` : ''} "${name}"`, width: Math.round(box.width), height: Math.round(box.height) });
      }
    }
    return { overflowPx, small };
  }, MIN_TARGET_PX);
}

describe('a crew lead’s pages on a 390 px phone', () => {
  const baseUrl = inject('baseUrl');
  let browser: Browser;
  let company: TestCompany;
  let jobId: string;

  beforeAll(async () => {
    browser = await launchChromium();
    company = await createCompany('Phone Layout');
    const office = (await httpApiAs(baseUrl, company.users.office)) as unknown as Api;
    const { siteId } = await createSite(office);
    const job = await createJob(office, siteId, { crewLeadUserId: company.users.lead.id });
    await recordAsBuilt(office, job, EQUIPMENT);
    jobId = job.id;
  });

  afterAll(async () => {
    await browser.close();
  });

  it('should fit every page in the width and give every target at least 44 px', async () => {
    const context = await browser.newContext({ viewport: PHONE, hasTouch: true, isMobile: true });
    const page = await context.newPage();
    await page.goto(`${baseUrl}/jobs`);
    await page.getByRole('heading', { name: 'Sign in' }).waitFor();
    await page.getByLabel(/^E-mail/).fill(company.users.lead.email);
    await page.getByLabel(/^Password/).fill(TEST_PASSWORD);
    await page.getByRole('button', { name: 'Sign in' }).click();
    await page.getByRole('heading', { name: 'Jobs', exact: true }).waitFor();

    const pages: { path: string; ready: (page: Page) => Promise<unknown> }[] = [
      { path: '/jobs', ready: (p) => p.getByRole('heading', { name: 'Jobs', exact: true }).waitFor() },
      ...['runs', 'equipment', 'walls', 'zones', 'amp', 'checks', 'photos', 'notes'].map((section) => ({
        path: `/jobs/${jobId}?section=${section}`,
        ready: (p: Page) => p.getByRole('tablist', { name: 'Parts of the as-built' }).waitFor(),
      })),
      { path: `/jobs/${jobId}/plan`, ready: (p) => p.locator('svg').first().waitFor() },
      { path: `/jobs/${jobId}/drawings`, ready: (p) => p.getByRole('heading').first().waitFor() },
      { path: '/settings', ready: (p) => p.getByRole('heading').first().waitFor() },
    ];
    const report: string[] = [];
    for (const { path, ready } of pages) {
      await page.goto(`${baseUrl}${path}`);
      await ready(page);
      await page.waitForLoadState('networkidle');
      const { overflowPx, small } = await measure(page);
      if (overflowPx > 1) report.push(`${path}: scrolls sideways by ${overflowPx} px`);
      for (const problem of small) report.push(`${path}: ${problem.what} is ${problem.width}×${problem.height} px`);
    }
    await context.close();
    expect(report).toEqual([]);
  }, 240_000);

  it('should catch a page that scrolls sideways and a small target (the check can fail)', async () => {
    const context = await browser.newContext({ viewport: PHONE, hasTouch: true, isMobile: true });
    const page = await context.newPage();
    await page.setContent('<meta name="viewport" content="width=device-width, initial-scale=1"><div style="width:600px">wide</div><button style="height:22px;width:80px">Drawings</button>');
    const { overflowPx, small } = await measure(page);
    await context.close();
    expect(overflowPx).toBeGreaterThan(1);
    expect(small).toEqual([{ what: 'button "Drawings"', width: 80, height: 22 }]);
  }, 60_000);
});
