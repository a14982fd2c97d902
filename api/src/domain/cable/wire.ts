/**
 * Copper conductor resistance. AWG sizes use the ASTM B258 diameter formula; metric sizes use the
 * IEC 60228 class 5 (flexible) maximum resistance table, which is stored, not computed, because the
 * standard's maxima sit 7–16 % above ρ/A of the nominal area.
 */

import { ValidationError } from '../errors.js';

/** Largest conductor we accept: 4/0 AWG is n = −3 in the ASTM B258 formula. */
export const MIN_AWG = -3;
/** Finest conductor we accept. */
export const MAX_AWG = 40;

/** International Annealed Copper Standard volume resistivity at 20 °C: 1/58 Ω·mm²/m. */
export const IACS_RESISTIVITY_OHM_MM2_PER_M = 1 / 58;

/** Temperature coefficient of resistance of 100 % IACS copper, referred to 20 °C, per °C. */
export const COPPER_ALPHA_20_PER_C = 0.00393;

/** Accepted conductor temperature range for the analysis option, °C. */
export const CONDUCTOR_TEMPERATURE_RANGE_C = { min: -40, max: 150 } as const;

/**
 * IEC 60228:2004 Table 3, class 5 flexible plain (untinned) copper: maximum DC resistance at 20 °C,
 * Ω/km, keyed by nominal area mm².
 */
export const IEC_60228_CLASS5_MAX_OHM_PER_KM: ReadonlyArray<readonly [mm2: number, ohmPerKm: number]> = [
  [0.5, 39.0],
  [0.75, 26.0],
  [1, 19.5],
  [1.5, 13.3],
  [2.5, 7.98],
  [4, 4.95],
  [6, 3.3],
  [10, 1.91],
];

export type AwgGauge = { system: 'awg'; awg: number };
export type Mm2Gauge = { system: 'mm2'; mm2: number };
export type ConductorGauge = AwgGauge | Mm2Gauge;

function findIecRow(mm2: number): readonly [number, number] | undefined {
  return IEC_60228_CLASS5_MAX_OHM_PER_KM.find(([area]) => Math.abs(area - mm2) < 1e-9);
}

/** True when `mm2` is one of the IEC 60228 nominal areas in {@link IEC_60228_CLASS5_MAX_OHM_PER_KM}. */
export function isKnownMm2(mm2: number): boolean {
  return findIecRow(mm2) !== undefined;
}

/** True for a whole AWG number between 4/0 (−3) and 40. */
export function isKnownAwg(awg: number): boolean {
  return Number.isInteger(awg) && awg >= MIN_AWG && awg <= MAX_AWG;
}

/**
 * Diameter of a solid conductor of gauge `awg`, millimetres, by ASTM B258:
 * d = 0.127 mm × 92^((36 − n)/39). 1/0…4/0 are n = 0…−3. Unrounded.
 */
export function awgDiameterMm(awg: number): number {
  return 0.127 * 92 ** ((36 - awg) / 39);
}

/** Cross-sectional area of gauge `awg`, mm² (π·d²/4 of the ASTM B258 diameter; stranded AWG is sized by this equivalent solid area). */
export function awgAreaMm2(awg: number): number {
  const d = awgDiameterMm(awg);
  return (Math.PI * d * d) / 4;
}

/**
 * The fractional AWG whose ASTM B258 area equals `mm2` (e.g. 2.5 mm² → 13.2). Inverse of
 * {@link awgAreaMm2}; not rounded.
 */
export function mm2ToEquivalentAwg(mm2: number): number {
  const d = Math.sqrt((4 * mm2) / Math.PI);
  return 36 - (39 * Math.log(d / 0.127)) / Math.log(92);
}

/** Resistance ratio R(T)/R(20 °C) for annealed copper: 1 + α20·(T − 20). */
export function copperTemperatureFactor(temperatureC: number): number {
  return 1 + COPPER_ALPHA_20_PER_C * (temperatureC - 20);
}

/**
 * Nominal conductor area, mm²: the ASTM B258 area for AWG, the nominal IEC size for metric.
 */
export function gaugeAreaMm2(gauge: ConductorGauge): number {
  return gauge.system === 'awg' ? awgAreaMm2(gauge.awg) : gauge.mm2;
}

/**
 * DC resistance of ONE conductor, Ω per metre, at `temperatureC` (default 20 °C).
 * AWG: IACS resistivity 1/58 Ω·mm²/m over the ASTM B258 area (solid-wire value; stranded is about 2 %
 * higher). mm²: IEC 60228 class 5 maximum at 20 °C. Both corrected by 1 + 0.00393·(T − 20). Unrounded.
 * A gauge outside the tables (the schema rejects those first) is a ValidationError naming `path`
 * (`runs.0.gauge` → `runs.0.gauge.awg`), so it answers 400 at the field rather than a 500.
 */
export function conductorResistanceOhmPerM(gauge: ConductorGauge, temperatureC = 20, path = 'gauge'): number {
  const factor = copperTemperatureFactor(temperatureC);
  if (gauge.system === 'awg') {
    if (!isKnownAwg(gauge.awg)) {
      throw new ValidationError([{ path: `${path}.awg`, message: `unknown AWG gauge ${gauge.awg}: use a whole number from ${MIN_AWG} (4/0) to ${MAX_AWG}` }]);
    }
    return (IACS_RESISTIVITY_OHM_MM2_PER_M / awgAreaMm2(gauge.awg)) * factor;
  }
  const row = findIecRow(gauge.mm2);
  if (row === undefined) {
    throw new ValidationError([{ path: `${path}.mm2`, message: `unknown metric conductor size ${gauge.mm2} mm²: use an IEC 60228 size` }]);
  }
  return (row[1] / 1000) * factor;
}

/** Display name of a gauge: "14 AWG", "2/0 AWG", "2.5 mm²". */
export function formatGauge(gauge: ConductorGauge): string {
  if (gauge.system === 'mm2') return `${gauge.mm2} mm²`;
  if (gauge.awg <= 0) return `${1 - gauge.awg}/0 AWG`;
  return `${gauge.awg} AWG`;
}
