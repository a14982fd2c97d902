import { describe, expect, it } from 'vitest';

import {
  celsiusToFahrenheit,
  fahrenheitToCelsius,
  feetToMetres,
  formatFeetInches,
  inchesToMetres,
  metresToFeet,
  ohmPerMToOhmPerKft,
  toFeetAndInches,
} from './units.js';

describe(metresToFeet.name, () => {
  // International foot (1959): exactly 0.3048 m.
  it.each([
    [0.3048, 1],
    [30.48, 100],
    [0, 0],
  ])('should convert %f m to %f ft', (m, ft) => {
    expect(metresToFeet(m)).toBeCloseTo(ft, 12);
    expect(feetToMetres(ft)).toBeCloseTo(m, 12);
  });

  it('should convert inches exactly (25.4 mm)', () => {
    expect(inchesToMetres(6)).toBeCloseTo(0.1524, 12);
  });
});

describe(toFeetAndInches.name, () => {
  it.each([
    [3.7338, 12, 3],
    [1.8288, 6, 0],
    [0.1524, 0, 6],
    [0.2999, 1, 0], // 11.8 in rounds to 12 in and carries into the next foot
  ])('should split %f m into %i ft %i in', (m, feet, inches) => {
    expect(toFeetAndInches(m)).toEqual({ feet, inches });
  });

  it('should format feet and inches for print', () => {
    expect(formatFeetInches(3.7338)).toBe('12 ft 3 in');
  });
});

describe(ohmPerMToOhmPerKft.name, () => {
  it('should convert Ω/m to Ω/1000 ft', () => {
    expect(ohmPerMToOhmPerKft(0.008286)).toBeCloseTo(2.5256, 4);
  });
});

describe(celsiusToFahrenheit.name, () => {
  it.each([
    [0, 32],
    [20, 68],
    [75, 167],
  ])('should convert %f °C to %f °F and back', (c, f) => {
    expect(celsiusToFahrenheit(c)).toBeCloseTo(f, 12);
    expect(fahrenheitToCelsius(f)).toBeCloseTo(c, 12);
  });
});
