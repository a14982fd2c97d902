import { describe, expect, it } from 'vitest';

import { formatDepth, formatLength, formatNumber, niceStep, toAxisDepthUnit, toAxisLengthUnit } from './drawing-units.js';

describe('drawing units', () => {
  describe(formatNumber.name, () => {
    it.each([
      [8.01, 2, '8.01'],
      [8.4, 2, '8.4'],
      [10, 2, '10'],
      [-0.001, 2, '0'],
      [2.675, 1, '2.7'],
    ])('should format %d with %d decimals as %s', (value, decimals, expected) => {
      expect(formatNumber(value, decimals)).toBe(expected);
    });
  });

  describe(formatLength.name, () => {
    it.each([
      [8.01, 'metric', '8.01 m'],
      [10.8, 'metric', '10.8 m'],
      [0, 'metric', '0 m'],
      // 8.01 m = 315.35 in → 26 ft 3 in
      [8.01, 'imperial', '26 ft 3 in'],
      // 3.048 m is exactly 10 ft
      [3.048, 'imperial', '10 ft'],
      // 0.3 m = 11.81 in → rounds up to a whole foot
      [0.3, 'imperial', '1 ft'],
      [0.0254 * 5, 'imperial', '0 ft 5 in'],
    ] as const)('should format %d m in %s as %s', (m, units, expected) => {
      expect(formatLength(m, units)).toBe(expected);
    });
  });

  describe(formatDepth.name, () => {
    it.each([
      [0.11, 'metric', '11 cm'],
      [0.15, 'metric', '15 cm'],
      [0.105, 'metric', '11 cm'],
      // 0.15 m = 5.906 in → nearest quarter is 6 in (the usual 6-inch rule)
      [0.15, 'imperial', '6 in'],
      // 0.11 m = 4.331 in → nearest quarter is 4 1/4 in; 0.10795 m = 4.25 in exactly
      [0.11, 'imperial', '4 1/4 in'],
      [0.10795, 'imperial', '4 1/4 in'],
      [0.0254 * 0.5, 'imperial', '1/2 in'],
      [0.3048, 'imperial', '12 in'],
      [0, 'imperial', '0 in'],
    ] as const)('should format %d m in %s as %s', (m, units, expected) => {
      expect(formatDepth(m, units)).toBe(expected);
    });
  });

  describe('axis units', () => {
    it('should convert lengths to metres or feet and depths to cm or inches', () => {
      expect(toAxisLengthUnit(3.048, 'imperial')).toBeCloseTo(10, 12);
      expect(toAxisLengthUnit(3, 'metric')).toBe(3);
      expect(toAxisDepthUnit(0.0254, 'imperial')).toBeCloseTo(1, 12);
      expect(toAxisDepthUnit(0.11, 'metric')).toBeCloseTo(11, 12);
    });
  });

  describe(niceStep.name, () => {
    it.each([
      [10, 5, 2],
      [9, 4, 2.5],
      [30, 5, 10],
      [0.3, 3, 0.1],
      [0, 5, 1],
    ])('should step a span of %d into about %d ticks with %d', (span, count, expected) => {
      expect(niceStep(span, count)).toBeCloseTo(expected, 12);
    });
  });
});
