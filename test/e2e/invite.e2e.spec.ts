import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';

import { launchChromium } from '../support/browser.js';
import { createCompany, TEST_PASSWORD, type TestCompany } from '../support/fixtures.js';
import { findLink, waitForMail } from '../support/mail.js';

const PHONE = { width: 375, height: 812 };
const DESKTOP = { width: 1280, height: 800 };

async function signInThroughForm(page: Page, email: string, password = TEST_PASSWORD): Promise<void> {
  await page.getByRole('heading', { name: 'Sign in' }).waitFor();
  await page.getByLabel(/^E-mail/).fill(email);
  await page.getByLabel(/^Password/).fill(password);
  await page.getByRole('button', { name: 'Sign in' }).click();
}

describe('invitations and sessions in the browser', () => {
  const baseUrl = inject('baseUrl');
  let browser: Browser;
  let company: TestCompany;

  beforeAll(async () => {
    browser = await launchChromium();
    company = await createCompany('Invite Flow');
  });

  afterAll(async () => {
    await browser.close();
  });

  it('should let an admin invite a crew lead who follows the e-mailed link and lands signed in', async () => {
    const admin = company.users.admin;
    const inviteeEmail = `crew.lead.${company.id.slice(0, 8)}@invite-flow.example`;

    // The admin opens Users, is asked to sign in first, and comes back to Users.
    const adminContext = await browser.newContext({ viewport: DESKTOP });
    const adminPage = await adminContext.newPage();
    await adminPage.goto(`${baseUrl}/users`);
    await signInThroughForm(adminPage, admin.email);
    await adminPage.getByRole('heading', { name: 'Users', exact: true }).waitFor();
    expect(new URL(adminPage.url()).pathname).toBe('/users');

    await adminPage.getByRole('button', { name: 'Invite someone' }).click();
    const dialog = adminPage.getByRole('dialog', { name: 'Invite someone' });
    await dialog.getByLabel(/^E-mail/).fill(inviteeEmail);
    await dialog.getByRole('radio', { name: /^Crew lead/ }).check();
    await dialog.getByRole('button', { name: 'Send invitation' }).click();
    await adminPage.getByText('Invitation sent', { exact: true }).waitFor();
    await adminPage.getByRole('list', { name: 'Waiting invitations' }).getByText(inviteeEmail).waitFor();
    await adminContext.close();

    // The invitation reaches the local SMTP server with a single-use link.
    const mail = await waitForMail(inviteeEmail);
    const link = findLink(mail, '/accept-invitation');
    expect(new URL(link).origin).toBe(baseUrl);

    // The crew lead follows it on a phone, sets a name and password, and is signed in.
    const leadContext = await browser.newContext({ viewport: PHONE });
    const leadPage = await leadContext.newPage();
    await leadPage.goto(link);
    await leadPage.getByRole('heading', { name: `Join ${company.name}` }).waitFor();
    const summary = leadPage.getByRole('definition');
    await expect.poll(() => summary.allTextContents()).toEqual([company.name, inviteeEmail, 'Crew lead']);

    await leadPage.getByLabel('Your name').fill('Marlo Quint');
    await leadPage.getByLabel(/^Password/).fill('trench-and-conduit-42');
    await leadPage.getByLabel('Type the password again').fill('trench-and-conduit-42');
    await leadPage.getByRole('button', { name: 'Join and sign in' }).click();

    await leadPage.getByRole('heading', { name: 'Today' }).waitFor();
    expect(new URL(leadPage.url()).pathname).toBe('/');
    await leadPage.getByRole('button', { name: 'Account: Marlo Quint' }).waitFor();

    // The link worked once; opening it again explains that it no longer works.
    await leadPage.goto(link);
    await leadPage.getByRole('heading', { name: 'This invitation link no longer works' }).waitFor();
    await leadContext.close();
  });

  it('should keep the session through a reload (silent refresh from the cookie)', async () => {
    const context = await browser.newContext({ viewport: PHONE });
    const page = await context.newPage();
    await page.goto(`${baseUrl}/sign-in`);
    await signInThroughForm(page, company.users.office.email);
    await page.getByRole('heading', { name: 'Work queue' }).waitFor();

    const refreshes: number[] = [];
    page.on('response', (response) => {
      if (response.url().endsWith('/api/auth/refresh')) refreshes.push(response.status());
    });
    await page.reload();

    await page.getByRole('heading', { name: 'Work queue' }).waitFor();
    await page.getByRole('button', { name: `Account: ${company.users.office.name}` }).waitFor();
    expect(new URL(page.url()).pathname).toBe('/');
    expect(refreshes).toEqual([200]);
    // The access token lives in memory only.
    const stored = await page.evaluate(() => JSON.stringify({ ...localStorage }) + JSON.stringify({ ...sessionStorage }));
    expect(stored).not.toMatch(/ey[\w-]+\.[\w-]+\./);
    await context.close();
  });

  it('should send a signed-out visitor of a protected address to sign-in and back after', async () => {
    const context = await browser.newContext({ viewport: DESKTOP });
    const page = await context.newPage();
    await page.goto(`${baseUrl}/users?from=bookmark`);

    await page.waitForURL((url) => url.pathname === '/sign-in');
    expect(new URL(page.url()).searchParams.get('next')).toBe('/users?from=bookmark');
    await signInThroughForm(page, company.users.admin.email);

    await page.getByRole('heading', { name: 'Users', exact: true }).waitFor();
    const url = new URL(page.url());
    expect(`${url.pathname}${url.search}`).toBe('/users?from=bookmark');

    // Signed in, the sign-in page (a page of its own) sends the visitor straight on to `next`.
    await page.goto(`${baseUrl}/sign-in?${new URLSearchParams({ next: '/users?from=sign-in' })}`);
    await page.waitForURL((u) => u.pathname === '/users' && u.search === '?from=sign-in');
    await page.getByRole('heading', { name: 'Users', exact: true }).waitFor();

    // Signing out ends the session: the protected page sends the visitor to sign-in again.
    await page.getByRole('button', { name: `Account: ${company.users.admin.name}` }).click();
    await page.getByRole('menuitem', { name: 'Sign out' }).click();
    await page.waitForURL((u) => u.pathname === '/sign-in');
    await page.goto(`${baseUrl}/users`);
    await page.waitForURL((u) => u.pathname === '/sign-in');
    await context.close();
  });
});
