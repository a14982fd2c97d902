import { readFileSync } from 'node:fs';
import { join } from 'node:path';

import type { Role } from '../../api/src/domain/auth/roles.js';
import type { Browser, BrowserContext, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';

import type { AsBuilt } from '../../api/src/domain/as-built/as-built.schema.js';
import { launchChromium } from '../support/browser.js';
import { createCompany, TEST_PASSWORD, type TestCompany } from '../support/fixtures.js';
import { httpApiAs } from '../support/http-api.js';
import { type Api, createJob, createSite, moveJob, recordAsBuilt } from '../support/records.js';

// A phone, held upright, with touch (issue 17).
const PHONE = { viewport: { width: 390, height: 844 }, hasTouch: true, isMobile: true };
const WEB_DIST = join(import.meta.dirname, '../../web/dist');

const EQUIPMENT: AsBuilt = {
  zones: [],
  referencePoints: [],
  items: [
    {
      id: 'amp',
      kind: 'amplifier',
      label: 'Shed amp',
      channels: [{ id: 'ch1', name: 'Terrace' }],
      ratedWatts8Ohm: 60,
      ratedWatts4Ohm: 100,
      minimumImpedanceOhm: 4,
    },
    { id: 'sat', kind: 'speaker', label: 'Terrace satellite', nominalImpedanceOhm: 8 },
  ],
  runs: [],
  checks: [],
};

async function signIn(context: BrowserContext, baseUrl: string, email: string): Promise<Page> {
  const page = await context.newPage();
  await page.goto(`${baseUrl}/sign-in`);
  await page.getByRole('heading', { name: 'Sign in' }).waitFor();
  await page.getByLabel(/^E-mail/).fill(email);
  await page.getByLabel(/^Password/).fill(TEST_PASSWORD);
  await page.getByRole('button', { name: 'Sign in' }).tap();
  return page;
}

/**
 * The built script holding each of these source modules (paths under web/), from the build's
 * .vite/chunk-contents.json (web/vite.config.ts): a module may share its chunk with others of the same
 * first screen (`firstScreenChunks`), so Vite's manifest does not name every one.
 */
function chunkFilesOf(modules: string[]): Map<string, string> {
  const contents = JSON.parse(readFileSync(join(WEB_DIST, '.vite/chunk-contents.json'), 'utf8')) as Record<string, { sources: string[] }>;
  const files = new Map<string, string>();
  for (const module of modules) {
    const file = Object.keys(contents).find((name) => contents[name]!.sources.includes(`web/${module}`));
    if (file) files.set(module, file);
  }
  return files;
}

describe('home by role on a phone (issue 17)', () => {
  const baseUrl = inject('baseUrl');
  let browser: Browser;
  let company: TestCompany;
  let inHandTitle: string;
  let submittedTitle: string;
  let locatePath: string;

  beforeAll(async () => {
    browser = await launchChromium();
    company = await createCompany('Home Roles');
    const office = (await httpApiAs(baseUrl, company.users.office)) as unknown as Api;
    const { siteId } = await createSite(office);
    // One job in hand for the lead and the technician, one submitted for the office to review.
    const inHand = await createJob(office, siteId, { crewLeadUserId: company.users.lead.id, technicianUserIds: [company.users.tech.id] });
    await moveJob(office, { ...inHand, version: (await recordAsBuilt(office, inHand, EQUIPMENT)).version }, 'in_progress');
    const submitted = await createJob(office, siteId, { crewLeadUserId: company.users.lead.id });
    await moveJob(office, { ...submitted, version: (await recordAsBuilt(office, submitted, EQUIPMENT)).version }, 'in_progress', 'submitted');
    const titles = (await office.expectOk('get', '/api/jobs?pageSize=100')).items as { id: string; title: string }[];
    inHandTitle = titles.find((j) => j.id === inHand.id)!.title;
    submittedTitle = titles.find((j) => j.id === submitted.id)!.title;
    const link = await office.expectOk('post', `/api/sites/${siteId}/locate-links`, { expiresInDays: 7 });
    locatePath = new URL(link.url as string).pathname;
  });

  afterAll(async () => {
    await browser.close();
  });

  it.each(['lead', 'tech'] as const)('should land a %s on Today with the job in hand and its next step', async (role: Role) => {
    const context = await browser.newContext(PHONE);
    const page = await signIn(context, baseUrl, company.users[role].email);
    await page.getByRole('heading', { name: 'Today', exact: true }).waitFor();
    expect(new URL(page.url()).pathname).toBe('/');
    const rows = page.getByRole('list', { name: 'Your open jobs' }).getByRole('link');
    const row = rows.filter({ hasText: inHandTitle });
    await row.waitFor();
    await expect.poll(() => row.textContent()).toMatch(/In progress/);
    expect(await row.textContent()).toMatch(role === 'lead' ? /Next: Record what went in the ground/ : /Next: Add depth readings/);
    // The job in hand comes before the one waiting on the office (the technician is not on that one).
    const texts = await rows.allTextContents();
    if (role === 'lead') expect(texts.findIndex((t) => t.includes(inHandTitle))).toBeLessThan(texts.findIndex((t) => t.includes(submittedTitle)));
    else expect(texts.some((t) => t.includes(submittedTitle))).toBe(false);
    // Nothing on the page is wider than the phone.
    expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(390);
    await row.tap();
    await page.waitForURL(/\/jobs\/[0-9a-f-]{36}/);
    await context.close();
  });

  it.each(['office', 'admin'] as const)('should land the %s on the work queue with the submitted job to review', async (role: Role) => {
    const context = await browser.newContext(PHONE);
    const page = await signIn(context, baseUrl, company.users[role].email);
    await page.getByRole('heading', { name: 'Work queue', exact: true }).waitFor();
    expect(new URL(page.url()).pathname).toBe('/');
    const review = page.getByRole('region', { name: /^To review/ });
    await review.getByRole('link', { name: new RegExp(submittedTitle) }).waitFor();
    await page.getByRole('region', { name: /^Ready to issue/ }).waitFor();
    expect(await review.getByRole('link', { name: new RegExp(inHandTitle) }).count()).toBe(0);
    expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(390);
    await context.close();
  });

  it('should land a homeowner on their property, with no contractor home in the menu', async () => {
    const context = await browser.newContext(PHONE);
    const page = await signIn(context, baseUrl, company.users.homeowner.email);
    await page.getByRole('heading', { name: 'My property', exact: true }).waitFor();
    expect(new URL(page.url()).pathname).toBe('/portal');
    await page.getByRole('button', { name: 'Open menu' }).tap();
    const nav = page.getByRole('dialog', { name: 'Menu' }).getByRole('navigation', { name: 'Main' });
    await nav.getByRole('link', { name: 'My property' }).waitFor();
    expect(await nav.getByRole('link', { name: 'Home', exact: true }).count()).toBe(0);
    await context.close();
  });

  it('should load the sign-in page and the public locate view without the staff app, and compressed', async () => {
    const staffOnly = chunkFilesOf([
      'src/app/routes/app/root.tsx',
      'src/app/routes/app/protected.tsx',
      'src/components/toaster.tsx',
      'src/features/auth/components/user-menu.tsx',
      'src/features/photos/hooks/use-upload-queue.ts',
    ]);
    // Every one of them is in a script the build made.
    expect([...staffOnly.keys()].sort()).toEqual([
      'src/app/routes/app/protected.tsx',
      'src/app/routes/app/root.tsx',
      'src/components/toaster.tsx',
      'src/features/auth/components/user-menu.tsx',
      'src/features/photos/hooks/use-upload-queue.ts',
    ]);
    for (const [path, ready] of [
      ['/sign-in', /Sign in/],
      [locatePath, /Buried cables/],
    ] as const) {
      const context = await browser.newContext(PHONE);
      const page = await context.newPage();
      const scripts: Promise<{ url: string; encoding: string | undefined; bytes: number }>[] = [];
      page.on('response', (response) => {
        if (!new URL(response.url()).pathname.endsWith('.js')) return;
        const encoding = response.headers()['content-encoding'];
        scripts.push(response.body().then((body) => ({ url: response.url(), encoding, bytes: body.length })));
      });
      await page.goto(`${baseUrl}${path}`);
      await page.getByText(ready).first().waitFor();
      await page.waitForLoadState('networkidle');
      const loaded = await Promise.all(scripts);
      const files = loaded.map((s) => new URL(s.url).pathname.slice(1));
      for (const [module, file] of staffOnly) expect(files, `${path} loaded ${module}`).not.toContain(file);
      // Every script of 1 KB or more travelled compressed (the build's brotli or gzip copy; smaller ones
      // gain less than a packet header and have no copy).
      expect(loaded.filter((s) => s.bytes >= 1024).length, path).toBeGreaterThan(3);
      for (const script of loaded) {
        if (script.bytes >= 1024) expect(['br', 'gzip'], `${script.url} on ${path}`).toContain(script.encoding);
      }
      await context.close();
    }
  });
});
