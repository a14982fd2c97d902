import { withDb } from './fixtures.js';

export interface CapturedMail {
  subject: string;
  text: string | null;
  html: string | null;
}

/**
 * Waits for the local SMTP server to have stored a message to `to` and returns the newest one. The
 * API sends mail after answering, so a message may land a moment after the request that caused it.
 */
export async function waitForMail(to: string, { timeoutMs = 10_000 } = {}): Promise<CapturedMail> {
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    const mail = await withDb(async (client) => {
      const { rows } = await client.query<CapturedMail>(
        'select subject, text, html from captured_mail where $1 = any(to_addresses) order by received_at desc limit 1',
        [to],
      );
      return rows[0];
    });
    if (mail) return mail;
    if (Date.now() > deadline) throw new Error(`no mail to ${to} arrived within ${timeoutMs} ms`);
    await new Promise((resolve) => setTimeout(resolve, 200));
  }
}

/** The first link in the message whose path is `path` (from the text part, else the HTML part). */
export function findLink(mail: CapturedMail, path: string): string {
  const pattern = new RegExp(`https?://[^\\s"'<>]+${path.replace(/[.*+?^${}()|[\]\\/]/g, '\\$&')}\\?token=[\\w-]+`);
  const match = (mail.text ?? '').match(pattern) ?? (mail.html ?? '').replace(/&amp;/g, '&').match(pattern);
  if (!match) throw new Error(`no ${path} link in the mail "${mail.subject}"`);
  return match[0];
}
