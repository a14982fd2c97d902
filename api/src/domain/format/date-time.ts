/**
 * One way of writing dates and times for people, in the company's time zone and locale (`Intl`), one
 * style per kind:
 *
 * - date: `Dec 2, 2026` (en-US), `2 Dec 2026` (en-GB) — month as a word, so no reader mistakes 2/12 for 12/2;
 * - date-time: the date plus the local time and the zone's short name, `Dec 2, 2026, 5:29 PM EST`.
 *
 * A calendar date without a time (`2026-05-14`, e.g. an installation date) is the same day everywhere and
 * is never shifted by a time zone; a timestamp is shown in the reader's zone, so an evening in the
 * Americas prints that evening's date, not tomorrow's UTC date.
 */
export interface DateStyle {
  /** IANA time zone, e.g. `America/Chicago`; UTC when absent. */
  timeZone?: string | null;
  /** BCP 47 locale, e.g. `en-US` (the default), `en-CA`, `en-GB`. */
  locale?: string | null;
}

export const DEFAULT_LOCALE = 'en-US';

const DATE_ONLY = /^(\d{4})-(\d{2})-(\d{2})$/;

function options(style: DateStyle): { locale: string; timeZone: string } {
  return { locale: style.locale || DEFAULT_LOCALE, timeZone: style.timeZone || 'UTC' };
}

/** ICU puts a narrow no-break space before AM/PM; plain text (CSV, e-mail, PDF text) reads better with a space. */
const plainSpaces = (text: string) => text.replace(/[\u202f\u00a0]/g, ' ');

/**
 * One formatter per locale, zone and kind, made once: making an `Intl.DateTimeFormat` (ICU loads the
 * zone's rules) costs far more than formatting with it, and a screen or a packet formats many dates in
 * the same few styles. Bounded by the locales and zones in use.
 */
const formatters = new Map<string, Intl.DateTimeFormat>();
function formatter(locale: string, options: Intl.DateTimeFormatOptions & { timeZone: string }): Intl.DateTimeFormat {
  const key = `${locale}|${options.timeZone}|${options.hour === undefined ? 'date' : 'date-time'}`;
  let found = formatters.get(key);
  if (!found) {
    found = new Intl.DateTimeFormat(locale, options);
    formatters.set(key, found);
  }
  return found;
}

/** A calendar date: `Dec 2, 2026` in en-US. `—` when there is none; unreadable input is returned as given. */
export function formatDate(iso: string | Date | null | undefined, style: DateStyle = {}): string {
  if (iso === null || iso === undefined || iso === '') return '—';
  const { locale, timeZone } = options(style);
  const dateOnly = typeof iso === 'string' ? DATE_ONLY.exec(iso) : null;
  const date = dateOnly ? new Date(Date.UTC(Number(dateOnly[1]), Number(dateOnly[2]) - 1, Number(dateOnly[3]))) : new Date(iso);
  if (Number.isNaN(date.getTime())) return String(iso);
  return plainSpaces(
    formatter(locale, { year: 'numeric', month: 'short', day: 'numeric', timeZone: dateOnly ? 'UTC' : timeZone }).format(date),
  );
}

/** A moment: `Dec 2, 2026, 5:29 PM EST` in en-US, America/New_York. */
export function formatDateTime(iso: string | Date | null | undefined, style: DateStyle = {}): string {
  if (iso === null || iso === undefined || iso === '') return '—';
  const { locale, timeZone } = options(style);
  const date = new Date(iso);
  if (Number.isNaN(date.getTime())) return String(iso);
  return plainSpaces(
    formatter(locale, {
      year: 'numeric',
      month: 'short',
      day: 'numeric',
      hour: 'numeric',
      minute: '2-digit',
      timeZone,
      timeZoneName: 'short',
    }).format(date),
  );
}

/**
 * Words whose spelling differs between English locales. en-US (the default) writes "center", "color",
 * "gray", "meter"; the Commonwealth locales write "centre", "colour", "grey", "metre". Other languages get en-US.
 */
const COMMONWEALTH = /^en-(GB|AU|NZ|IE|ZA|IN|CA)\b/i;
const WORDS = {
  center: ['center', 'centre'],
  color: ['color', 'colour'],
  gray: ['gray', 'grey'],
  meter: ['meter', 'metre'],
  meters: ['meters', 'metres'],
} as const;
export type SpelledWord = keyof typeof WORDS;

/** The locale's spelling of `word` (lower case). */
export function spell(word: SpelledWord, locale?: string | null): string {
  const commonwealth = COMMONWEALTH.test(locale || DEFAULT_LOCALE);
  return WORDS[word][commonwealth ? 1 : 0];
}
