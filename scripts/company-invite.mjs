// `npm run company:invite [-- --note "who it is for"] [--days 14]`: makes a one-time company
// invitation code for SIGNUP_MODE=invite and prints it. Only its hash is stored; the code is shown once.
import { parseArgs } from 'node:util';

import { envInt, newInviteCode, sha256, withAppDatabase } from './lib/company-cli.mjs';
import { log } from './lib/setup.mjs';

try {
  const { values } = parseArgs({ options: { note: { type: 'string' }, days: { type: 'string' } } });
  const days = values.days === undefined ? envInt('COMPANY_INVITE_CODE_TTL_DAYS', 14) : Number(values.days);
  if (!Number.isInteger(days) || days < 1 || days > 365) throw new Error(`--days must be a whole number from 1 to 365, not "${values.days}"`);
  const note = values.note?.trim() || null;
  if (note && note.length > 200) throw new Error('--note must be at most 200 characters');

  const code = newInviteCode();
  const expiresAt = await withAppDatabase(async (client) => {
    const { rows } = await client.query(
      `insert into company_invite_codes (code_hash, note, expires_at) values ($1, $2, now() + make_interval(days => $3)) returning expires_at`,
      [sha256(code), note, days],
    );
    return rows[0].expires_at;
  });
  log(`company invitation code (works once, until ${expiresAt.toISOString()}):`);
  console.log(code);
  if ((process.env.SIGNUP_MODE ?? 'open') !== 'invite') {
    log('note: codes are asked for only while the server runs with SIGNUP_MODE=invite');
  }
} catch (error) {
  console.error(`[loamline] ${error instanceof Error ? error.message : error}`);
  process.exitCode = 1;
}
