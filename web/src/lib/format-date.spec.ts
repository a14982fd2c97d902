import { formatDate as formatDomainDate, formatDateTime as formatDomainDateTime } from '@domain/format/date-time';
import { describe, expect, it } from 'vitest';

import { formatDate, formatDateTime, readerDateStyle } from './format-date';

describe('screen dates (the domain formatter in the reader zone)', () => {
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
  });

  it('should default to the zone and locale the browser reports', () => {
    const reader = readerDateStyle();
    expect(reader.timeZone).toBe(new Intl.DateTimeFormat().resolvedOptions().timeZone);
    expect(formatDateTime('2026-05-15T02:00:00Z')).toBe(formatDomainDateTime('2026-05-15T02:00:00Z', reader));
    expect(formatDate('not a date')).toBe('not a date');
  });
});
