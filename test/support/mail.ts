import { withDb } from './fixtures.js';

export interface CapturedMail {
  subject: string;
  text: string | null;
  html: string | null;
  /** The X-Loamline-Company tag of the message. */
  companyId: string | null;
}

export interface WaitForMailOptions {
  timeoutMs?: number;
  /** Only messages whose subject contains this text. */
  subject?: string;
  /** Only messages received after this moment (e.g. a second mail to the same address). */
  after?: Date;
}

/**
 * Waits for the local SMTP server to have stored a message to `to` and returns the newest one. Account
 * mail (invitations, resets) and packet mail go through send queues, so a message lands a moment after
 * the request that caused it.
 */
export async function waitForMail(to: string, { timeoutMs = 20_000, subject, after }: WaitForMailOptions = {}): Promise<CapturedMail> {
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    const mail = await withDb(async (client) => {
      const { rows } = await client.query<CapturedMail>(
        `select subject, text, html, company_id as "companyId" from captured_mail
          where $1 = any(to_addresses) and ($2::text is null or strpos(subject, $2) > 0) and ($3::timestamptz is null or received_at > $3)
          order by received_at desc limit 1`,
        [to, subject ?? null, after ?? null],
      );
      return rows[0];
    });
    if (mail) return mail;
    if (Date.now() > deadline) throw new Error(`no mail to ${to}${subject ? ` about "${subject}"` : ''} arrived within ${timeoutMs} ms`);
    await new Promise((resolve) => setTimeout(resolve, 200));
  }
}

/** How many messages the local SMTP server has stored for `to`. */
export async function countMail(to: string): Promise<number> {
  return withDb(async (client) => {
    const { rows } = await client.query<{ n: number }>('select count(*)::int as n from captured_mail where $1 = any(to_addresses)', [to]);
    return rows[0]!.n;
  });
}

/** The first link in the message whose path is `path` (from the text part, else the HTML part). */
export function findLink(mail: Pick<CapturedMail, 'subject' | 'text' | 'html'>, path: string): string {
  const pattern = new RegExp(`https?://[^\\s"'<>]+${path.replace(/[.*+?^${}()|[\]\\/]/g, '\\$&')}\\?token=[\\w-]+`);
  const match = (mail.text ?? '').match(pattern) ?? (mail.html ?? '').replace(/&amp;/g, '&').match(pattern);
  if (!match) throw new Error(`no ${path} link in the mail "${mail.subject}"`);
  return match[0];
}

/** The token of the first `path` link in the message. */
export function findToken(mail: Pick<CapturedMail, 'subject' | 'text' | 'html'>, path: string): string {
  return new URL(findLink(mail, path)).searchParams.get('token')!;
}
