import { chromium, type Browser, type BrowserContext, type Page } from 'playwright-core';
import sharp from 'sharp';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { chromiumLaunchOptions } from '../support/browser.js';
import { httpApiAs } from '../support/http-api.js';
import { npmStart, type StartedApp } from './support/npm-start.js';

// A whole contractor's first day on a fresh `npm start` (issue 14): no demo company, no mail service,
// NODE_ENV=production. Every e-mail is read from where this server keeps it (the sign-up page's captured
// message, then the Outbox API as the signed-in admin), so the walk stops at the first e-mail when mail
// does not work under production settings (the capture server off without SMTP_URL).

const PHONE = { viewport: { width: 390, height: 844 }, hasTouch: true, isMobile: true };
const DESK = { viewport: { width: 1280, height: 800 } };

// Invented company, people and addresses (example.test domains).
const COMPANY = 'Quillwort Garden Sound';
const ADMIN = { name: 'Ardith Venn', email: 'ardith@quillwort-sound.example', password: 'buried-cable-orange-71' };
const COMPANY_MAIL = 'office@quillwort-sound.example';
const COMPANY_PHONE = '+1 555 0142 0199';
const LEAD = { name: 'Tobin Marsh', email: 'tobin@quillwort-sound.example', password: 'trench-depth-check-52' };
const HOMEOWNER = { name: 'Perpetua Hollin', email: 'perpetua.hollin@homeowner.example', password: 'my-garden-speakers-88' };

type Api = Awaited<ReturnType<typeof httpApiAs>>;

interface OutboxMessage {
  id: string;
  from: string;
  to: string[];
  subject: string;
  text: string | null;
  html: string | null;
  headers: Record<string, string>;
  attachments: { id: string; filename: string; contentType: string; sizeBytes: number }[];
}

/** The newest Outbox message to `to` whose subject matches, read through the API as the signed-in admin. */
async function outboxMail(admin: Api, to: string, subject: RegExp, timeoutMs = 120_000): Promise<OutboxMessage> {
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    const list = await admin.expectOk('get', '/api/outbox?pageSize=100');
    const summary = (list.items as { id: string; to: string[]; subject: string }[]).find(
      (m) => m.to.some((address) => address.toLowerCase() === to.toLowerCase()) && subject.test(m.subject),
    );
    if (summary) return (await admin.expectOk('get', `/api/outbox/${summary.id}`)) as OutboxMessage;
    if (Date.now() > deadline) throw new Error(`no e-mail to ${to} matching ${subject} in the Outbox within ${timeoutMs / 1000} s`);
    await new Promise((resolve) => setTimeout(resolve, 500));
  }
}

/** The first link to `path` (with its query) in a message, moved onto this server's origin. */
function linkIn(message: Pick<OutboxMessage, 'text' | 'html'>, path: string, baseUrl: string): string {
  const pattern = new RegExp(`https?://[^\\s"'<>]+${path.replace(/[.*+?^${}()|[\]\\/]/g, '\\$&')}[^\\s"'<>]*`);
  const match = (message.text ?? '').match(pattern) ?? (message.html ?? '').replace(/&amp;/g, '&').match(pattern);
  if (!match) throw new Error(`no ${path} link in the e-mail`);
  const url = new URL(match[0]);
  expect(url.origin, 'links in e-mails point to the server npm start printed').toBe(baseUrl);
  return match[0];
}

async function confirm(page: Page, name: string): Promise<void> {
  await page.getByRole('alertdialog').getByRole('button', { name }).click();
  await page.getByRole('alertdialog').waitFor({ state: 'detached' });
}

/** Fails the step with the page's own errors. */
function watchErrors(page: Page): string[] {
  const errors: string[] = [];
  page.on('pageerror', (error) => errors.push(error.message));
  return errors;
}

describe('journey: from a fresh npm start to a packet in the homeowner portal', () => {
  let app: StartedApp;
  let browser: Browser;
  const contexts: BrowserContext[] = [];
  let baseUrl: string;

  beforeAll(async () => {
    // One cluster, one server, one browser for the whole walk.
    [app, browser] = await Promise.all([npmStart(), chromium.launch(chromiumLaunchOptions())]);
    baseUrl = app.baseUrl;
  }, 660_000);

  afterAll(async () => {
    for (const context of contexts) await context.close().catch(() => undefined);
    await browser?.close();
    await app?.stop();
  }, 180_000);

  async function newPage(options: object): Promise<Page> {
    const context = await browser.newContext(options);
    contexts.push(context);
    const page = await context.newPage();
    page.setDefaultTimeout(60_000);
    return page;
  }

  it('should carry a new company from sign-up to a delivered packet the homeowner opens in the portal', async () => {
    // npm start on an empty database says where mail goes and where the first company is created.
    expect(app.output()).toContain('mail is captured locally: read it on the Outbox page');
    expect(app.output()).toContain(`no company exists yet: create the first one at ${baseUrl}/sign-up`);
    expect(app.output()).toContain('demo seed skipped: LOAMLINE_SEED_DEMO=0');

    // 1. Create a company on the sign-up page; the verification e-mail is captured and shown there.
    const office = await newPage(DESK);
    const officeErrors = watchErrors(office);
    await office.goto(`${baseUrl}/sign-in`);
    // The empty server points the first visitor to sign-up.
    await office.getByText('No company exists on this server yet.').waitFor();
    await office.getByRole('link', { name: 'Create the first company' }).click();
    await office.waitForURL('**/sign-up');
    await office.getByLabel(/^Company name/).fill(COMPANY);
    await office.getByLabel(/^Your name/).fill(ADMIN.name);
    await office.getByLabel(/^E-mail/).fill(ADMIN.email);
    await office.getByLabel(/^Password/).fill(ADMIN.password);
    await office.getByLabel(/^Type the password again/).fill(ADMIN.password);
    await office.getByRole('button', { name: 'Create the company' }).click();
    const captured = office.getByRole('region', { name: 'The message, as this server captured it' });
    await captured.getByRole('link', { name: 'Confirm and create the company' }).click({ timeout: 120_000 });

    // 2. Following the link creates the company and its admin, signed in.
    await office.getByRole('button', { name: `Account: ${ADMIN.name}` }).waitFor({ timeout: 60_000 });
    const admin = await httpApiAs(baseUrl, ADMIN, ADMIN.password);

    // 3. Company profile: logo (a PNG drawn here), phone and the e-mail replies go to.
    const logo = await sharp({ create: { width: 240, height: 96, channels: 3, background: { r: 250, g: 120, b: 20 } } })
      .png()
      .toBuffer();
    await office.goto(`${baseUrl}/settings`);
    const profile = office.getByRole('form', { name: 'Company profile' });
    await profile.getByTestId('logo-input').setInputFiles({ name: 'quillwort-logo.png', mimeType: 'image/png', buffer: logo });
    await profile.getByRole('img', { name: /logo$/ }).waitFor();
    await profile.getByLabel(/^Phone/).fill(COMPANY_PHONE);
    await profile.getByLabel(/^E-mail/).fill(COMPANY_MAIL);
    await profile.getByRole('button', { name: 'Save company profile' }).click();
    await expect.poll(async () => (await admin.expectOk('get', '/api/company/profile')).phone, { timeout: 30_000 }).toBe(COMPANY_PHONE);
    const saved = await admin.expectOk('get', '/api/company/profile');
    expect(saved.email).toBe(COMPANY_MAIL);
    expect(saved.logo).toBeTruthy();

    // 4. Invite a crew lead; the invitation arrives in the Outbox and is accepted on the lead's phone.
    await office.goto(`${baseUrl}/users`);
    await office.getByRole('button', { name: 'Invite someone' }).click();
    const invite = office.getByRole('dialog', { name: 'Invite someone' });
    await invite.getByLabel(/^E-mail/).fill(LEAD.email);
    await invite.getByRole('radio', { name: /^Crew lead/ }).check();
    await invite.getByRole('button', { name: 'Send invitation' }).click();
    await office.getByRole('list', { name: 'Waiting invitations' }).getByText(LEAD.email).waitFor();
    const invitation = await outboxMail(admin, LEAD.email, /./);
    const phone = await newPage(PHONE);
    const phoneErrors = watchErrors(phone);
    await phone.goto(linkIn(invitation, '/accept-invitation', baseUrl));
    await phone.getByRole('heading', { name: `Join ${COMPANY}` }).waitFor();
    await phone.getByLabel('Your name').fill(LEAD.name);
    await phone.getByLabel(/^Password/).fill(LEAD.password);
    await phone.getByLabel('Type the password again').fill(LEAD.password);
    await phone.getByRole('button', { name: 'Join and sign in' }).click();
    await phone.getByRole('button', { name: `Account: ${LEAD.name}` }).waitFor();

    // 5. Customer, site and job with the lead assigned (through the API as the signed-in admin).
    const users = await admin.expectOk('get', '/api/users');
    const leadUser = ((Array.isArray(users) ? users : users.items) as { id: string; email: string }[]).find((u) => u.email === LEAD.email);
    expect(leadUser, 'the accepted lead is a user of the company').toBeTruthy();
    const customer = await admin.expectOk('post', '/api/customers', { name: HOMEOWNER.name, email: HOMEOWNER.email });
    const site = await admin.expectOk('post', '/api/sites', {
      customerId: customer.id,
      label: 'Back garden',
      addressLine1: '14 Marrowfield Close',
      city: 'Eastbrook Vale',
      postalCode: '00000',
      country: 'Testland',
    });
    const job = await admin.expectOk('post', '/api/jobs', { siteId: site.id, title: 'Patio speakers', crewLeadUserId: leadUser!.id });

    // 6. The lead records the equipment (API as the lead), then on the phone starts work, lays the run
    //    with a depth reading, and submits for review.
    const lead = await httpApiAs(baseUrl, LEAD, LEAD.password);
    let version: number = job.version;
    const write = async (path: string, body: object) => {
      const res = await lead.expectOk('post', `/api/jobs/${job.id}${path}`, body, { 'If-Match': `"${version}"` });
      version = res.jobVersion;
      return res;
    };
    await write('/items', {
      kind: 'amplifier',
      label: 'Shed amp',
      channels: [{ name: 'Patio' }],
      ratedWatts8Ohm: 60,
      ratedWatts4Ohm: 100,
      minimumImpedanceOhm: 4,
    });
    await write('/items', { kind: 'speaker', label: 'Patio rock speaker', nominalImpedanceOhm: 8 });

    await phone.goto(`${baseUrl}/jobs/${job.id}`);
    await phone.getByRole('button', { name: 'Start work' }).click();
    await confirm(phone, 'Start work');
    await phone.getByText('In progress', { exact: true }).first().waitFor();
    await phone.getByRole('button', { name: 'Add run' }).click();
    const runForm = phone.getByRole('form', { name: 'New run' });
    await runForm.getByLabel(/^Name/).fill('Patio trunk');
    await runForm.getByLabel(/^From/).selectOption({ label: 'Shed amp (amplifier)' });
    await runForm.getByLabel(/^To/).selectOption({ label: 'Patio rock speaker (speaker)' });
    await runForm.getByLabel(/^Cable type/).fill('14/2 direct burial');
    await runForm.getByLabel(/^Gauge/).fill('14');
    await runForm.getByLabel(/^Measured length/).fill('12 m');
    await runForm.getByLabel('Pair 1 carries').selectOption({ label: 'Shed amp · Patio' });
    await runForm.getByRole('button', { name: 'Add run' }).click();
    const run = phone.getByRole('listitem', { name: 'Run Patio trunk' });
    await run.getByRole('button', { name: 'Add depth reading' }).click();
    await run.getByLabel('Station (from the start)').fill('6 m');
    await run.getByLabel('Cover depth').fill('20 cm');
    await run.getByRole('button', { name: 'Save reading' }).click();
    await expect.poll(() => run.getByRole('list', { name: 'Readings' }).getByRole('listitem').count(), { timeout: 30_000 }).toBe(1);
    await phone.getByRole('button', { name: 'Submit for review' }).click();
    await confirm(phone, 'Submit for review');
    await phone.getByText('Submitted for review', { exact: true }).first().waitFor();

    // 7. The office marks it ready and issues the packet; the PDF is rendered.
    await office.goto(`${baseUrl}/jobs/${job.id}`);
    await office.getByRole('button', { name: 'Mark ready to issue' }).click();
    await confirm(office, 'Mark ready to issue');
    await office.getByRole('button', { name: 'Issue packet' }).click();
    // The confirmation step lists open findings; this minimal record has no must-fix one.
    await office.getByRole('dialog').getByRole('button', { name: 'Issue revision' }).click();
    const revision = office.getByRole('listitem', { name: 'Revision 1' });
    await revision.getByText(/^Ready/).waitFor({ timeout: 180_000 });

    // 8. Send to homeowner: the customer's address, PDF attached; the delivery reaches "Sent".
    await revision.getByRole('button', { name: 'Send to homeowner' }).click();
    const dialog = office.getByRole('dialog');
    await dialog.getByRole('textbox', { name: 'Another address' }).fill(HOMEOWNER.email);
    await dialog.getByRole('button', { name: 'Add' }).click();
    await dialog.getByRole('button', { name: /^Send/ }).last().click();
    await dialog.waitFor({ state: 'detached' });
    await office
      .getByRole('list', { name: 'E-mails to the homeowner' })
      .getByRole('listitem', { name: `E-mail to ${HOMEOWNER.email}` })
      .getByRole('status')
      .filter({ hasText: /^Sent / })
      .waitFor({ timeout: 120_000 });

    // 9. The homeowner's e-mail: the PDF attached, the company as sender name, its e-mail as Reply-To.
    const packetMail = await outboxMail(admin, HOMEOWNER.email, /packet/i);
    expect(packetMail.from).toMatch(new RegExp(`^"?${COMPANY}"? <`));
    const replyTo = Object.entries(packetMail.headers).find(([name]) => name.toLowerCase() === 'reply-to')?.[1];
    expect(replyTo).toContain(COMPANY_MAIL);
    const pdf = packetMail.attachments.find((a) => a.contentType === 'application/pdf');
    expect(pdf, JSON.stringify(packetMail.attachments)).toBeTruthy();
    const download = await fetch(`${baseUrl}/api/outbox/${packetMail.id}/attachments/${pdf!.id}`, {
      headers: { Authorization: `Bearer ${(await signInToken(baseUrl, ADMIN))}` },
    });
    expect(download.status).toBe(200);
    expect(Buffer.from(await download.arrayBuffer()).subarray(0, 5).toString('latin1')).toBe('%PDF-');

    // 10. The homeowner follows the invitation in the e-mail, sets a password, and sees the packet.
    const home = await newPage(PHONE);
    const homeErrors = watchErrors(home);
    await home.goto(linkIn(packetMail, '/accept-invitation', baseUrl));
    await home.getByLabel('Your name').fill(HOMEOWNER.name);
    await home.getByLabel(/^Password/).fill(HOMEOWNER.password);
    await home.getByLabel('Type the password again').fill(HOMEOWNER.password);
    await home.getByRole('button', { name: 'Join and sign in' }).click();
    await home.getByRole('button', { name: `Account: ${HOMEOWNER.name}` }).waitFor();
    await home.goto(linkIn(packetMail, `/portal/sites/${site.id}`, baseUrl));
    await home.getByRole('list', { name: 'Handover packets' }).getByText(/revision 1/).waitFor();
    await home.getByText(COMPANY).first().waitFor();

    expect({ officeErrors, phoneErrors, homeErrors }).toEqual({ officeErrors: [], phoneErrors: [], homeErrors: [] });
    // Generous: a cold PDF render and a dozen page loads on two loaded cores.
  }, 900_000);
});

async function signInToken(baseUrl: string, user: { email: string; password: string }): Promise<string> {
  const res = await fetch(`${baseUrl}/api/auth/sign-in`, {
    method: 'POST',
    headers: { 'Content-Type': 'application/json' },
    body: JSON.stringify({ email: user.email, password: user.password }),
  });
  if (res.status !== 200) throw new Error(`sign-in as ${user.email} → ${res.status}`);
  return ((await res.json()) as { accessToken: string }).accessToken;
}
