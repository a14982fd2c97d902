import { formatDate as formatDomainDate, formatDateTime as formatDomainDateTime } from '@domain/format/date-time';
import { describe, expect, it } from 'vitest';

import { companyDateStyle, formatDate, formatDateTime, readerDateStyle } from './format-date';

describe('screen dates (the domain formatter in the company zone)', () => {
  const losAngeles = { timeZone: 'America/Los_Angeles', locale: 'en-US' };

  it('should write the same text as the packet for the same zone and locale', () => {
    expect(formatDate('2026-05-15T02:00:00Z', losAngeles)).toBe(formatDomainDate('2026-05-15T02:00:00Z', losAngeles));
    expect(formatDateTime('2026-05-15T02:00:00Z', losAngeles)).toBe(formatDomainDateTime('2026-05-15T02:00:00Z', losAngeles));
  });

  it('should write an evening in the Americas on its own day, and never shift a calendar date', () => {
    // 02:00 UTC on 15 May is 19:00 PDT on 14 May (UTC-7 in May, IANA tz database).
    expect(formatDate('2026-05-15T02:00:00Z', losAngeles)).toBe('May 14, 2026');
    expect(formatDateTime('2026-05-15T02:00:00Z', losAngeles)).toBe('May 14, 2026, 7:00 PM PDT');
    expect(formatDate('2026-05-14', losAngeles)).toBe('May 14, 2026');
    expect(formatDate('2026-05-14', { timeZone: 'Pacific/Auckland', locale: 'en-GB' })).toBe('14 May 2026');
    expect(formatDate('not a date', losAngeles)).toBe('not a date');
  });
});

describe(companyDateStyle.name, () => {
  const reader = { timeZone: 'Europe/Lisbon', locale: 'pt-PT' };

  it("should take the company's zone and locale over the browser's", () => {
    expect(companyDateStyle({ timeZone: 'America/Denver', locale: 'en-CA' }, reader)).toEqual({ timeZone: 'America/Denver', locale: 'en-CA' });
    // 03:30 UTC on 2 Mar is 20:30 MST on 1 Mar (UTC-7 in March before DST, IANA tz database).
    expect(formatDate('2026-03-02T03:30:00Z', companyDateStyle({ timeZone: 'America/Denver', locale: 'en-US' }, reader))).toBe('Mar 1, 2026');
  });

  it("should keep the browser's zone while the company has chosen none, in the company's locale", () => {
    expect(companyDateStyle({ timeZone: null, locale: 'en-GB' }, reader)).toEqual({ timeZone: 'Europe/Lisbon', locale: 'en-GB' });
  });

  it('should be the browser’s zone and locale before the server has answered', () => {
    expect(companyDateStyle(undefined, reader)).toEqual(reader);
    expect(companyDateStyle(undefined).timeZone).toBe(readerDateStyle().timeZone);
  });
});
