// Up to the first whitespace or a character that cannot end a URL in running text.
const URL_IN_TEXT = /\bhttps?:\/\/[^\s<>"')\]]+/gi;
const TRAILING_PUNCTUATION = /[.,;:!?]+$/;

/**
 * The web links in a message (HTML anchors first, then bare URLs in the text part), each once, in order
 * of appearance. Only http(s): a `mailto:` or `javascript:` link is nothing a developer needs to follow.
 */
export function extractLinks({ html, text }: { html: string | null; text: string | null }): string[] {
  const found: string[] = [];
  if (html) {
    const doc = new DOMParser().parseFromString(html, 'text/html');
    for (const anchor of doc.querySelectorAll('a[href]')) {
      found.push(anchor.getAttribute('href')?.trim() ?? '');
    }
    found.push(...Array.from((doc.body.textContent ?? '').matchAll(URL_IN_TEXT), (match) => match[0]));
  }
  if (text) found.push(...Array.from(text.matchAll(URL_IN_TEXT), (match) => match[0]));

  const links = new Set<string>();
  for (const candidate of found) {
    const cleaned = candidate.replace(TRAILING_PUNCTUATION, '');
    if (/^https?:\/\//i.test(cleaned)) links.add(cleaned);
  }
  return [...links];
}
