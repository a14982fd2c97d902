import { formatGauge, gaugeAreaMm2, mm2ToEquivalentAwg } from '../cable/wire.js';
import type { Gauge } from '../as-built/run.schema.js';
import type { LengthSystem } from './length.js';
import { trimNumber } from './length.js';

/**
 * Conductor cross-sections and resistances for people. A cable is sold by gauge, so the area reads in
 * the reader's system with the other in brackets when the jacket says something else:
 * imperial `12 AWG` or `2.5 mm² (≈ 13 AWG)`; metric `3.31 mm² (12 AWG)` or `2.5 mm²`.
 */
export function formatConductor(gauge: Gauge, system: LengthSystem): string {
  if (system === 'imperial') {
    return gauge.system === 'awg' ? formatGauge(gauge) : `${formatGauge(gauge)} (≈ ${Math.round(mm2ToEquivalentAwg(gauge.mm2))} AWG)`;
  }
  return gauge.system === 'mm2' ? formatGauge(gauge) : `${trimNumber(gaugeAreaMm2(gauge), 2)} mm² (${formatGauge(gauge)})`;
}

/** A resistance or impedance: `5.33 Ω`, `0.48 Ω`; below 0.1 Ω three decimals (`0.052 Ω`); `open` for none. */
export function formatResistance(ohm: number | null | undefined): string {
  if (ohm === null || ohm === undefined || !Number.isFinite(ohm)) return 'open';
  return `${trimNumber(ohm, Math.abs(ohm) < 0.1 ? 3 : 2)} Ω`;
}

/** A level difference: `1.25 dB`. */
export function formatDecibels(db: number): string {
  return `${trimNumber(db, 2)} dB`;
}

/** A power: `153 W` at or above 100 W, else one decimal (`12.5 W`). */
export function formatWatts(w: number): string {
  return `${trimNumber(w, w >= 100 ? 0 : 1)} W`;
}
