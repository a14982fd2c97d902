import type { Gauge } from '../as-built/run.schema.js';
import { formatCoverDepth, formatGroundLength } from '../format/length.js';
import { formatGauge, gaugeAreaMm2, mm2ToEquivalentAwg } from '../cable/wire.js';
import type { PacketUnits } from './packet-snapshot.js';

/** A number with at most `digits` decimals, trailing zeros trimmed, never "-0". */
export function formatNumber(value: number, digits: number): string {
  const fixed = Number(value.toFixed(digits));
  return (Object.is(fixed, -0) ? 0 : fixed).toLocaleString('en-US', { maximumFractionDigits: digits });
}

/** A length along the ground: `26 ft 3 in` (nearest inch) or `8.01 m` (nearest centimetre); domain/format/length. */
export function formatLength(m: number, units: PacketUnits): string {
  return formatGroundLength(m, units);
}

/** A burial depth (cover): `4 1/4 in` (nearest 1/4 in) or `11 cm`; domain/format/length formatCoverDepth. */
export function formatDepth(m: number, units: PacketUnits): string {
  return formatCoverDepth(m, units);
}

/**
 * A conductor size in the company's system: imperial prints AWG (a metric cable also shows its nearest
 * AWG), metric prints mm² (an AWG cable also shows its gauge, since that is what the jacket says).
 */
export function formatGaugeForUnits(gauge: Gauge, units: PacketUnits): string {
  if (units === 'imperial') {
    return gauge.system === 'awg' ? formatGauge(gauge) : `${formatGauge(gauge)} (≈ ${Math.round(mm2ToEquivalentAwg(gauge.mm2))} AWG)`;
  }
  return gauge.system === 'mm2' ? formatGauge(gauge) : `${formatNumber(gaugeAreaMm2(gauge), 2)} mm² (${formatGauge(gauge)})`;
}

/** Ohms, e.g. `5.33 Ω` (U+03A9, which the shipped Inter subsets cover). */
export function formatOhm(ohm: number | null, digits = 2): string {
  if (ohm === null || !Number.isFinite(ohm)) return 'open';
  return `${formatNumber(ohm, digits)} Ω`;
}

export function formatDb(db: number): string {
  return `${formatNumber(db, 2)} dB`;
}

export function formatWatts(w: number): string {
  return `${formatNumber(w, w >= 100 ? 0 : 1)} W`;
}

const MONTHS = ['Jan', 'Feb', 'Mar', 'Apr', 'May', 'Jun', 'Jul', 'Aug', 'Sep', 'Oct', 'Nov', 'Dec'] as const;

/**
 * A calendar date written out so that it reads the same in every country: `14 May 2026`. Takes an ISO
 * date (`2026-05-14`) or timestamp; timestamps are read in UTC so output does not depend on the server.
 */
export function formatDate(iso: string | null | undefined): string {
  if (!iso) return '—';
  const match = /^(\d{4})-(\d{2})-(\d{2})/.exec(iso);
  if (!match) return iso;
  const date = iso.length > 10 ? new Date(iso) : undefined;
  const [year, month, day] = date
    ? [date.getUTCFullYear(), date.getUTCMonth() + 1, date.getUTCDate()]
    : [Number(match[1]), Number(match[2]), Number(match[3])];
  return `${day} ${MONTHS[month - 1]} ${year}`;
}

/** A date and time in UTC: `14 May 2026, 16:05 UTC`. */
export function formatDateTime(iso: string | null | undefined): string {
  if (!iso) return '—';
  const date = new Date(iso);
  if (Number.isNaN(date.getTime())) return iso;
  const hh = String(date.getUTCHours()).padStart(2, '0');
  const mm = String(date.getUTCMinutes()).padStart(2, '0');
  return `${formatDate(iso)}, ${hh}:${mm} UTC`;
}
