import { describe, expect, it } from 'vitest';

import { chooseScale, formatScale, IMPERIAL_SCALES, printableArea, ptPerPlanMetre } from './paper.js';

describe('paper', () => {
  describe(printableArea.name, () => {
    it('should take 0.5 in margins off Letter', () => {
      expect(printableArea('letter', 'portrait')).toMatchObject({ widthPt: 540, heightPt: 720, widthAttr: '7.5in', heightAttr: '10in' });
      expect(printableArea('letter', 'landscape')).toMatchObject({ widthPt: 720, heightPt: 540, widthAttr: '10in', heightAttr: '7.5in' });
    });

    it('should take 12.7 mm margins off A4', () => {
      const a4 = printableArea('a4', 'portrait');
      expect(a4.widthAttr).toBe('184.6mm');
      expect(a4.heightAttr).toBe('271.6mm');
      expect(a4.widthPt).toBeCloseTo((184.6 / 25.4) * 72, 9);
    });
  });

  describe(ptPerPlanMetre.name, () => {
    it('should put 1 m of ground on 10 mm of paper at 1:100', () => {
      // 10 mm = 28.346 pt
      expect(ptPerPlanMetre(100)).toBeCloseTo((10 / 25.4) * 72, 9);
    });

    it('should put 20 ft of ground on 1 in of paper at 1 in = 20 ft', () => {
      expect(20 * 0.3048 * ptPerPlanMetre(240)).toBeCloseTo(72, 9);
    });
  });

  describe(chooseScale.name, () => {
    it('should choose the largest metric scale that fits', () => {
      // 20 m at 1:100 is 200 mm = 566.9 pt: too wide for 540 pt; at 1:125, 160 mm = 453.5 pt fits.
      expect(chooseScale(20, 10, 540, 540, 'metric')?.label).toBe('1:125');
      expect(chooseScale(18, 10, 540, 540, 'metric')?.label).toBe('1:100');
    });

    it('should choose among architectural and engineering scales in imperial', () => {
      // 20 m = 787 in; at 1:120 that is 6.56 in = 472 pt
      expect(chooseScale(20, 10, 540, 540, 'imperial')?.ratio).toBe(120);
      expect(IMPERIAL_SCALES.map((s) => s.ratio)).toEqual([...IMPERIAL_SCALES.map((s) => s.ratio)].sort((a, b) => a - b));
      // Architect's 3/32 in = 1 ft is 1:128 (12 ÷ 3/32); engineer's 1 in = 30 ft is 1:360.
      expect(IMPERIAL_SCALES.find((s) => s.ratio === 128)?.label).toBe('3/32 in = 1 ft');
      expect(IMPERIAL_SCALES.find((s) => s.ratio === 360)?.label).toBe('1 in = 30 ft');
      expect(IMPERIAL_SCALES.every((s) => !/['"]/.test(s.label))).toBe(true);
    });

    it('should return null when nothing fits', () => {
      expect(chooseScale(100_000, 10, 540, 540, 'metric')).toBeNull();
    });
  });

  describe(formatScale.name, () => {
    it('should add the ratio to imperial scales', () => {
      expect(formatScale({ ratio: 240, label: '1 in = 20 ft' })).toBe('1 in = 20 ft (1:240)');
      expect(formatScale({ ratio: 200, label: '1:200' })).toBe('1:200');
    });
  });
});
