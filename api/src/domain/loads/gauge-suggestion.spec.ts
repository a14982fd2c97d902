import { describe, expect, it } from 'vitest';

import { AsBuiltSchema, type AsBuilt } from '../as-built/as-built.schema.js';
import type { Item } from '../as-built/item.schema.js';
import { analyzeAsBuilt } from '../analysis/analyze.js';

/*
 * Gauge suggestions: the thinnest standard gauge that keeps every speaker a run feeds within the level-drop
 * limit (0.5 dB by default — common practice, no published source). Each expected gauge is worked by hand
 * from [NBS-H100] resistances at 20 °C (Ω per 1000 ft: 18 AWG 6.385, 16 AWG 4.016, 14 AWG 2.525, 12 AWG
 * 1.588, 10 AWG 0.9989) with level drop = 20·log10((Z + R_loop)/Z) (docs/reference.md §3).
 */

const FT = 0.3048;

function single(oneWayFt: number, ohm: number, awg = 18, limitDb?: number) {
  const asBuilt: AsBuilt = {
    zones: [],
    referencePoints: [],
    items: [
      { id: 'amp', kind: 'amplifier', label: 'Amp', channels: [{ id: 'a', name: 'A' }], ratedWatts8Ohm: 100, ratedWatts4Ohm: 160, minimumImpedanceOhm: 2 } as Item,
      { id: 'sp', kind: 'speaker', label: 'Speaker', nominalImpedanceOhm: ohm, position: { x: 1, y: 1, source: 'manual' } } as Item,
    ],
    runs: [
      {
        id: 'r1',
        label: 'Run',
        fromItemId: 'amp',
        toItemId: 'sp',
        cableType: `${awg}/2 direct burial`,
        gauge: { system: 'awg', awg },
        conductors: 2,
        pairs: [{ pairIndex: 1, channel: { amplifierItemId: 'amp', channelId: 'a' } }],
        measuredLengthM: oneWayFt * FT,
        method: 'direct_burial',
        depthReadings: [{ stationM: 1, depthM: 0.2 }],
      },
    ],
    checks: [],
  };
  return analyzeAsBuilt(AsBuiltSchema.parse(asBuilt), limitDb === undefined ? {} : { lossLimitDb: limitDb }).runs[0]!.gaugeSuggestion!;
}

describe('gauge suggestions', () => {
  it.each([
    // 50 ft into 8 Ω: 18 AWG loop 0.6385 Ω → 0.667 dB (too much); 16 AWG 0.4016 Ω → 0.425 dB → 16 AWG.
    [50, 8, 16],
    // 100 ft into 8 Ω: 14 AWG 0.505 Ω → 0.532 dB (too much); 12 AWG 0.3176 Ω → 0.338 dB → 12 AWG.
    [100, 8, 12],
    // 100 ft into 16 Ω: 16 AWG 0.8032 Ω → 0.425 dB → 16 AWG.
    [100, 16, 16],
    // 50 ft into 4 Ω: 14 AWG 0.2525 Ω → 0.532 dB (too much); 12 AWG 0.1588 Ω → 0.338 dB → 12 AWG.
    [50, 4, 12],
    // 25 ft into 8 Ω: 18 AWG 0.3193 Ω → 0.340 dB → the thinnest standard gauge, 18 AWG.
    [25, 8, 18],
  ] as const)('should suggest for %i ft one way into %i Ω the %i AWG worked by hand', (ft, ohm, awg) => {
    expect(single(ft, ohm).suggestedGauge).toEqual({ system: 'awg', awg });
  });

  it('should say whether the installed gauge meets the limit, with its worst level drop', () => {
    // 100 ft of 14 AWG into 8 Ω: 0.532 dB (worked above) — over 0.5 dB, under 1 dB.
    const installed = single(100, 8, 14);
    expect(installed.worstLossDbInstalled).toBeCloseTo(0.532, 2);
    expect(installed.installedMeetsLimit).toBe(false);
    expect(single(100, 8, 14, 1).installedMeetsLimit).toBe(true);
  });

  // Property (no outside value): a looser limit never asks for a thicker gauge.
  it('should never suggest a thicker gauge for a looser limit', () => {
    for (const ft of [20, 60, 120, 200]) {
      const strict = single(ft, 8, 18, 0.3).suggestedGauge;
      const loose = single(ft, 8, 18, 1).suggestedGauge;
      if (strict !== null && loose !== null && strict.system === 'awg' && loose.system === 'awg') {
        expect(loose.awg).toBeGreaterThanOrEqual(strict.awg);
      }
    }
  });
});
