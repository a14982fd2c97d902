import { describe, expect, it } from 'vitest';

import { AsBuiltSchema, type AsBuilt } from '../as-built/as-built.schema.js';
import type { Item } from '../as-built/item.schema.js';
import type { Run } from '../as-built/run.schema.js';
import { analyzeAsBuilt } from '../analysis/analyze.js';

/*
 * Dual-voice-coil subwoofers as the crew records them (coil impedance and how the coils are wired), through
 * the whole analysis, against the handbook results of elementary circuit theory ([ECT], docs/reference.md
 * §3, loads_textbook.json): two coils in series add, in parallel halve; two subwoofers on one channel are in
 * parallel unless recorded as a series chain.
 */

const A = { amplifierItemId: 'amp', channelId: 'a' };

function run(id: string, from: string, to: string): Run {
  return {
    id,
    label: id,
    fromItemId: from,
    toItemId: to,
    cableType: '12/2 direct burial',
    gauge: { system: 'awg', awg: 12 },
    conductors: 2,
    pairs: [{ pairIndex: 1, channel: A }],
    measuredLengthM: 3,
    method: 'direct_burial',
    depthReadings: [{ stationM: 1, depthM: 0.3 }],
  } as Run;
}

function sub(id: string, coilOhm: number, coilWiring: 'series' | 'parallel', onward?: 'series'): Item {
  return {
    id,
    kind: 'subwoofer',
    label: id,
    voiceCoils: 'dual',
    coilImpedanceOhm: coilOhm,
    coilWiring,
    position: { x: 1, y: 1, source: 'manual' },
    ...(onward === undefined ? {} : { onwardWiring: onward }),
  } as Item;
}

function channelLoad(subs: Item[], runs: Run[]): number {
  const asBuilt: AsBuilt = {
    zones: [],
    referencePoints: [],
    items: [
      { id: 'amp', kind: 'amplifier', label: 'Amp', channels: [{ id: 'a', name: 'A' }], ratedWatts8Ohm: 100, minimumImpedanceOhm: 1 } as Item,
      ...subs,
    ],
    runs,
    checks: [],
  };
  return analyzeAsBuilt(AsBuiltSchema.parse(asBuilt)).channels[0]!.loadOhmNominal!;
}

describe('dual-voice-coil subwoofers through the analysis', () => {
  // [ECT]: 2 × 8 Ω coils — series 16 Ω, parallel 4 Ω; 2 × 4 Ω coils — series 8 Ω, parallel 2 Ω.
  it.each([
    [8, 'series', 16],
    [8, 'parallel', 4],
    [4, 'series', 8],
    [4, 'parallel', 2],
  ] as const)('should load the channel with a 2 × %i Ω sub wired in %s at %i Ω', (coil, wiring, ohm) => {
    expect(channelLoad([sub('s1', coil, wiring)], [run('r1', 'amp', 's1')])).toBeCloseTo(ohm, 9);
  });

  // [ECT]: two DVC 2 × 4 Ω subs, each wired in series (8 Ω), paralleled on one channel → 4 Ω;
  // each in parallel (2 Ω) and paralleled → 1 Ω.
  it.each([
    ['series', 4],
    ['parallel', 1],
  ] as const)('should parallel two 2 × 4 Ω subs whose coils are in %s to %i Ω', (wiring, ohm) => {
    const load = channelLoad([sub('s1', 4, wiring), sub('s2', 4, wiring)], [run('r1', 'amp', 's1'), run('r2', 'amp', 's2')]);
    expect(load).toBeCloseTo(ohm, 9);
  });

  // [ECT]: two DVC 2 × 4 Ω subs with coils in parallel (2 Ω each), the subs chained in series → 4 Ω.
  it('should chain two 2 × 4 Ω subs with parallel coils in series to 4 Ω', () => {
    const load = channelLoad([sub('s1', 4, 'parallel', 'series'), sub('s2', 4, 'parallel')], [run('r1', 'amp', 's1'), run('r2', 's1', 's2')]);
    expect(load).toBeCloseTo(4, 9);
  });
});
