import AxeBuilder from '@axe-core/playwright';
import type { Browser, BrowserContext, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';

import { DEMO_AS_BUILT } from '../../api/src/domain/as-built/demo-as-built.js';
import { makeFieldPhoto } from '../fixtures/photos/make-photos.js';
import { launchChromium } from '../support/browser.js';
import { createCompany, TEST_PASSWORD, type TestCompany } from '../support/fixtures.js';
import { httpApiAs } from '../support/http-api.js';
import { type Api, createJob, createSite, issueAndWaitForPacket, moveJob, recordAsBuilt } from '../support/records.js';

// A phone, held upright, with touch (issue 17).
const PHONE = { viewport: { width: 390, height: 844 }, hasTouch: true, isMobile: true, locale: 'en-US', timezoneId: 'UTC' };
/** The impacts that fail the scan (axe-core's scale: minor, moderate, serious, critical). */
const FAILING = new Set(['serious', 'critical']);
const SECTIONS = ['runs', 'equipment', 'walls', 'zones', 'amp', 'checks', 'photos', 'notes'];

/**
 * Nodes a rule is wrong about, each with the reason; the rule still runs on every other node. Fluent's
 * focus manager (Tabster) puts `<i data-tabster-dummy tabindex="0" aria-hidden="true">` around tab lists,
 * menus and dialogs on purpose: it hands focus on at once and must stay out of the accessibility tree
 * (microsoft/tabster#288, where its maintainer says so).
 */
const WRONG_FOR: { rule: string; html: RegExp }[] = [{ rule: 'aria-hidden-focus', html: /^<i [^>]*\bdata-tabster-dummy=""[^>]*>/ }];

/**
 * A page to open, how to know it has shown, and optionally something to open on it and scan too (a menu,
 * a form). What the `then` step opens is scanned on its own (`within`, a CSS selector), the page around it
 * having been scanned just before: the same page scanned twice cost a quarter of the file's time.
 */
type Route = { path: string; ready: (page: Page) => Promise<unknown>; then?: { label: string; within: string; act: (page: Page) => Promise<unknown> } };

/**
 * Runs axe-core over the page as it stands and returns each serious or critical violation as readable
 * lines: the rule, its impact and help, then every offending node's selector and what to fix.
 */
async function scan(page: Page, where: string, within?: string): Promise<string[]> {
  // Only violations come back: passes and incomplete results cost the most time to gather on a big page.
  const builder = new AxeBuilder({ page }).setLegacyMode(true).options({ resultTypes: ['violations'] });
  if (within) builder.include(within);
  const analyzing = Date.now();
  const { violations } = await builder.analyze();
  const lines: string[] = [];
  if (process.env.A11Y_TIMES) {
    console.log(`${where}: axe took ${Date.now() - analyzing} ms`);
    const milder = violations.filter((v) => !FAILING.has(v.impact ?? '')).map((v) => `${v.id} (${v.impact}, ${v.nodes.length})`);
    if (milder.length > 0) console.log(`${where}: also ${milder.join(', ')}`);
  }
  for (const violation of violations) {
    if (!FAILING.has(violation.impact ?? '')) continue;
    const nodes = violation.nodes.filter((node) => !WRONG_FOR.some((wrong) => wrong.rule === violation.id && wrong.html.test(node.html)));
    if (nodes.length === 0) continue;
    lines.push(`${where}: ${violation.id} (${violation.impact}) ${violation.help} — ${violation.helpUrl}`);
    for (const node of nodes) {
      const summary = (node.failureSummary ?? '').replace(/\s+/g, ' ').trim();
      lines.push(`    ${node.target.join(' ')}  ${node.html.slice(0, 160)}\n      ${summary}`);
    }
  }
  return lines;
}

async function signIn(context: BrowserContext, baseUrl: string, email: string): Promise<Page> {
  const page = await context.newPage();
  await page.goto(`${baseUrl}/sign-in`);
  await page.getByRole('heading', { name: 'Sign in' }).waitFor();
  await page.getByLabel(/^E-mail/).fill(email);
  await page.getByLabel(/^Password/).fill(TEST_PASSWORD);
  await page.getByRole('button', { name: 'Sign in' }).tap();
  await page.waitForURL((url) => url.pathname !== '/sign-in');
  return page;
}

/** Opens each route once, waits until it shows, scans it, and gathers every failing violation. */
async function scanRoutes(page: Page, baseUrl: string, routes: Route[]): Promise<string[]> {
  const report: string[] = [];
  for (const { path, ready, then } of routes) {
    const opened = Date.now();
    await page.goto(`${baseUrl}${path}`);
    await ready(page);
    await page.waitForLoadState('networkidle');
    const started = Date.now();
    report.push(...(await scan(page, path)));
    if (then) {
      await then.act(page);
      report.push(...(await scan(page, `${path} (${then.label})`, then.within)));
    }
    // A11Y_TIMES=1 prints where the time goes (the page, or axe).
    if (process.env.A11Y_TIMES) console.log(`${path}: shown in ${started - opened} ms, scanned in ${Date.now() - started} ms`);
  }
  return report;
}

async function uploadPhoto(baseUrl: string, email: string, jobId: string, version: number, runId: string): Promise<void> {
  const signIn = await fetch(`${baseUrl}/api/auth/sign-in`, {
    method: 'POST',
    headers: { 'Content-Type': 'application/json' },
    body: JSON.stringify({ email, password: TEST_PASSWORD }),
  });
  const { accessToken } = (await signIn.json()) as { accessToken: string };
  const form = new FormData();
  form.append('target', JSON.stringify({ type: 'run', id: runId }));
  form.append('caption', 'Trench at the patio corner, before backfill');
  form.append('files', new Blob([new Uint8Array(await makeFieldPhoto({ width: 800, height: 600 }))], { type: 'image/jpeg' }), 'trench.jpg');
  const res = await fetch(`${baseUrl}/api/jobs/${jobId}/photos`, {
    method: 'POST',
    headers: { Authorization: `Bearer ${accessToken}`, 'If-Match': `"${version}"` },
    body: form,
  });
  if (res.status >= 300) throw new Error(`photo upload → ${res.status} ${await res.text()}`);
}

/** Marks the form a button opened, for a scan of that form alone. */
const FORM_OPENED = '[data-axe-scope="opened"]';

/** The new-record form a section opens in place, scanned open too: most of the lead's typing happens there. */
const NEW_RECORD_FORMS: Record<string, Route['then']> = {
  runs: { label: 'new run form', within: FORM_OPENED, act: (p) => openForm(p, 'Add run', 'Name') },
  equipment: { label: 'new equipment form', within: FORM_OPENED, act: (p) => openForm(p, 'Add equipment', 'Name') },
  checks: { label: 'new check form', within: FORM_OPENED, act: (p) => openForm(p, 'Add check', 'Reading') },
};

async function openForm(page: Page, button: string, field: string): Promise<void> {
  await page.getByRole('button', { name: button, exact: true }).tap();
  const input = page.getByLabel(new RegExp(`^${field}`)).first();
  await input.waitFor();
  const marked = await input.evaluate((element) => {
    const form = element.closest('form');
    form?.setAttribute('data-axe-scope', 'opened');
    return form !== null;
  });
  if (!marked) throw new Error(`the ${field} field that ${button} opened is not in a form`);
}

describe('accessibility scan (axe-core) of the lead’s and the homeowner’s pages on a phone (issue 17)', () => {
  const baseUrl = inject('baseUrl');
  let browser: Browser;
  let company: TestCompany;
  let jobId: string;
  let packetSiteId: string;
  let locatePath: string;

  beforeAll(async () => {
    browser = await launchChromium();
    company = await createCompany('Axe Scan');
    const office = (await httpApiAs(baseUrl, company.users.office)) as unknown as Api;
    const lead = (await httpApiAs(baseUrl, company.users.lead)) as unknown as Api;

    // The lead's job in hand: the demo yard's whole as-built (every section has rows) and a photo.
    const { siteId } = await createSite(office, DEMO_AS_BUILT.site);
    const created = await createJob(office, siteId, { crewLeadUserId: company.users.lead.id });
    const recorded = await recordAsBuilt(lead, created, DEMO_AS_BUILT);
    const inHand = await moveJob(lead, { ...created, version: recorded.version }, 'in_progress');
    const runId = recorded.ids.get(DEMO_AS_BUILT.runs[0]!.id)!;
    await uploadPhoto(baseUrl, company.users.lead.email, inHand.id, inHand.version, runId);
    jobId = inHand.id;

    // The homeowner's property: another site with an issued packet, and a locate link to it.
    ({ siteId: packetSiteId } = await createSite(office, DEMO_AS_BUILT.site));
    await office.expectOk('post', `/api/sites/${packetSiteId}/homeowners`, { userId: company.users.homeowner.id });
    const packetJob = await createJob(office, packetSiteId, { crewLeadUserId: company.users.lead.id });
    const packetRecorded = await recordAsBuilt(lead, packetJob, DEMO_AS_BUILT);
    const ready = await moveJob(office, await moveJob(lead, { ...packetJob, version: packetRecorded.version }, 'in_progress', 'submitted'), 'ready_to_issue');
    await issueAndWaitForPacket(office, ready);
    const link = await office.expectOk('post', `/api/sites/${packetSiteId}/locate-links`, { expiresInDays: 7, note: 'Fence crew' });
    locatePath = new URL(link.url as string).pathname;
  }, 180_000);

  afterAll(async () => {
    await browser?.close();
  });

  it('should find no serious or critical violation on any page the crew lead uses', async () => {
    const context = await browser.newContext(PHONE);
    const page = await signIn(context, baseUrl, company.users.lead.email);
    const heading = (name: string) => (p: Page) => p.getByRole('heading', { name, exact: true }).waitFor();
    const openMenu = {
      label: 'menu open',
      within: '[role="dialog"]',
      act: async (p: Page) => {
        await p.getByRole('button', { name: 'Open menu' }).tap();
        await p.getByRole('dialog', { name: 'Menu' }).waitFor();
      },
    };
    const report = await scanRoutes(page, baseUrl, [
      { path: '/', ready: heading('Today'), then: openMenu },
      { path: '/jobs', ready: heading('Jobs') },
      { path: `/jobs/${jobId}`, ready: (p) => p.getByRole('tablist', { name: 'Parts of the as-built' }).waitFor() },
      ...SECTIONS.map((section) => ({
        path: `/jobs/${jobId}?section=${section}`,
        ready: (p: Page) => p.getByRole('tablist', { name: 'Parts of the as-built' }).waitFor(),
        then: NEW_RECORD_FORMS[section],
      })),
      { path: `/jobs/${jobId}/plan`, ready: (p) => p.getByRole('toolbar', { name: 'Plan tools' }).waitFor() },
      { path: `/jobs/${jobId}/drawings`, ready: (p) => p.getByRole('img').first().waitFor() },
      { path: '/settings', ready: (p) => p.getByRole('heading').first().waitFor() },
    ]);
    await context.close();
    expect(report, `\n${report.join('\n')}`).toEqual([]);
  }, 300_000);

  it('should find no serious or critical violation on the homeowner’s pages, the public locate view and the sign-in page', async () => {
    const context = await browser.newContext(PHONE);
    const page = await signIn(context, baseUrl, company.users.homeowner.email);
    const report = await scanRoutes(page, baseUrl, [
      { path: '/portal', ready: (p) => p.getByRole('heading', { name: 'My property', exact: true }).waitFor() },
      { path: `/portal/sites/${packetSiteId}`, ready: (p) => p.getByRole('list', { name: 'Handover packets' }).getByText(/revision 1/).waitFor() },
    ]);
    await context.close();
    // The locate view is opened by a stranger's phone, signed out.
    const stranger = await browser.newContext(PHONE);
    const phone = await stranger.newPage();
    report.push(...(await scanRoutes(phone, baseUrl, [{ path: locatePath, ready: (p) => p.locator('[data-testid="locate-map"] [data-label]').first().waitFor() }])));
    // The sign-in page is a page of its own without Fluent UI (web/sign-in.html): its notice, and its
    // field errors and error bar after a refused attempt.
    report.push(
      ...(await scanRoutes(phone, baseUrl, [
        {
          path: '/sign-in?expired=1',
          ready: (p) => p.getByText('Your session ended. Sign in again to carry on where you were.').waitFor(),
          then: {
            label: 'refused, then empty boxes sent',
            within: 'main',
            act: async (p: Page) => {
              await p.getByLabel(/^E-mail/).fill('nobody@scan.example');
              await p.getByLabel(/^Password/).fill('not-the-password');
              await p.getByRole('button', { name: 'Sign in' }).tap();
              await p.getByText(/do not match an account/).waitFor();
              await p.getByLabel(/^Password/).fill('');
              await p.getByRole('button', { name: 'Sign in' }).tap();
              await p.getByText('Enter your password.').waitFor();
            },
          },
        },
      ])),
    );
    await stranger.close();
    expect(report, `\n${report.join('\n')}`).toEqual([]);
  }, 180_000);

  it('should report a nameless button, faint text and a hidden link, but not Fluent’s focus guards (the scan can fail)', async () => {
    const context = await browser.newContext(PHONE);
    const page = await context.newPage();
    await page.setContent(
      '<html lang="en"><head><title>Sample</title></head><body><main><h1>Sample</h1><button style="width:48px;height:48px"><svg width="16" height="16"></svg></button><p style="color:#c8c8c8;background:#fff">Faint words</p><div aria-hidden="true"><a href="#top">Hidden link</a></div><i tabindex="0" role="none" data-tabster-dummy="" aria-hidden="true"></i></main></body></html>',
    );
    const report = await scan(page, 'sample');
    await context.close();
    expect(report.filter((line) => !line.startsWith(' ')).map((line) => line.split(' ')[1])).toEqual(['aria-hidden-focus', 'button-name', 'color-contrast']);
    expect(report.join('\n')).toContain('Hidden link');
    expect(report.join('\n')).not.toContain('tabster');
  }, 60_000);
});
