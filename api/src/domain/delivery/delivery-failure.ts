/**
 * The office reads why a packet e-mail did not go in plain words; the raw error stays in `lastError`
 * for whoever looks after the mail server. Matches the messages Node's network stack and SMTP servers
 * give (error codes such as ECONNREFUSED, SMTP reply codes such as 550).
 */
const RULES: { test: RegExp; reason: string }[] = [
  { test: /SMTP_URL is required|not configured|no mail transport/i, reason: 'Mail is not set up on this server, so nothing could be sent.' },
  { test: /ECONNREFUSED|ECONNRESET|EHOSTUNREACH|ENETUNREACH|connection closed|socket hang up/i, reason: 'The mail server could not be reached.' },
  { test: /ENOTFOUND|EAI_AGAIN|getaddrinfo/i, reason: 'The mail server’s address could not be found.' },
  { test: /ETIMEDOUT|timed? ?out|timeout/i, reason: 'The mail server did not answer in time.' },
  { test: /\b(535|534|530)\b|auth(entication)? (failed|required)|invalid login/i, reason: 'The mail server refused our sign-in.' },
  { test: /\b552\b|message (size|too large)|exceeds .*size/i, reason: 'The message was too large for the mail server.' },
  { test: /\b55[013]\b|no such user|user unknown|mailbox (unavailable|not found)|recipient .*(rejected|refused)/i, reason: 'The recipient’s mail server refused this address.' },
  { test: /\b4\d\d\b/, reason: 'The mail server asked us to try again later.' },
  { test: /packet revision is not ready|not ready/i, reason: 'The packet was not ready to send.' },
];

export function plainDeliveryFailure(lastError: string | null): string | null {
  if (!lastError) return null;
  return RULES.find((rule) => rule.test.test(lastError))?.reason ?? 'The e-mail could not be sent.';
}
