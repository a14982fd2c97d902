import { METRES_PER_FOOT, METRES_PER_INCH, metresToInches, toFeetAndInches } from '@domain/as-built/units';
import type { Gauge } from '@domain/as-built/run.schema';
import { isKnownMm2, MAX_AWG, MIN_AWG } from '@domain/cable/wire';

/** How lengths are typed and shown. Everything is stored in metres whichever is chosen. */
export type LengthSystem = 'imperial' | 'metric';
/** How conductor sizes are typed and shown. */
export type GaugeSystem = 'awg' | 'mm2';

export type UnitPreferences = { length: LengthSystem; gauge: GaugeSystem };

/** How each unit system is named in choices (settings, the units chooser). */
export const LENGTH_UNIT_LABELS: Record<LengthSystem, string> = { imperial: 'Feet and inches', metric: 'Metres and centimetres' };
export const GAUGE_UNIT_LABELS: Record<GaugeSystem, string> = { awg: 'AWG', mm2: 'mm²' };

/**
 * - `long`: run lengths, stations, ties (feet / metres);
 * - `short`: depths and hole sizes (inches / centimetres).
 */
export type LengthScale = 'long' | 'short';

export type ParseResult = { ok: true; metres: number } | { ok: false; message: string };

const UNIT_FACTORS: Record<string, number> = {
  m: 1,
  metre: 1,
  metres: 1,
  meter: 1,
  meters: 1,
  cm: 0.01,
  mm: 0.001,
  ft: METRES_PER_FOOT,
  feet: METRES_PER_FOOT,
  foot: METRES_PER_FOOT,
  "'": METRES_PER_FOOT,
  '′': METRES_PER_FOOT,
  in: METRES_PER_INCH,
  inch: METRES_PER_INCH,
  inches: METRES_PER_INCH,
  '"': METRES_PER_INCH,
  '″': METRES_PER_INCH,
  "''": METRES_PER_INCH,
};

/** The unit a bare number is read in, for each system and scale. */
export function defaultUnitFactor(system: LengthSystem, scale: LengthScale): number {
  if (system === 'metric') return scale === 'long' ? 1 : 0.01;
  return scale === 'long' ? METRES_PER_FOOT : METRES_PER_INCH;
}

export function unitLabel(system: LengthSystem, scale: LengthScale): string {
  if (system === 'metric') return scale === 'long' ? 'm' : 'cm';
  return scale === 'long' ? 'ft' : 'in';
}

// A number (comma or point for decimals) optionally followed by a unit: "6 in", "0.15m", "2'", "6\"".
const TERM = /(\d+(?:[.,]\d+)?|[.,]\d+)\s*(mm|cm|metres?|meters?|m|ft|feet|foot|inch(?:es)?|in|''|'|′|"|″)?/giy;

/**
 * Reads a length typed in the field: a bare number in the chosen unit (`6` is 6 in for a depth in
 * imperial), or with units, also mixed: `6 in`, `0.15 m`, `15 cm`, `2' 6"`, `2 ft 6 in`, `1,5 m`.
 * Returns metres, unrounded.
 */
export function parseLength(input: string, system: LengthSystem, scale: LengthScale): ParseResult {
  const text = input.trim().toLowerCase();
  if (text === '') return { ok: false, message: 'Enter a length.' };
  if (text.startsWith('-')) return { ok: false, message: 'A length cannot be negative.' };
  let total = 0;
  let terms = 0;
  let hasBare = false;
  let index = 0;
  TERM.lastIndex = 0;
  while (index < text.length) {
    while (text[index] === ' ') index += 1;
    if (index >= text.length) break;
    TERM.lastIndex = index;
    const match = TERM.exec(text);
    if (!match) return { ok: false, message: `Cannot read "${input.trim()}" as a length, e.g. ${example(system, scale)}.` };
    const value = Number(match[1]!.replace(',', '.'));
    const unit = match[2];
    if (unit === undefined) {
      // A bare number after a foot term is inches (2' 6); alone it is in the field's unit.
      if (hasBare) return { ok: false, message: `Cannot read "${input.trim()}" as a length, e.g. ${example(system, scale)}.` };
      hasBare = true;
      const previousWasFeet = terms > 0 && /(ft|feet|foot|'|′)\s*$/.test(text.slice(0, index).trim());
      total += value * (previousWasFeet ? METRES_PER_INCH : defaultUnitFactor(system, scale));
    } else {
      total += value * UNIT_FACTORS[unit]!;
    }
    terms += 1;
    index = TERM.lastIndex;
  }
  if (!Number.isFinite(total)) return { ok: false, message: 'Enter a length.' };
  return { ok: true, metres: total };
}

function example(system: LengthSystem, scale: LengthScale): string {
  if (system === 'metric') return scale === 'long' ? '12.5 m' : '15 cm';
  return scale === 'long' ? `40 ft or 40' 6"` : '6 in';
}

function trimNumber(value: number, digits: number): string {
  return String(Number(value.toFixed(digits)));
}

/**
 * Metres for display: long lengths as `12.5 m` or `41 ft 2 in`, short ones as `15 cm` or `6 in`
 * (to the nearest ¼ in).
 */
export function formatLength(metres: number, system: LengthSystem, scale: LengthScale): string {
  if (system === 'metric') {
    return scale === 'long' ? `${trimNumber(metres, 2)} m` : `${trimNumber(metres * 100, 1)} cm`;
  }
  if (scale === 'short') return `${trimNumber(Math.round(metresToInches(metres) * 4) / 4, 2)} in`;
  const { feet, inches } = toFeetAndInches(metres);
  return inches === 0 ? `${feet} ft` : `${feet} ft ${Math.abs(inches)} in`;
}

/** The value put back into an input for editing: a plain number in the field's unit. */
export function lengthInputValue(metres: number, system: LengthSystem, scale: LengthScale): string {
  return trimNumber(metres / defaultUnitFactor(system, scale), system === 'metric' ? 3 : 2);
}

/**
 * Reads a conductor size: `14`, `14 AWG`, `1/0`, `2/0 AWG` as AWG (1/0 = 0, 2/0 = −1 …); `2.5`, `2.5 mm²`,
 * `2,5 mm2` as mm² (a number with a unit decides; a bare number follows `system`).
 */
export function parseGauge(input: string, system: GaugeSystem): { ok: true; gauge: Gauge } | { ok: false; message: string } {
  const text = input.trim().toLowerCase().replace(',', '.');
  if (text === '') return { ok: false, message: 'Enter the conductor size.' };
  const aught = /^(\d)\/0(\s*awg)?$/.exec(text);
  if (aught) return awg(1 - Number(aught[1]));
  const withUnit = /^(\d+(?:\.\d+)?)\s*(awg|ga|mm²|mm2|sq\s*mm)?$/.exec(text);
  if (!withUnit) return { ok: false, message: `Cannot read "${input.trim()}" as a gauge, e.g. ${system === 'awg' ? '14 or 1/0' : '2.5'}.` };
  const value = Number(withUnit[1]);
  const unit = withUnit[2];
  const isMetric = unit === undefined ? system === 'mm2' : !(unit === 'awg' || unit === 'ga');
  if (isMetric) {
    return isKnownMm2(value)
      ? { ok: true, gauge: { system: 'mm2', mm2: value } }
      : { ok: false, message: 'Use a standard metric size: 0.5, 0.75, 1, 1.5, 2.5, 4, 6 or 10 mm².' };
  }
  return awg(value);
}

function awg(value: number): { ok: true; gauge: Gauge } | { ok: false; message: string } {
  if (!Number.isInteger(value) || value < MIN_AWG || value > MAX_AWG) {
    return { ok: false, message: 'Use a whole AWG number from 4/0 to 40.' };
  }
  return { ok: true, gauge: { system: 'awg', awg: value } };
}

/** A gauge as typed back into the field. */
export function gaugeInputValue(gauge: Gauge): string {
  if (gauge.system === 'mm2') return `${gauge.mm2} mm²`;
  return gauge.awg <= 0 ? `${1 - gauge.awg}/0 AWG` : `${gauge.awg} AWG`;
}
