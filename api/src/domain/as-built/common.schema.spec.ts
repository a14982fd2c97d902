import { describe, expect, it } from 'vitest';

import { IsoDateSchema } from './common.schema.js';

// Calendar rules of ISO 8601 / the proleptic Gregorian calendar (leap years: divisible by 4, except
// centuries not divisible by 400). Found by the bad-input suite: PATCH /api/jobs/:id with
// endDate "2026-13-01" and POST …/items with warrantyEnd "0000-00-00" passed the pattern and failed in
// the database's date column as a 500.
describe('IsoDateSchema', () => {
  it.each(['2026-05-14', '2024-02-29', '2000-02-29', '0001-01-01', '9999-12-31'])('should accept the real date %s', (date) => {
    expect(IsoDateSchema.safeParse(date).success).toBe(true);
  });

  it.each(['2026-02-30', '2026-13-01', '0000-00-00', '0000-01-01', '2025-02-29', '1900-02-29', '2026-04-31', '9999-99-99', '2026-00-10'])(
    'should refuse %s, which has the right shape but is no date',
    (date) => {
      const result = IsoDateSchema.safeParse(date);
      expect(result.success).toBe(false);
      expect(result.error?.issues[0]?.message).toBe('no such date: check the month and the day');
    },
  );

  it('should refuse a date in another shape with the shape message', () => {
    expect(IsoDateSchema.safeParse('14/05/2026').error?.issues[0]?.message).toBe('expected a date as YYYY-MM-DD');
  });
});
