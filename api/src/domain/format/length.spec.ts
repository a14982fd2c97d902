import { describe, expect, it } from 'vitest';

import { parseLengthInput } from '../as-built/length-input.js';
import { formatInchesEighths, formatLength, formatToleranceZone, lengthEditText } from './length.js';

// Conversions use the exact 1 ft = 0.3048 m and 1 in = 0.0254 m (international yard and pound agreement,
// 1959; NIST Special Publication 811, appendix B.8); expected texts worked by hand, e.g.
// 8.001 m / 0.0254 = 315.0 in = 26 ft 3 in; 0.105 m / 0.0254 = 4.134 in → nearest 1/8 is 4 1/8.
describe(formatLength.name, () => {
  it.each([
    [8.001, 'imperial', 'long', '26 ft 3 in'],
    [12.192, 'imperial', 'long', '40 ft'],
    [5.6388, 'imperial', 'long', '18 ft 6 in'],
    [0.3040, 'imperial', 'long', '1 ft'], // 11.97 in carries into the foot
    [0.2, 'imperial', 'long', '0 ft 8 in'],
    [8.014, 'metric', 'long', '8.01 m'],
    [0.105, 'imperial', 'short', '4 1/8 in'],
    [0.10795, 'imperial', 'short', '4 1/4 in'],
    [0.19685, 'imperial', 'short', '7 3/4 in'],
    [0.1524, 'imperial', 'short', '6 in'],
    [0.0127, 'imperial', 'short', '1/2 in'],
    [0.4572, 'imperial', 'short', '18 in'],
    [0.115, 'metric', 'short', '11.5 cm'],
    [0, 'imperial', 'short', '0 in'],
  ] as const)('should show %f m (%s, %s) as %j', (metres, system, scale, text) => {
    expect(formatLength(metres, system, scale)).toBe(text);
  });
});

describe(formatInchesEighths.name, () => {
  it.each([
    [4.125, '4 1/8'],
    [4.375, '4 3/8'],
    [4.5, '4 1/2'],
    [4.9999, '5'],
    [0.0624, '0'],
    [0.0626, '1/8'],
    [-2.25, '-2 1/4'],
  ])('should write %f in as %j', (inches, text) => {
    expect(formatInchesEighths(inches)).toBe(text);
  });
});

describe(lengthEditText.name, () => {
  it.each([
    [5.6388, 'imperial', 'long', `18' 6"`],
    [12.192, 'imperial', 'long', `40'`],
    [0.7239, 'imperial', 'long', `2' 4 1/2"`],
    [0.19685, 'imperial', 'short', '7 3/4'],
    [12.3456, 'metric', 'long', '12.346'],
    [0.1525, 'metric', 'short', '15.3'],
  ] as const)('should put %f m (%s, %s) into a field as %j', (metres, system, scale, text) => {
    expect(lengthEditText(metres, system, scale)).toBe(text);
  });

  it.each([
    [3.3333, 'imperial', 'long'],
    [0.1017, 'imperial', 'short'],
    [17.77, 'imperial', 'long'],
    [0.456, 'metric', 'short'],
  ] as const)('should read its own text for %f m (%s, %s) back within 1/16 in', (metres, system, scale) => {
    const back = parseLengthInput(lengthEditText(metres, system, scale), { system, scale });
    expect(back.ok).toBe(true);
    if (back.ok) expect(Math.abs(back.metres - metres)).toBeLessThanOrEqual(0.0254 / 16);
  });
});

describe('formatToleranceZone', () => {
  it('should write the locate tolerance zone as a depth in inches, or in metres rounded up to 0.1 m', () => {
    // 18 in either side (CGA Best Practice 5-19) = 0.4572 m exactly (1 in = 0.0254 m, NIST SP 811 B.8).
    expect(formatToleranceZone(0.4572, 'imperial')).toBe('18 in');
    expect(formatToleranceZone(0.4572, 'metric')).toBe('0.5 m');
    // Already on a tenth: not pushed up by floating-point noise (CCGA Best Practice 4-18 uses 1 m).
    expect(formatToleranceZone(1, 'metric')).toBe('1 m');
    expect(formatToleranceZone(0.6096, 'metric')).toBe('0.7 m');
  });
});
