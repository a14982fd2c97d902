import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';

import type { AsBuilt } from '../../api/src/domain/as-built/as-built.schema.js';
import { launchChromium } from '../support/browser.js';
import { createCompany, TEST_PASSWORD, type TestCompany } from '../support/fixtures.js';
import { httpApiAs } from '../support/http-api.js';
import { type Api, createJob, createSite, moveJob, recordAsBuilt } from '../support/records.js';

// With the app's service worker, as users get it (the other browser tests block it: test/support/browser.ts).
const PHONE = { viewport: { width: 390, height: 844 }, hasTouch: true, isMobile: true, locale: 'en-US', serviceWorkers: 'allow' as const };

/** The office's start: an amplifier and one taped corner of the house. */
const START: AsBuilt = {
  zones: [],
  referencePoints: [{ id: 'nw', label: 'House NW corner', x: 0, y: 0 }],
  items: [{ id: 'amp', kind: 'amplifier', label: 'Garage amp', channels: [{ id: 'ch1', name: 'Patio' }], ratedWatts8Ohm: 60, ratedWatts4Ohm: 100, minimumImpedanceOhm: 4 }],
  runs: [],
  checks: [],
};

async function signIn(page: Page, email: string): Promise<void> {
  await page.getByRole('heading', { name: 'Sign in' }).waitFor();
  await page.getByLabel(/^E-mail/).fill(email);
  await page.getByLabel(/^Password/).fill(TEST_PASSWORD);
  await page.getByRole('button', { name: 'Sign in' }).click();
}

describe('a crew lead adds a reference point with no signal (issue 17)', () => {
  const baseUrl = inject('baseUrl');
  let browser: Browser;
  let company: TestCompany;
  let office: Api;

  beforeAll(async () => {
    browser = await launchChromium();
    company = await createCompany('Offline Landmarks');
    office = (await httpApiAs(baseUrl, company.users.office)) as unknown as Api;
  });

  afterAll(async () => {
    await browser.close();
  });

  it('should keep the point and a tie taped from it on the phone, then put both on the server once, the point first', async () => {
    const { siteId } = await createSite(office);
    const draft = await createJob(office, siteId, { crewLeadUserId: company.users.lead.id });
    const { version } = await recordAsBuilt(office, draft, START);
    await moveJob(office, { ...draft, version }, 'in_progress');
    const title = (await office.expectOk('get', `/api/jobs/${draft.id}`)).title as string;

    const context = await browser.newContext(PHONE);
    const page = await context.newPage();
    const errors: string[] = [];
    page.on('pageerror', (error) => errors.push(error.message));
    const refused: string[] = [];
    page.on('response', (response) => {
      const path = new URL(response.url()).pathname;
      if (!path.startsWith('/api/') || response.status() < 400 || response.status() === 401) return;
      refused.push(`${response.request().method()} ${path} ${response.status()}`);
    });
    await page.goto(`${baseUrl}/`);
    await signIn(page, company.users.lead.email);
    await page.getByRole('heading', { name: 'Today' }).waitFor();
    await page.getByRole('link', { name: new RegExp(title) }).first().click();
    await page.getByRole('heading', { name: title }).first().waitFor();
    await page.getByRole('link', { name: 'Open the plan' }).click();
    const toolbar = page.getByRole('toolbar', { name: 'Plan tools' });
    await toolbar.waitFor();
    const before = (await office.expectOk('get', `/api/jobs/${draft.id}`)).version as number;

    // No signal in the back yard: the lead taps the gate post on the plan and names it.
    await context.setOffline(true);
    await toolbar.getByRole('radio', { name: 'Add a reference point' }).click();
    const plan = page.getByRole('application');
    const box = (await plan.boundingBox())!;
    await plan.click({ position: { x: box.width / 2 + 40, y: box.height / 2 - 40 } });
    const dialog = page.getByRole('dialog', { name: 'New reference point' });
    await dialog.getByRole('textbox', { name: /Name/ }).fill('Gate post');
    await dialog.getByRole('button', { name: 'Add point' }).click();
    await dialog.waitFor({ state: 'detached' });
    await page.getByText('Waiting to send (1)').first().waitFor();
    // Drawn on the plan at once (Playwright's role queries do not know the SVG graphics roles).
    await page.locator('[data-hit="reference"][aria-label="Reference point Gate post"]').waitFor();

    // Back in the job, a speaker taped from the new point (still known only to this phone) and the house corner.
    await page.goBack();
    await page.getByRole('heading', { name: title }).first().waitFor();
    await page.getByRole('tab', { name: /^Equipment/ }).click();
    await page.getByRole('button', { name: 'Add equipment' }).click();
    const itemForm = page.locator('form').filter({ has: page.getByLabel(/^Name/) }).first();
    await itemForm.getByLabel(/^Kind/).selectOption({ label: 'Speaker' });
    await itemForm.getByLabel(/^Name/).fill('Gate speaker');
    await itemForm.getByRole('button', { name: 'Add a tie' }).click();
    await itemForm.getByLabel('Tie 1 from').selectOption({ label: 'Gate post' });
    // Equal tapes of 100 ft from two points meet wherever the gate post was tapped (closer than 200 ft).
    await itemForm.getByLabel(/^Distance/).first().fill(`100'`);
    await itemForm.getByRole('button', { name: 'Add a tie' }).click();
    await itemForm.getByLabel('Tie 2 from').selectOption({ label: 'House NW corner' });
    await itemForm.getByLabel(/^Distance/).nth(1).fill(`100'`);
    await itemForm.getByRole('radio', { name: 'Right' }).check();
    await itemForm.getByRole('button', { name: 'Add', exact: true }).click();
    // Should the ties not meet after all, the form asks first; the ties are what this test is about.
    const saveAnyway = page.getByRole('button', { name: 'Save without a position' });
    const queued = page.getByText('Waiting to send (2)').first();
    await Promise.race([queued.waitFor(), saveAnyway.waitFor().then(() => saveAnyway.click()).catch(() => undefined)]);
    await queued.waitFor();
    const site = await office.expectOk('get', `/api/sites/${siteId}`);
    expect(site.referencePoints.map((p: { label: string }) => p.label), 'nothing reached the server yet').toEqual(['House NW corner']);

    // Signal again: the point goes first, then the speaker with its tie pointing at the point's server id.
    await context.setOffline(false);
    await expect.poll(() => page.getByText(/Waiting to send/).count(), { timeout: 30_000 }).toBe(0);
    const after = await office.expectOk('get', `/api/sites/${siteId}`);
    const gate = (after.referencePoints as { id: string; label: string }[]).filter((p) => p.label === 'Gate post');
    expect(gate, 'the point once').toHaveLength(1);
    const { asBuilt, job } = await office.expectOk('get', `/api/jobs/${draft.id}/as-built`);
    const speakers = (asBuilt.items as { label: string; ties?: { referencePointId: string }[] }[]).filter((item) => item.label === 'Gate speaker');
    expect(speakers, 'the speaker once').toHaveLength(1);
    const corner = (after.referencePoints as { id: string; label: string }[]).find((p) => p.label === 'House NW corner')!;
    expect(speakers[0]!.ties!.map((tie) => tie.referencePointId), 'the tie names the point under the id the server gave it').toEqual([gate[0]!.id, corner.id]);
    expect(job.version, 'the point (a site write bumps the job) and the speaker').toBe(before + 2);
    expect(refused, 'no write refused').toEqual([]);
    expect(errors).toEqual([]);
    await context.close();
  });
});
