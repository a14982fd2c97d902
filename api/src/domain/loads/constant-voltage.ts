import type { CvLineVoltage } from '../as-built/common.schema.js';

/**
 * Line voltage, volts rms, of a nominal constant-voltage system. "70 V" is 70.7 V = 100 V peak / √2
 * (so V² ≈ 5000 and a 1 W tap is 5000 Ω, as the EIA tap tables state).
 */
export function cvLineVoltageV(line: CvLineVoltage): number {
  switch (line) {
    case '25V':
      return 25;
    case '70V':
      return 100 / Math.SQRT2;
    case '100V':
      return 100;
  }
}

/** Impedance of a transformer tap: Z = V²/P, ohms, for line voltage `lineVoltageV` and tap `tapWatts`. Unrounded. */
export function cvTapImpedanceOhm(lineVoltageV: number, tapWatts: number): number {
  return (lineVoltageV * lineVoltageV) / tapWatts;
}

/**
 * Common practice (trade rule, no standards text): load a constant-voltage amplifier with taps
 * totalling at most 80 % of its rating, leaving 20 % for transformer losses, peaks and additions.
 */
export const CV_DEFAULT_MAX_LOAD_FRACTION = 0.8;

export interface CvLoadCheck {
  totalTapWatts: number;
  ratedWatts: number;
  /** total taps / rating, as a fraction. */
  loadFraction: number;
  /** Line impedance seen by the amp, ohms (V²/ΣP; Infinity with no taps). */
  lineOhm: number;
  lineCurrentA: number;
  status: 'ok' | 'over_headroom' | 'overload';
}

/**
 * Total tap watts on a CV line against the amplifier channel's rating. 'over_headroom' above
 * `maxLoadFraction` (default 80 %), 'overload' above 100 %. Unrounded.
 */
export function checkCvLoad(
  lineVoltageV: number,
  tapWatts: readonly number[],
  ratedWatts: number,
  maxLoadFraction = CV_DEFAULT_MAX_LOAD_FRACTION,
): CvLoadCheck {
  const totalTapWatts = tapWatts.reduce((sum, w) => sum + w, 0);
  const loadFraction = totalTapWatts / ratedWatts;
  const lineOhm = totalTapWatts === 0 ? Infinity : (lineVoltageV * lineVoltageV) / totalTapWatts;
  const status = loadFraction > 1 ? 'overload' : loadFraction > maxLoadFraction + 1e-12 ? 'over_headroom' : 'ok';
  return { totalTapWatts, ratedWatts, loadFraction, lineOhm, lineCurrentA: totalTapWatts / lineVoltageV, status };
}
