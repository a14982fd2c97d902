import { METRES_PER_FOOT } from '@domain/as-built/units';

/** The 1-2-5 series lengths a scale bar may show, in the display unit. */
const NICE_STEPS = [1, 2, 5];

/**
 * A scale bar for `pixelsPerMetre`: the longest round length (1, 2, 5 × 10ⁿ of metres or feet) that
 * fits in `maxPixels`.
 */
export function scaleBarFor(pixelsPerMetre: number, maxPixels: number, system: 'metric' | 'imperial'): { lengthM: number; pixels: number; label: string } {
  const unitM = system === 'metric' ? 1 : METRES_PER_FOOT;
  const maxUnits = maxPixels / (pixelsPerMetre * unitM);
  let best = 0;
  for (let exponent = -3; exponent <= 6; exponent += 1) {
    for (const step of NICE_STEPS) {
      const value = step * 10 ** exponent;
      if (value <= maxUnits && value > best) best = value;
    }
  }
  if (best === 0) best = 10 ** -3;
  const value = Number(best.toPrecision(3));
  const lengthM = value * unitM;
  const label = system === 'metric' ? (value < 1 ? `${Number((value * 100).toPrecision(3))} cm` : `${value} m`) : `${value} ft`;
  return { lengthM, pixels: lengthM * pixelsPerMetre, label };
}
