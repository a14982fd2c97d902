/** Who a message is sent on behalf of: the display name on From and the address replies go to. */
export interface MailSender {
  /** Shown as the From display name (the company's trade name); the From address stays MAIL_FROM's. */
  name: string;
  /** Reply-To: the company's e-mail, so a reply reaches the contractor; null leaves Reply-To out. */
  replyTo: string | null;
}

/** The address part of MAIL_FROM (`Name <address>` or a bare address). */
export function mailFromAddress(mailFrom: string): string {
  const match = /<([^<>]+)>\s*$/.exec(mailFrom);
  return (match ? match[1]! : mailFrom).trim();
}

/**
 * The From header for a sender: their name (control characters and line breaks removed; nodemailer
 * quotes and encodes the rest) with MAIL_FROM's address, which is the one our SMTP service may send as.
 */
export function senderFrom(mailFrom: string, sender: MailSender): { name: string; address: string } {
  // eslint-disable-next-line no-control-regex
  const name = sender.name.replace(/[\u0000-\u001f\u007f]+/g, ' ').trim().slice(0, 120);
  return { name, address: mailFromAddress(mailFrom) };
}
