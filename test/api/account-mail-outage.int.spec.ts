import { createServer } from 'node:net';

import type { NestExpressApplication } from '@nestjs/platform-express';
import { simpleParser } from 'mailparser';
import { SMTPServer } from 'smtp-server';
import request from 'supertest';
import { afterAll, afterEach, describe, expect, it, vi } from 'vitest';

import { InvitationResponseSchema, type InvitationResponse } from '../../api/src/domain/auth/auth.schema.js';
import { createCompany, createUser, TEST_PASSWORD, withDb } from '../support/fixtures.js';
import { findToken } from '../support/mail.js';
import { bearer, signIn } from '../support/session.js';

// Invitation and password-reset e-mail go through the account-mail queue: an SMTP outage delays them
// without losing them, and the requests answer at once. ConfigModule reads the environment when
// AppModule is imported, so each describe re-imports the app (vi.resetModules) with its own settings.

/** A port nothing listens on yet (taken from the OS, then released); the SMTP server comes up there later. */
async function freePort(): Promise<number> {
  const server = createServer();
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
  const { port } = server.address() as { port: number };
  await new Promise<void>((resolve) => server.close(() => resolve()));
  return port;
}

async function startApp(env: Record<string, string>): Promise<NestExpressApplication> {
  Object.assign(process.env, { QUEUE_POLL_INTERVAL_SECONDS: '0.5', APP_URL: 'https://loamline.example', ...env });
  vi.resetModules();
  const { createTestApp } = await import('../support/test-app.js');
  return createTestApp();
}

interface Received {
  to: string[];
  subject: string;
  text: string | null;
  html: string | null;
}

/** Stands in for the mail service coming back: an SMTP server on the address the app was configured with. */
async function startSmtp(port: number, received: Received[]): Promise<SMTPServer> {
  const server = new SMTPServer({
    authOptional: true,
    disabledCommands: ['STARTTLS', 'AUTH'],
    logger: false,
    onData(stream, session, callback) {
      simpleParser(stream)
        .then((parsed) => {
          received.push({
            to: session.envelope.rcptTo.map((r) => r.address),
            subject: parsed.subject ?? '',
            text: parsed.text ?? null,
            html: typeof parsed.html === 'string' ? parsed.html : null,
          });
          callback();
        })
        .catch((error: Error) => callback(error));
    },
  });
  await new Promise<void>((resolve) => server.listen(port, '127.0.0.1', () => resolve()));
  return server;
}

async function stopSmtp(server: SMTPServer | undefined): Promise<void> {
  if (server) await new Promise<void>((resolve) => server.close(() => resolve()));
}

async function outgoing(to: string) {
  return withDb(async (db) => {
    const { rows } = await db.query<{ kind: string; status: string; attempts: number; last_error: string | null }>(
      'select kind, status, attempts, last_error from outgoing_mail where to_address = $1 order by created_at',
      [to],
    );
    return rows;
  });
}

async function waitUntil<T>(what: string, read: () => Promise<T>, done: (value: T) => boolean, timeoutMs = 45_000): Promise<T> {
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    const value = await read();
    if (done(value)) return value;
    if (Date.now() > deadline) throw new Error(`${what}: still ${JSON.stringify(value)}`);
    await new Promise((resolve) => setTimeout(resolve, 200));
  }
}

const mailTo = (received: Received[], to: string) => received.filter((m) => m.to.includes(to));

describe('account mail during an SMTP outage, then the server comes back', () => {
  let app: NestExpressApplication | undefined;
  let smtp: SMTPServer | undefined;
  const received: Received[] = [];

  afterAll(async () => {
    await app?.close();
    await stopSmtp(smtp);
  });

  it('should answer at once, keep both messages queued, and deliver each exactly once with working links', async () => {
    const port = await freePort();
    app = await startApp({ SMTP_URL: `smtp://127.0.0.1:${port}`, ACCOUNT_MAIL_RETRIES: '8', ACCOUNT_MAIL_RETRY_DELAY_SECONDS: '1' });
    const http = () => request(app!.getHttpServer());
    const company = await createCompany('Mail Outage');
    const admin = await signIn(app, company.users.admin);
    const member = await createUser(company.id, 'office');
    const inviteeEmail = `invitee.${company.id.slice(0, 8)}@mail-outage.example`;

    // SMTP is down: nothing listens on the configured port. Both requests still succeed.
    const invited = await http().post('/api/invitations').set(bearer(admin)).send({ email: inviteeEmail, role: 'tech', name: 'Ivo Tamsin' });
    expect(invited.status, JSON.stringify(invited.body)).toBe(201);
    expect(InvitationResponseSchema.parse(invited.body).mail).toMatchObject({ status: 'queued' });
    const reset = await http().post('/api/auth/password-reset').send({ email: member.email });
    const unknown = await http().post('/api/auth/password-reset').send({ email: `nobody.${company.id.slice(0, 8)}@mail-outage.example` });
    expect(reset.status).toBe(202);
    // An existing and an unknown account get the same answer, also while the mail server is down.
    expect({ status: unknown.status, body: unknown.body }).toEqual({ status: reset.status, body: reset.body });

    // The first attempts fail and the messages wait for their retries: not failed, not lost.
    for (const to of [inviteeEmail, member.email]) {
      const [row] = await waitUntil(`a failed first attempt to ${to}`, () => outgoing(to), (rows) => (rows[0]?.attempts ?? 0) >= 1 && rows[0]?.last_error !== null);
      expect(row).toMatchObject({ status: 'queued' });
      expect(row!.last_error).toMatch(/ECONNREFUSED|connect/i);
    }
    const list = await http().get('/api/invitations').set(bearer(admin)).expect(200);
    const waiting = (list.body as InvitationResponse[]).find((i) => i.email === inviteeEmail);
    expect(waiting?.mail).toMatchObject({ status: 'queued', sentAt: null });
    expect(waiting?.mail?.lastError).toMatch(/ECONNREFUSED|connect/i);

    // The mail service comes back on the same address.
    smtp = await startSmtp(port, received);
    for (const to of [inviteeEmail, member.email]) {
      await waitUntil(`delivery to ${to} after recovery`, () => outgoing(to), (rows) => rows[0]?.status === 'sent');
    }
    // Give a duplicate (a replayed queue message, a second worker) time to show up; there must be none.
    await new Promise((resolve) => setTimeout(resolve, 3000));
    const invitation = mailTo(received, inviteeEmail);
    const resetMail = mailTo(received, member.email);
    expect(invitation).toHaveLength(1);
    expect(resetMail).toHaveLength(1);
    expect(invitation[0]!.subject).toContain(company.name);
    expect(resetMail[0]!.subject).toBe('Reset your Loamline password');

    const afterRecovery = await http().get('/api/invitations').set(bearer(admin)).expect(200);
    expect((afterRecovery.body as InvitationResponse[]).find((i) => i.email === inviteeEmail)?.mail).toMatchObject({ status: 'sent', lastError: null });

    // The links work: the invitee joins, the member sets a new password and signs in with it.
    const invitationToken = findToken(invitation[0]!, '/accept-invitation');
    const accepted = await http().post('/api/auth/invitations/accept').send({ token: invitationToken, name: 'Ivo Tamsin', password: 'a-long-new-password' });
    expect(accepted.status, JSON.stringify(accepted.body)).toBe(200);
    expect(accepted.body.user).toMatchObject({ email: inviteeEmail, role: 'tech', companyId: company.id });

    const resetToken = findToken(resetMail[0]!, '/reset-password');
    await http().post('/api/auth/password-reset/confirm').send({ token: resetToken, password: 'brand-new-password' }).expect(204);
    await http().post('/api/auth/sign-in').send({ email: member.email, password: TEST_PASSWORD }).expect(401);
    await signIn(app, member, 'brand-new-password');
  }, 90_000);
});

describe('account mail that fails after every retry', () => {
  let app: NestExpressApplication | undefined;
  let smtp: SMTPServer | undefined;
  const received: Received[] = [];

  afterEach(async () => {
    await app?.close();
    await stopSmtp(smtp);
    app = undefined;
    smtp = undefined;
  });

  it('should show the invitation as not sent with the error, and send it with a new link on request', async () => {
    const port = await freePort();
    app = await startApp({ SMTP_URL: `smtp://127.0.0.1:${port}`, ACCOUNT_MAIL_RETRIES: '1', ACCOUNT_MAIL_RETRY_DELAY_SECONDS: '1' });
    const http = () => request(app!.getHttpServer());
    const company = await createCompany('Mail Given Up');
    const office = await signIn(app, company.users.office);
    const email = `late.${company.id.slice(0, 8)}@mail-given-up.example`;
    const created = await http().post('/api/invitations').set(bearer(office)).send({ email, role: 'lead' }).expect(201);

    // ACCOUNT_MAIL_RETRIES=1: the first attempt and one retry, then the message is marked failed.
    const failed = await waitUntil(
      'the invitation e-mail given up',
      async () => ((await http().get('/api/invitations').set(bearer(office)).expect(200)).body as InvitationResponse[]).find((i) => i.id === created.body.id),
      (i) => i?.mail?.status === 'failed',
    );
    expect(failed?.mail).toMatchObject({ status: 'failed', attempts: 2, sentAt: null });
    expect(failed?.mail?.lastError).toMatch(/ECONNREFUSED|connect/i);

    // Another company cannot resend it; a bad id names the field.
    const stranger = await signIn(app, (await createCompany('Mail Stranger')).users.admin);
    await http().post(`/api/invitations/${created.body.id}/resend`).set(bearer(stranger)).expect(404);
    await http().post('/api/invitations/not-a-uuid/resend').set(bearer(office)).expect(400);

    smtp = await startSmtp(port, received);
    const resent = await http().post(`/api/invitations/${created.body.id}/resend`).set(bearer(office));
    expect(resent.status, JSON.stringify(resent.body)).toBe(202);
    expect(resent.body.mail).toMatchObject({ status: 'queued', attempts: 0 });
    await waitUntil('the resent invitation', async () => mailTo(received, email), (mails) => mails.length > 0);

    const token = findToken(mailTo(received, email)[0]!, '/accept-invitation');
    const accepted = await http().post('/api/auth/invitations/accept').send({ token, name: 'Rena Holloway', password: 'a-long-new-password' });
    expect(accepted.status, JSON.stringify(accepted.body)).toBe(200);
    // An accepted invitation cannot be resent.
    await http().post(`/api/invitations/${created.body.id}/resend`).set(bearer(office)).expect(404);
    expect(mailTo(received, email)).toHaveLength(1);
  }, 90_000);

  it('should cancel a queued message whose invitation was withdrawn before it could go', async () => {
    const port = await freePort();
    app = await startApp({ SMTP_URL: `smtp://127.0.0.1:${port}`, ACCOUNT_MAIL_RETRIES: '8', ACCOUNT_MAIL_RETRY_DELAY_SECONDS: '1' });
    const http = () => request(app!.getHttpServer());
    const company = await createCompany('Mail Withdrawn');
    const admin = await signIn(app, company.users.admin);
    const email = `withdrawn.${company.id.slice(0, 8)}@mail-withdrawn.example`;
    const created = await http().post('/api/invitations').set(bearer(admin)).send({ email, role: 'tech' }).expect(201);
    await waitUntil('a failed first attempt', () => outgoing(email), (rows) => (rows[0]?.attempts ?? 0) >= 1);
    await http().delete(`/api/invitations/${created.body.id}`).set(bearer(admin)).expect(204);

    smtp = await startSmtp(port, received);
    const [row] = await waitUntil('the message settled', () => outgoing(email), (rows) => rows[0]?.status === 'cancelled' || rows[0]?.status === 'sent');
    expect(row).toMatchObject({ status: 'cancelled' });
    expect(mailTo(received, email)).toHaveLength(0);
  }, 90_000);
});
