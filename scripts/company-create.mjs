// `npm run company:create -- --name "Company name" --admin-email admin@example.com [--admin-name "Name"]`:
// creates a company with its default settings and invites its first admin by e-mail (the app's own
// invitation: the mail goes through the account-mail queue, and the link is minted when it is sent).
// For operators who keep SIGNUP_MODE=closed.
import { randomBytes } from 'node:crypto';
import { parseArgs } from 'node:util';

import { enqueueAccountMail, envInt, sha256, withAppDatabase } from './lib/company-cli.mjs';
import { log } from './lib/setup.mjs';

const EMAIL = /^[^\s@]+@[^\s@]+\.[^\s@]+$/;

/** The invitation link in the message the local capture server stored for `email`, if it arrives within 20 s. */
async function waitForCapturedLink(client, email, since) {
  const deadline = Date.now() + 20_000;
  while (Date.now() < deadline) {
    const { rows } = await client.query(
      `select text from captured_mail where $1 = any(to_addresses) and received_at >= $2 order by received_at desc limit 1`,
      [email, since],
    );
    const link = rows[0]?.text?.match(/https?:\/\/\S+\/accept-invitation\?token=[\w-]+/)?.[0];
    if (link) return link;
    await new Promise((resolve) => setTimeout(resolve, 500));
  }
  return undefined;
}

try {
  const { values } = parseArgs({ options: { name: { type: 'string' }, 'admin-email': { type: 'string' }, 'admin-name': { type: 'string' } } });
  const name = values.name?.trim();
  const email = values['admin-email']?.trim().toLowerCase();
  const adminName = values['admin-name']?.trim() || null;
  if (!name) throw new Error('--name is required: the company name, e.g. --name "Brambleford Outdoor Audio"');
  if (name.length > 120) throw new Error('--name must be at most 120 characters');
  if (!email || email.length > 254 || !EMAIL.test(email)) throw new Error('--admin-email is required and must be an e-mail address');
  if (adminName && adminName.length > 120) throw new Error('--admin-name must be at most 120 characters');
  const hours = envInt('INVITATION_TTL_HOURS', 72);

  const startedAt = new Date();
  const { companyId, mailId, queued, capturedLink } = await withAppDatabase(async (client, url) => {
    await client.query('begin');
    let created;
    try {
      const taken = await client.query('select 1 from users where email = $1', [email]);
      if (taken.rowCount > 0) throw new Error(`${email} already has a Loamline account; choose another address for the admin`);
      const invited = await client.query(
        `select c.name from invitations i join companies c on c.id = i.company_id
          where i.email = $1 and i.role = 'admin' and i.accepted_at is null and i.revoked_at is null and i.expires_at > now() limit 1`,
        [email],
      );
      if (invited.rowCount > 0) {
        throw new Error(`${email} already has an open invitation as admin of "${invited.rows[0].name}"; it can be accepted from its e-mail`);
      }
      const company = await client.query('insert into companies (name) values ($1) returning id', [name]);
      const companyId = company.rows[0].id;
      await client.query('insert into company_settings (company_id) values ($1)', [companyId]);
      // Sealed: the hash of a token nobody holds, until the worker mints the real link as it sends.
      const invitation = await client.query(
        `insert into invitations (company_id, email, name, role, token_hash, expires_at)
         values ($1, $2, $3, 'admin', $4, now() + make_interval(hours => $5)) returning id`,
        [companyId, email, adminName, sha256(randomBytes(32).toString('base64url')), hours],
      );
      const data = { name: adminName, inviterName: 'The operator of this Loamline server', companyName: name, roleLabel: 'Admin', isHomeowner: false };
      const mail = await client.query(
        `insert into outgoing_mail (company_id, kind, to_address, invitation_id, data) values ($1, 'invitation', $2, $3, $4) returning id`,
        [companyId, email, invitation.rows[0].id, JSON.stringify(data)],
      );
      await client.query(
        `insert into audit_log (company_id, actor_user_id, action, target_type, target_id, details)
         values ($1, null, 'company.create_by_operator', 'company', $2, $3)`,
        [companyId, companyId, JSON.stringify({ adminEmail: email })],
      );
      await client.query('commit');
      created = { companyId, mailId: mail.rows[0].id };
    } catch (error) {
      await client.query('rollback');
      throw error;
    }
    const queued = await enqueueAccountMail(url, created.mailId);
    // With no mail service the running app captures the message; nobody of the new company can sign in
    // to read its Outbox yet, so show the operator the link to pass on.
    const capturedLink = queued && !process.env.SMTP_URL ? await waitForCapturedLink(client, email, startedAt) : undefined;
    return { ...created, queued, capturedLink };
  });
  log(`company "${name}" created (${companyId})`);
  log(`invitation for ${email} as its admin queued (mail ${mailId}); the link works for ${hours} hours once sent`);
  log(
    queued
      ? 'the running app sends it now (or the next `npm start` does)'
      : 'it could not be handed to the queue now; the app sends it at its next start, or within a few minutes while it runs',
  );
  if (process.env.SMTP_URL) log('mail goes to the SMTP_URL service');
  else if (capturedLink) log(`mail is captured locally (no SMTP_URL); pass this invitation link to ${email} (it works once):\n${capturedLink}`);
  else log('mail is captured locally (no SMTP_URL), and the app did not send it within 20 s (is it running?): it goes when the app runs; set SMTP_URL to deliver it to the admin');
} catch (error) {
  console.error(`[loamline] ${error instanceof Error ? error.message : error}`);
  process.exitCode = 1;
}
