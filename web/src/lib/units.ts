import { parseLengthInput, type LengthParse } from '@domain/as-built/length-input';
import {
  formatLength as formatDomainLength,
  lengthEditText,
  unitFactor,
  unitSymbol,
  type LengthScale as DomainLengthScale,
} from '@domain/format/length';
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
export type LengthScale = DomainLengthScale;

export type ParseResult = LengthParse;

/** The unit a bare number is read in, for each system and scale. */
export function defaultUnitFactor(system: LengthSystem, scale: LengthScale): number {
  return unitFactor(system, scale);
}

export function unitLabel(system: LengthSystem, scale: LengthScale): string {
  return unitSymbol(system, scale);
}

/**
 * Reads a length typed in a field (the domain's one parser): `18' 6"`, `18 6`, `18ft 6in`, `18.5`, `6"`,
 * `4 1/4 in`, `4¼`, `2.5 m`, `15 cm`; a bare number is in the field's unit. `field` names the field in the
 * message. Returns metres, unrounded.
 */
export function parseLength(input: string, system: LengthSystem, scale: LengthScale, field?: string): ParseResult {
  return parseLengthInput(input, { system, scale, field });
}

/**
 * Metres for display (the domain's one formatter): ground lengths as `26 ft 3 in` or `8.01 m`, depths
 * as `4 1/8 in` (nearest eighth) or `11.5 cm`.
 */
export function formatLength(metres: number, system: LengthSystem, scale: LengthScale): string {
  return formatDomainLength(metres, system, scale);
}

/** The value put back into an input for editing: `18' 6"`, `7 3/4` (in), `12.5` (m), `15` (cm). */
export function lengthInputValue(metres: number, system: LengthSystem, scale: LengthScale): string {
  return lengthEditText(metres, system, scale);
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
