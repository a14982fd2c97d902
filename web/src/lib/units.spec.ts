import { describe, expect, it } from 'vitest';

import { formatLength, parseGauge, parseLength } from './units';

describe('parseLength', () => {
  it.each([
    ['6', 'imperial', 'short', 0.1524],
    ['6 in', 'imperial', 'short', 0.1524],
    ['6"', 'metric', 'short', 0.1524],
    ['0.15 m', 'imperial', 'short', 0.15],
    ['15', 'metric', 'short', 0.15],
    ['15 cm', 'imperial', 'short', 0.15],
    ['150mm', 'metric', 'short', 0.15],
    ["2' 6\"", 'imperial', 'long', 0.762],
    ["2' 6", 'imperial', 'long', 0.762],
    ['2 ft 6 in', 'metric', 'long', 0.762],
    ['40', 'imperial', 'long', 12.192],
    ['12.5', 'metric', 'long', 12.5],
    ['1,5 m', 'metric', 'long', 1.5],
    ['.5', 'metric', 'long', 0.5],
    ['0', 'metric', 'short', 0],
  ] as const)('should read %j (%s, %s) as %f m', (input, system, scale, metres) => {
    const result = parseLength(input, system, scale);
    expect(result.ok).toBe(true);
    if (result.ok) expect(result.metres).toBeCloseTo(metres, 6);
  });

  it.each([[''], ['abc'], ['-3'], ['6 in 4 furlongs'], ['3 4']])('should refuse %j', (input) => {
    expect(parseLength(input, 'imperial', 'short').ok).toBe(false);
  });
});

describe('formatLength', () => {
  it.each([
    [0.1524, 'imperial', 'short', '6 in'],
    [0.1, 'imperial', 'short', '3 7/8 in'], // 3.937 in to the nearest 1/8 (1 in = 25.4 mm exactly, NIST SP 811)
    [0.105, 'imperial', 'short', '4 1/8 in'],
    [0.15, 'metric', 'short', '15 cm'],
    [12.192, 'imperial', 'long', '40 ft'],
    [12.5, 'imperial', 'long', '41 ft'],
    [12.5, 'metric', 'long', '12.5 m'],
    [0.762, 'imperial', 'long', '2 ft 6 in'],
  ] as const)('should show %f m (%s, %s) as %j', (metres, system, scale, text) => {
    expect(formatLength(metres, system, scale)).toBe(text);
  });
});

describe('parseGauge', () => {
  it.each([
    ['14', 'awg', { system: 'awg', awg: 14 }],
    ['14 AWG', 'mm2', { system: 'awg', awg: 14 }],
    ['1/0', 'awg', { system: 'awg', awg: 0 }],
    ['2/0 AWG', 'awg', { system: 'awg', awg: -1 }],
    ['2.5', 'mm2', { system: 'mm2', mm2: 2.5 }],
    ['2,5 mm²', 'awg', { system: 'mm2', mm2: 2.5 }],
    ['1.5 mm2', 'awg', { system: 'mm2', mm2: 1.5 }],
  ] as const)('should read %j (%s)', (input, system, gauge) => {
    expect(parseGauge(input, system)).toEqual({ ok: true, gauge });
  });

  it.each([['3 mm²'], ['14.5 AWG'], ['41'], ['thick']])('should refuse %j', (input) => {
    expect(parseGauge(input, 'awg').ok).toBe(false);
  });
});
