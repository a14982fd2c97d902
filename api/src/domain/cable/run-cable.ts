import { gaugeAreaMm2, type ConductorGauge } from './wire.js';

/**
 * Standard gauges offered as suggestions, each list from the thinnest to the thickest conductor.
 * The lists are the sizes residential speaker cable is stocked in (common practice).
 */
export const STANDARD_GAUGES: { readonly awg: readonly ConductorGauge[]; readonly mm2: readonly ConductorGauge[] } = {
  awg: [18, 16, 14, 12, 10, 8].map((awg) => ({ system: 'awg', awg }) as const),
  mm2: [0.75, 1, 1.5, 2.5, 4, 6].map((mm2) => ({ system: 'mm2', mm2 }) as const),
};

/**
 * Loop resistance of a two-conductor circuit of one-way length `lengthM` metres: 2·L·r, ohms, where
 * `ohmPerM` is one conductor's resistance per metre. With `parallelPairs` > 1 (one channel on several
 * pairs of the same run) the pairs are in parallel: 2·L·r / n. Unrounded.
 */
export function loopResistanceOhm(lengthM: number, ohmPerM: number, parallelPairs = 1): number {
  return (2 * lengthM * ohmPerM) / parallelPairs;
}

/**
 * Level change of a single resistive load `loadOhm` fed through `loopOhm` from an ideal (0 Ω)
 * amplifier, as attenuation in dB (positive = quieter): −20·log10(Z/(Z + R)). Unrounded.
 */
export function singleLoadLossDb(loadOhm: number, loopOhm: number): number {
  return -20 * Math.log10(loadOhm / (loadOhm + loopOhm));
}

export interface CableTotal {
  cableType: string;
  runCount: number;
  /** All runs of this type, metres (measured lengths). */
  lengthM: number;
  spareLengthM: number;
  abandonedLengthM: number;
}

interface RunForTotals {
  cableType: string;
  measuredLengthM: number;
  isSpare?: boolean | undefined;
  isAbandoned?: boolean | undefined;
}

/**
 * Total cable by type (grouped by the exact `cableType` text), metres, sorted by type name.
 * Spare and abandoned lengths are included in `lengthM` and also shown separately. Unrounded.
 */
export function cableTotalsByType(runs: readonly RunForTotals[]): CableTotal[] {
  const byType = new Map<string, CableTotal>();
  for (const run of runs) {
    let total = byType.get(run.cableType);
    if (total === undefined) {
      total = { cableType: run.cableType, runCount: 0, lengthM: 0, spareLengthM: 0, abandonedLengthM: 0 };
      byType.set(run.cableType, total);
    }
    total.runCount += 1;
    total.lengthM += run.measuredLengthM;
    if (run.isSpare === true) total.spareLengthM += run.measuredLengthM;
    if (run.isAbandoned === true) total.abandonedLengthM += run.measuredLengthM;
  }
  return [...byType.values()].sort((a, b) => a.cableType.localeCompare(b.cableType));
}

/** Standard gauges of the same system as `gauge`, thinnest first. */
export function standardGaugesLike(gauge: ConductorGauge): readonly ConductorGauge[] {
  return gauge.system === 'awg' ? STANDARD_GAUGES.awg : STANDARD_GAUGES.mm2;
}

/** True when the two gauges are the same size. */
export function isSameGauge(a: ConductorGauge, b: ConductorGauge): boolean {
  return Math.abs(gaugeAreaMm2(a) - gaugeAreaMm2(b)) < 1e-9 && a.system === b.system;
}
