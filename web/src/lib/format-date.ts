import { type DateStyle, formatDate as formatDomainDate, formatDateTime as formatDomainDateTime } from '@domain/format/date-time';

/**
 * Dates on screens through the domain's one date formatter (the packet, e-mails and CSV use the same),
 * in the company's time zone and locale (`useDateStyle()` in a component): `May 14, 2026` (en-US),
 * `14 May 2026` (en-GB); date-times with the zone's short name, `May 14, 2026, 5:29 PM CDT`. A calendar
 * date (`2026-05-14`, a start date) is never shifted by the zone. The style is always passed, so no
 * screen falls back to the browser's zone by forgetting it.
 */
export function readerDateStyle(): DateStyle {
  const resolved = new Intl.DateTimeFormat().resolvedOptions();
  return { timeZone: resolved.timeZone, locale: resolved.locale };
}

/**
 * The zone and locale screens write dates in: the company's (its profile, sent to everyone of the
 * company with their preferences), as the packet, e-mails and CSV write them, so the office in one zone
 * and a technician's phone set to another read the same day. A company that has not chosen a zone yet,
 * and anyone before the server has answered or signed out, gets the browser's zone.
 */
export function companyDateStyle(company: { timeZone: string | null; locale: string } | undefined, reader?: DateStyle): DateStyle {
  // The browser's own style only when needed: asking Intl for it costs a slow phone tens of milliseconds.
  if (!company) return reader ?? readerDateStyle();
  return { timeZone: company.timeZone ?? (reader ?? readerDateStyle()).timeZone ?? null, locale: company.locale };
}

/** `May 14, 2026, 5:29 PM CDT` in the style's zone and locale. */
export function formatDateTime(iso: string, style: DateStyle): string {
  return formatDomainDateTime(iso, style);
}

/** `May 14, 2026` in the style's zone and locale. */
export function formatDate(iso: string, style: DateStyle): string {
  return formatDomainDate(iso, style);
}
