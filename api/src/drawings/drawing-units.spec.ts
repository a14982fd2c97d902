import { describe, expect, it } from 'vitest';

import { niceStep, toAxisDepthUnit, toAxisLengthUnit } from './drawing-units.js';

describe('drawing units', () => {
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
