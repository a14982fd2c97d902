import { describe, expect, it } from 'vitest';

import { formatDate, formatDateTime, spell } from './date-time.js';
import { formatConductor, formatResistance } from './quantity.js';

// Expected texts worked by hand from the IANA tz database offsets (America/Chicago is UTC−6 in
// December, standard time; America/Los_Angeles UTC−8; Australia/Sydney UTC+11 in daylight time) and
// the CLDR date patterns for each locale (en-US "MMM d, y", en-GB and en-AU "d MMM y"), from memory.
describe(formatDate.name, () => {
  it.each([
    // An evening issue in the Americas: 02:30 UTC on Dec 3 is still Dec 2 in Chicago.
    ['2026-12-03T02:30:00Z', 'America/Chicago', 'en-US', 'Dec 2, 2026'],
    ['2026-12-03T02:30:00Z', null, 'en-US', 'Dec 3, 2026'],
    // A morning in Sydney is the previous UTC day.
    ['2026-12-02T20:00:00Z', 'Australia/Sydney', 'en-AU', '3 Dec 2026'],
    ['2026-12-02T20:00:00Z', 'Europe/London', 'en-GB', '2 Dec 2026'],
    // A calendar date is the same day in every zone.
    ['2026-05-14', 'America/Los_Angeles', 'en-US', 'May 14, 2026'],
    ['2026-05-14', 'Pacific/Kiritimati', 'en-GB', '14 May 2026'],
    [null, 'America/Chicago', 'en-US', '—'],
    ['not a date', null, null, 'not a date'],
  ] as const)('should write %s in %s (%s) as %j', (iso, timeZone, locale, text) => {
    expect(formatDate(iso, { timeZone, locale })).toBe(text);
  });
});

describe(formatDateTime.name, () => {
  it.each([
    ['2026-12-03T02:30:00Z', 'America/Chicago', 'en-US', 'Dec 2, 2026, 8:30 PM CST'],
    ['2026-12-03T02:30:00Z', 'America/Los_Angeles', 'en-US', 'Dec 2, 2026, 6:30 PM PST'],
    ['2026-12-03T02:30:00Z', null, 'en-US', 'Dec 3, 2026, 2:30 AM UTC'],
    ['2026-12-02T16:05:00Z', 'Europe/London', 'en-GB', '2 Dec 2026, 16:05 GMT'],
  ] as const)('should write %s in %s (%s) as %j', (iso, timeZone, locale, text) => {
    expect(formatDateTime(iso, { timeZone, locale })).toBe(text);
  });
});

describe(spell.name, () => {
  it.each([
    ['center', 'en-US', 'center'],
    ['center', undefined, 'center'],
    ['center', 'es-US', 'center'],
    ['center', 'en-GB', 'centre'],
    ['center', 'en-CA', 'centre'],
    ['color', 'en-AU', 'colour'],
    ['gray', 'en-US', 'gray'],
    ['gray', 'en-GB', 'grey'],
  ] as const)('should spell %s in %s as %s', (word, locale, text) => {
    expect(spell(word, locale)).toBe(text);
  });
});

// AWG areas: NBS Copper Wire Tables (Handbook 100), 12 AWG = 6530 cmil = 3.31 mm²; the nearest AWG to
// 2.5 mm² is 13 AWG (2.63 mm²) — docs/reference.md [NBS].
describe(formatConductor.name, () => {
  it.each([
    [{ system: 'awg', awg: 12 }, 'imperial', '12 AWG'],
    [{ system: 'awg', awg: 12 }, 'metric', '3.31 mm² (12 AWG)'],
    [{ system: 'mm2', mm2: 2.5 }, 'metric', '2.5 mm²'],
    [{ system: 'mm2', mm2: 2.5 }, 'imperial', '2.5 mm² (≈ 13 AWG)'],
  ] as const)('should write %j (%s) as %j', (gauge, system, text) => {
    expect(formatConductor(gauge, system)).toBe(text);
  });
});

describe(formatResistance.name, () => {
  it.each([
    [5.333, '5.33 Ω'],
    [0.0523, '0.052 Ω'],
    [null, 'open'],
    [Infinity, 'open'],
  ] as const)('should write %s as %j', (ohm, text) => {
    expect(formatResistance(ohm)).toBe(text);
  });
});
