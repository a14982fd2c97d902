/**
 * Display conversions. Everything is stored and computed in SI; these helpers exist for forms and
 * print. The foot is exactly 0.3048 m (international yard and pound agreement, 1959).
 */

export const METRES_PER_FOOT = 0.3048;
export const METRES_PER_INCH = 0.0254;

/** Metres → feet, unrounded. */
export function metresToFeet(m: number): number {
  return m / METRES_PER_FOOT;
}

/** Feet → metres, unrounded. */
export function feetToMetres(ft: number): number {
  return ft * METRES_PER_FOOT;
}

/** Metres → inches, unrounded. */
export function metresToInches(m: number): number {
  return m / METRES_PER_INCH;
}

/** Inches → metres, unrounded. */
export function inchesToMetres(inches: number): number {
  return inches * METRES_PER_INCH;
}

/**
 * Metres → whole feet and inches rounded to the nearest `stepInches` (default 1 in), carrying
 * 12 in into the next foot. Negative input keeps the sign on `feet` and on `inches`.
 */
export function toFeetAndInches(m: number, stepInches = 1): { feet: number; inches: number } {
  const sign = m < 0 ? -1 : 1;
  const totalInches = Math.round(metresToInches(Math.abs(m)) / stepInches) * stepInches;
  const feet = Math.floor(totalInches / 12 + 1e-9);
  const inches = Math.max(0, totalInches - feet * 12);
  return { feet: sign * feet, inches: sign * inches === 0 ? 0 : sign * inches };
}

/** Formats metres as e.g. `12 ft 3 in` (nearest inch). */
export function formatFeetInches(m: number): string {
  const { feet, inches } = toFeetAndInches(m);
  return `${feet} ft ${Math.abs(inches)} in`;
}

/** Ω per metre → Ω per 1000 ft (the unit of U.S. wire tables). */
export function ohmPerMToOhmPerKft(ohmPerM: number): number {
  return ohmPerM * METRES_PER_FOOT * 1000;
}

/** °C → °F. */
export function celsiusToFahrenheit(c: number): number {
  return (c * 9) / 5 + 32;
}

/** °F → °C. */
export function fahrenheitToCelsius(f: number): number {
  return ((f - 32) * 5) / 9;
}
