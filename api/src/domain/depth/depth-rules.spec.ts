import { describe, expect, it } from 'vitest';

import { nominalCoverInches } from './depth-rules.js';

// The metric equivalents are those the rules are built from (NFPA 70, National Electrical Code, Table
// 300.5 gives 150 mm for 6 in, 300 mm for 12 in, 450 mm for 18 in, 600 mm for 24 in) — from memory.
describe(nominalCoverInches.name, () => {
  it.each([
    [0.15, 6],
    [0.3, 12],
    [0.45, 18],
    [0.6, 24],
    [0, 0],
  ])('should read a rule of %f m as the %i in it was written in', (metres, inches) => {
    expect(nominalCoverInches(metres)).toBe(inches);
  });

  it.each([[0.16], [0.1524], [0.2]])('should leave %f m, which is not one of those values, alone', (metres) => {
    expect(nominalCoverInches(metres)).toBeUndefined();
  });
});
