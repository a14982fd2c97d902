import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';

import { DEMO_AS_BUILT } from '../../api/src/domain/as-built/demo-as-built.js';
import { launchChromium } from '../support/browser.js';
import { createCompany, TEST_PASSWORD, type TestCompany } from '../support/fixtures.js';
import { httpApiAs } from '../support/http-api.js';
import { waitForMail } from '../support/mail.js';
import { type Api, createJob, createSite, issueAndWaitForPacket, moveJob, recordAsBuilt } from '../support/records.js';

const PHONE = { width: 390, height: 844 };
const DESK = { width: 1280, height: 800 };

async function signIn(page: Page, email: string): Promise<void> {
  await page.getByRole('heading', { name: 'Sign in' }).waitFor();
  await page.getByLabel(/^E-mail/).fill(email);
  await page.getByLabel(/^Password/).fill(TEST_PASSWORD);
  await page.getByRole('button', { name: 'Sign in' }).click();
}

/** The portal link of the packet e-mail (text part, else HTML). */
function portalLinkOf(mail: { text: string | null; html: string | null }, siteId: string): string {
  const pattern = new RegExp(`https?://[^\\s"'<>]+/portal/sites/${siteId}`);
  const match = (mail.text ?? '').match(pattern) ?? (mail.html ?? '').match(pattern);
  if (!match) throw new Error('no portal link in the packet e-mail');
  return match[0];
}

describe('delivery: the office sends the packet, the homeowner shares a locate link, a contractor opens it', () => {
  const baseUrl = inject('baseUrl');
  let browser: Browser;
  let company: TestCompany;
  let siteId: string;
  let jobId: string;
  let revisionId: string;

  beforeAll(async () => {
    browser = await launchChromium();
    company = await createCompany('Delivery Flow');
    const office = (await httpApiAs(baseUrl, company.users.office)) as unknown as Api;
    const lead = (await httpApiAs(baseUrl, company.users.lead)) as unknown as Api;
    ({ siteId } = await createSite(office, DEMO_AS_BUILT.site));
    await office.expectOk('post', `/api/sites/${siteId}/homeowners`, { userId: company.users.homeowner.id });
    const created = await createJob(office, siteId, { crewLeadUserId: company.users.lead.id });
    const recorded = await recordAsBuilt(lead, created, DEMO_AS_BUILT);
    const submitted = await moveJob(lead, { ...created, version: recorded.version }, 'in_progress', 'submitted');
    const ready = await moveJob(office, submitted, 'ready_to_issue');
    revisionId = await issueAndWaitForPacket(office, ready);
    jobId = ready.id;
  }, 180_000);

  afterAll(async () => {
    await browser?.close();
  });

  it('should let the office send the issued packet from the job page, see it sent, and find the e-mail in the Outbox', async () => {
    const context = await browser.newContext({ viewport: DESK });
    const page = await context.newPage();
    const errors: string[] = [];
    page.on('pageerror', (error) => errors.push(error.message));
    await page.goto(`${baseUrl}/jobs/${jobId}`);
    await signIn(page, company.users.office.email);
    await page.waitForURL(`**/jobs/${jobId}`);

    // The ready revision offers Send to homeowner; the dialog starts with the site's homeowner ticked.
    const revision = page.getByRole('listitem', { name: 'Revision 1' });
    await revision.getByText(/^Ready/).waitFor({ timeout: 30_000 });
    await revision.getByRole('button', { name: 'Send to homeowner' }).click();
    const dialog = page.getByRole('dialog');
    const homeowner = dialog.getByRole('checkbox', { name: company.users.homeowner.email });
    await homeowner.waitFor();
    expect(await homeowner.isChecked()).toBe(true);
    // A second address with no account: invited to the portal in the same e-mail.
    const newOwner = `second.owner.${Date.now()}@delivery-flow.example`;
    await dialog.getByRole('textbox', { name: 'Another address' }).fill(newOwner);
    await dialog.getByRole('button', { name: 'Add' }).click();
    await dialog.getByRole('textbox', { name: /Message/ }).fill('Thank you for having us in your garden.');
    await dialog.getByRole('button', { name: 'Send to 2 recipients' }).click();
    await dialog.waitFor({ state: 'detached' });

    // Each recipient's e-mail goes queued → sending → sent, with its time.
    const log = page.getByRole('list', { name: 'E-mails to the homeowner' });
    for (const to of [company.users.homeowner.email, newOwner]) {
      await log.getByRole('listitem', { name: `E-mail to ${to}` }).getByRole('status').filter({ hasText: /^Sent / }).waitFor({ timeout: 30_000 });
    }
    await log.getByRole('listitem', { name: `E-mail to ${newOwner}` }).getByText(/with an invitation to the portal/).waitFor();

    // The Outbox has the e-mail, with the PDF attached and the invitation link.
    await page.goto(`${baseUrl}/outbox`);
    const message = page.getByRole('list', { name: 'Captured messages' }).getByRole('link').filter({ hasText: `To ${newOwner}` });
    await message.filter({ hasText: /Your handover packet from/ }).first().click();
    await page.getByRole('button', { name: /^Download .+\.pdf$/ }).waitFor();
    await page.getByText(/\/accept-invitation\?token=/).first().waitFor();
    // The message as formatted shows in a sandboxed frame.
    await page.frameLocator('iframe[title="The message as formatted"]').getByText('Thank you for having us in your garden.').first().waitFor();

    expect(errors).toEqual([]);
    await context.close();
    // Generous: on two cores shared with other suites each page and the send queue are slow.
  }, 180_000);

  it('should carry the e-mail link to the portal, and a locate link to a phone until it is revoked', async () => {
    // The office sends the ready packet to the site's homeowner.
    const office = (await httpApiAs(baseUrl, company.users.office)) as unknown as Api;
    const sent = await office.send('post', `/api/packets/${revisionId}/send`, {});
    expect(sent.status, JSON.stringify(sent.body)).toBe(202);
    const mail = await waitForMail(company.users.homeowner.email, { timeoutMs: 30_000 });
    const portalLink = portalLinkOf(mail, siteId);

    // The homeowner follows the link, signs in, and lands on the site's page.
    const homeContext = await browser.newContext();
    const home = await homeContext.newPage();
    const errors: string[] = [];
    home.on('pageerror', (error) => errors.push(error.message));
    await home.goto(portalLink.replace(/^https?:\/\/[^/]+/, baseUrl));
    await signIn(home, company.users.homeowner.email);
    await home.waitForURL(`**/portal/sites/${siteId}`);
    await home.getByRole('list', { name: 'Handover packets' }).getByText(/revision 1/).waitFor();
    await home.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'My property' }).waitFor();

    // …and makes a locate link for the fence crew; its URL is shown once.
    await home.getByRole('button', { name: 'New locate link' }).click();
    const dialog = home.getByRole('dialog');
    await dialog.getByRole('spinbutton', { name: /Works for/ }).fill('7');
    await dialog.getByRole('textbox', { name: /Note/ }).fill('Fence crew, north side');
    await dialog.getByRole('button', { name: 'Create link' }).click();
    const urlField = dialog.getByRole('textbox', { name: 'New locate link' });
    await urlField.waitFor();
    const locateUrl = await urlField.inputValue();
    expect(locateUrl).toMatch(/\/locate\/[A-Za-z0-9_-]{43}$/);
    await dialog.getByRole('button', { name: 'Done' }).click();
    const links = home.getByRole('list', { name: 'Locate links' });
    await links.getByRole('listitem').filter({ hasText: 'Fence crew, north side' }).waitFor();

    // A contractor's phone, signed out, opens the link: cautions, the map with depths, the runs.
    const phoneContext = await browser.newContext({ viewport: PHONE, hasTouch: true, isMobile: true });
    const phone = await phoneContext.newPage();
    const contractorUrl = locateUrl.replace(/^https?:\/\/[^/]+/, baseUrl);
    await phone.goto(contractorUrl);
    await phone.getByRole('heading', { name: 'Before you dig' }).waitFor();
    await phone.getByText(/one-call locators do not mark them/).waitFor();
    await phone.getByText(/Hand-dig within .+ of any line on this map/).waitFor();
    const map = phone.getByRole('img', { name: /Site plan/ });
    await map.waitFor();
    expect(await map.locator('text').filter({ hasText: /\bmin \d/ }).count()).toBeGreaterThan(0);
    expect(await phone.getByRole('navigation', { name: 'Main' }).count()).toBe(0);
    const firstRun = phone.getByRole('button', { name: /min \d/ }).first();
    await firstRun.click();
    await phone.getByRole('img', { name: /^Depth profile of / }).waitFor();
    // The cautions come before the map on a phone.
    const cautionsTop = (await phone.getByRole('heading', { name: 'Before you dig' }).boundingBox())!.y;
    expect(cautionsTop).toBeLessThan((await map.boundingBox())!.y);

    // The homeowner revokes the link (after confirming); the same URL then shows the expired page.
    await home.reload();
    const row = home.getByRole('list', { name: 'Locate links' }).getByRole('listitem').filter({ hasText: 'Fence crew, north side' });
    await row.getByText(/Opened [1-9]\d* time/).waitFor();
    await row.getByRole('button', { name: 'Revoke' }).click();
    await home.getByRole('alertdialog').getByRole('button', { name: 'Revoke' }).click();
    await row.getByText('revoked', { exact: true }).waitFor();

    const later = await phoneContext.newPage();
    await later.goto(contractorUrl);
    await later.getByRole('heading', { name: 'This link no longer works' }).waitFor();
    await later.getByText(/Ask the homeowner for a new one/).waitFor();
    expect(await later.getByRole('img').count()).toBe(0);
    expect(await later.getByText('Before you dig').count()).toBe(0);

    expect(errors).toEqual([]);
    await homeContext.close();
    await phoneContext.close();
  });
});
