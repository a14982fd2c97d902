import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';

import type { AsBuilt } from '../../api/src/domain/as-built/as-built.schema.js';
import { launchChromium } from '../support/browser.js';
import { createCompany, TEST_PASSWORD, type TestCompany } from '../support/fixtures.js';
import { httpApiAs } from '../support/http-api.js';
import { type Api, createJob, createSite, recordAsBuilt } from '../support/records.js';

const PHONE = { width: 390, height: 844 };

/** An amplifier and one satellite, recorded by the office; the crew lead lays the cable between them. */
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

async function signIn(page: Page, email: string): Promise<void> {
  await page.getByRole('heading', { name: 'Sign in' }).waitFor();
  await page.getByLabel(/^E-mail/).fill(email);
  await page.getByLabel(/^Password/).fill(TEST_PASSWORD);
  await page.getByRole('button', { name: 'Sign in' }).click();
}

async function confirm(page: Page, name: string): Promise<void> {
  await page.getByRole('alertdialog').getByRole('button', { name }).click();
  await page.getByRole('alertdialog').waitFor({ state: 'detached' });
}

describe('a crew lead records a run on a phone', () => {
  const baseUrl = inject('baseUrl');
  let browser: Browser;
  let company: TestCompany;
  let jobId: string;

  beforeAll(async () => {
    browser = await launchChromium();
    company = await createCompany('Jobs Flow');
    const office = (await httpApiAs(baseUrl, company.users.office)) as unknown as Api;
    const { siteId } = await createSite(office);
    const job = await createJob(office, siteId, { crewLeadUserId: company.users.lead.id });
    await recordAsBuilt(office, job, EQUIPMENT);
    jobId = job.id;
  });

  afterAll(async () => {
    await browser.close();
  });

  it('should add a run with three depth readings, show the shallow one, fix it and submit', async () => {
    const context = await browser.newContext({ viewport: PHONE, hasTouch: true, isMobile: true });
    const page = await context.newPage();
    const errors: string[] = [];
    page.on('pageerror', (error) => errors.push(error.message));

    // The lead opens the jobs list, signs in, and sees their job under "My jobs".
    await page.goto(`${baseUrl}/jobs`);
    await signIn(page, company.users.lead.email);
    await page.getByRole('heading', { name: 'Jobs', exact: true }).waitFor();
    const jobs = page.getByRole('list', { name: 'Jobs' });
    await jobs.getByRole('link').first().click();
    await page.waitForURL(`**/jobs/${jobId}`);

    // Start work, then add the run from the amplifier to the satellite.
    await page.getByRole('button', { name: 'Start work' }).click();
    await confirm(page, 'Start work');
    await page.getByText('In progress', { exact: true }).first().waitFor();

    await page.getByRole('button', { name: 'Add run' }).click();
    const form = page.getByRole('form', { name: 'New run' });
    await form.getByLabel(/^Name/).fill('Patio trunk');
    await form.getByLabel(/^From/).selectOption({ label: 'Garage amp (amplifier)' });
    await form.getByLabel(/^To/).selectOption({ label: 'Patio satellite (speaker)' });
    await form.getByLabel(/^Cable type/).fill('14/2 direct burial');
    await form.getByLabel(/^Gauge/).fill('14');
    await form.getByLabel(/^Measured length/).fill('12 m');
    await form.getByLabel('Pair 1 carries').selectOption({ label: 'Garage amp · Patio' });
    await form.getByRole('button', { name: 'Add run' }).click();
    const run = page.getByRole('listitem', { name: 'Run Patio trunk' });
    await run.waitFor();

    // Three readings; the second is too shallow, and the form says so before it is saved.
    await run.getByRole('button', { name: 'Add depth reading' }).click();
    const readings: [string, string][] = [
      ['2 m', '20 cm'],
      ['6 m', '8 cm'],
      ['10 m', '18 cm'],
    ];
    for (const [station, depth] of readings) {
      await run.getByLabel('Station (from the start)').fill(station);
      await run.getByLabel('Cover depth').fill(depth);
      if (depth === '8 cm') await run.getByText(/Shallow: .* short of/).waitFor();
      await run.getByRole('button', { name: 'Save reading' }).click();
      await expect.poll(() => run.getByLabel('Station (from the start)').inputValue()).toBe('');
    }
    await expect.poll(() => run.getByRole('list', { name: 'Readings' }).getByRole('listitem').count()).toBe(3);
    await run.getByText('Too shallow').waitFor();

    // The findings (above the forms on a phone) name the shallow station and lead to it.
    await page.getByRole('button', { name: /^Findings: \d+ to look at/ }).click();
    const finding = page.getByRole('list', { name: 'Findings' }).getByRole('listitem').filter({ hasText: 'Patio trunk' }).filter({ hasText: 'short' });
    await finding.waitFor();
    await finding.getByRole('button', { name: 'Show the field' }).click();
    await expect.poll(() => page.evaluate(() => document.activeElement?.textContent ?? '')).toMatch(/at 6 m|at 19 ft/);

    // Fix it: the trench was deepened; the reading is changed to 17 cm.
    await page.getByRole('button', { name: /^Change the reading at (6 m|19 ft)/ }).click();
    await run.getByLabel('Cover depth').fill('17 cm');
    await run.getByText('Deep enough').first().waitFor();
    await run.getByRole('button', { name: 'Save change' }).click();
    await expect.poll(() => run.getByText('Too shallow').count()).toBe(0);
    await page.getByRole('button', { name: /^Findings: / }).click();
    await expect.poll(() => page.getByRole('list', { name: 'Findings' }).getByText(/cm short/).count()).toBe(0);

    // Submit for review.
    await page.getByRole('button', { name: 'Submit for review' }).click();
    await confirm(page, 'Submit for review');
    await page.getByText('Submitted for review', { exact: true }).first().waitFor();
    await expect.poll(() => page.getByRole('button', { name: 'Add run' }).count()).toBe(0);

    expect(errors).toEqual([]);
    await context.close();
  });
});
