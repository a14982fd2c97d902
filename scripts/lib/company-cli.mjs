// Shared by the operator commands `npm run company:invite` and `npm run company:create`: reach the
// database the way `npm start` does (start the local cluster if needed, migrate), and hand queued
// account mail to the running app's queue. Plain Node with the project's own packages.
import { createHash, randomBytes } from 'node:crypto';

import { ensureDatabase, ensureNpmDependencies, ensurePostgres, importProjectPackage, migrate, stopPostgres } from './setup.mjs';

export const sha256 = (text) => createHash('sha256').update(text).digest('hex');

/** Runs `work(client)` on the app's database (DATABASE_URL, or the local cluster's `loamline`), migrated first. */
export async function withAppDatabase(work) {
  ensureNpmDependencies();
  const pg = ensurePostgres();
  try {
    const url = await ensureDatabase(pg, pg.external ? undefined : 'loamline');
    await migrate(url);
    const { Client } = await importProjectPackage('pg');
    const client = new Client({ connectionString: url });
    await client.connect();
    try {
      return await work(client, url);
    } finally {
      await client.end();
    }
  } finally {
    stopPostgres(pg);
  }
}

/** A positive whole number from the environment, or the default. */
export function envInt(name, fallback) {
  const raw = process.env[name];
  if (raw === undefined || raw === '') return fallback;
  const value = Number(raw);
  if (!Number.isInteger(value) || value < 1) throw new Error(`${name} must be a whole number of at least 1, not "${raw}"`);
  return value;
}

/**
 * Puts a committed outgoing_mail row on the account-mail queue (pg-boss, as the API does). Should that
 * fail, the row stays queued and the app's account-mail worker sends it anyway: at its next start, or
 * within a few minutes while it runs (it re-queues mail that never reached the queue).
 * @returns {Promise<boolean>} whether it reached the queue now
 */
export async function enqueueAccountMail(databaseUrl, mailId) {
  let boss;
  try {
    const PgBoss = await importProjectPackage('pg-boss');
    boss = new PgBoss({ connectionString: databaseUrl, schema: 'pgboss', max: 2, application_name: 'loamline-cli', supervise: false, schedule: false });
    boss.on('error', () => undefined);
    await boss.start();
    const retryLimit = envInt('ACCOUNT_MAIL_RETRIES', 8);
    const retryDelay = envInt('ACCOUNT_MAIL_RETRY_DELAY_SECONDS', 30);
    const options = { retryLimit, retryDelay, retryBackoff: true, expireInSeconds: 5 * 60 };
    if (!(await boss.getQueue('account-mail'))) await boss.createQueue('account-mail', { name: 'account-mail', ...options }).catch(() => undefined);
    await boss.send('account-mail', { mailId }, options);
    return true;
  } catch {
    return false;
  } finally {
    await boss?.stop({ graceful: false, wait: true }).catch(() => undefined);
  }
}

/** A one-time code that is easy to read aloud and type: LMC- and three groups of four (no 0/O, 1/I). */
export function newInviteCode() {
  const alphabet = 'ABCDEFGHJKLMNPQRSTUVWXYZ23456789';
  const bytes = randomBytes(12);
  const chars = [...bytes].map((b) => alphabet[b % alphabet.length]);
  return `LMC-${chars.slice(0, 4).join('')}-${chars.slice(4, 8).join('')}-${chars.slice(8, 12).join('')}`;
}
