import { describe, expect, it } from 'vitest';

import { formatLatency, formatUptime } from './format';

describe('formatLatency', () => {
  it.each([
    [1.234, '1.2 ms'],
    [0, '0.0 ms'],
    [9.96, '10.0 ms'],
    [23.4, '23 ms'],
  ])('should format %s as %s', (ms, expected) => {
    expect(formatLatency(ms)).toBe(expected);
  });
});

describe('formatUptime', () => {
  it.each([
    [0, '0 s'],
    [12.7, '12 s'],
    [59, '59 s'],
    [60, '1 min 0 s'],
    [725, '12 min 5 s'],
    [3_600, '1 h 0 min'],
    [12_000, '3 h 20 min'],
    [86_400, '1 d 0 h'],
    [367_200, '4 d 6 h'],
    [-5, '0 s'],
  ])('should format %s seconds as %s', (seconds, expected) => {
    expect(formatUptime(seconds)).toBe(expected);
  });
});
