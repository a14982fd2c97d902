import { describe, expect, it } from 'vitest';

import { AsBuiltSchema, type AsBuilt } from '../as-built/as-built.schema.js';
import { DEMO_AS_BUILT } from '../as-built/demo-as-built.js';
import type { Item } from '../as-built/item.schema.js';
import type { Run } from '../as-built/run.schema.js';
import { getIssues } from '@placemarkio/check-geojson';

import { validateGeoJson } from '../geometry/geojson-validate.js';
import { analyzeAsBuilt } from './analyze.js';

type Mutable = { -readonly [K in keyof AsBuilt]: AsBuilt[K] };
const demo = (): Mutable => structuredClone(DEMO_AS_BUILT);
const PATIO = { amplifierItemId: 'amp-1', channelId: 'ch-patio' };
const SPA = { amplifierItemId: 'amp-1', channelId: 'ch-spa' };

function codes(ab: AsBuilt, options = {}): string[] {
  return analyzeAsBuilt(AsBuiltSchema.parse(ab), options).findings.map((f) => f.code);
}

function run(id: string, from: string, to: string, lengthM: number, channel: typeof PATIO | null, awg = 14): Run {
  return {
    id,
    label: id,
    fromItemId: from,
    toItemId: to,
    cableType: `${awg}/2 direct burial`,
    gauge: { system: 'awg', awg },
    conductors: 2,
    pairs: [{ pairIndex: 1, channel }],
    measuredLengthM: lengthM,
    method: 'direct_burial',
    depthReadings: [{ stationM: 1, depthM: 0.2 }],
  };
}

function speaker(id: string, ohm: number, extra: Partial<Item> = {}): Item {
  return { id, kind: 'speaker', label: id, nominalImpedanceOhm: ohm, position: { x: 1, y: 1, source: 'manual' }, ...extra } as Item;
}

/** One amp channel driving one speaker over one run. */
function single(lengthM: number, awg: number, ohm: number): Mutable {
  return {
    zones: [],
    referencePoints: [],
    items: [
      { id: 'amp', kind: 'amplifier', label: 'Amp', channels: [{ id: 'a', name: 'A' }], ratedWatts8Ohm: 100, ratedWatts4Ohm: 160, minimumImpedanceOhm: 4 },
      speaker('sp', ohm),
    ],
    runs: [run('r1', 'amp', 'sp', lengthM, { amplifierItemId: 'amp', channelId: 'a' }, awg)],
    checks: [],
  };
}

describe(analyzeAsBuilt.name, () => {
  describe('demo job', () => {
    const sut = analyzeAsBuilt(AsBuiltSchema.parse(DEMO_AS_BUILT));

    it('should raise only the shallow station on run P2', () => {
      expect(sut.findings.map((f) => [f.code, f.path.join('.')])).toEqual([['DEPTH_SHALLOW', 'runs.3.depthReadings.1']]);
      expect(sut.summary).toMatchObject({ critical: 0, warning: 1, info: 0, itemCount: 13, runCount: 11 });
    });

    it('should compute both channel loads (parallel 4 × 16 Ω; 8 ‖ (8 + 8) series pair)', () => {
      const [patio, spa] = sut.channels;
      expect(patio!.loadOhmNominal).toBeCloseTo(4, 12);
      expect(spa!.loadOhmNominal).toBeCloseTo(16 / 3, 12);
      expect(patio!.loadOhmWithCable!).toBeGreaterThan(4);
      // Loads under 8 Ω use the 4 Ω rating: V = √(160 W · 4 Ω).
      expect(patio!.outputVoltageV).toBeCloseTo(Math.sqrt(640), 12);
      expect(patio!.outputBasis).toBe('rated_4_ohm');
    });

    it('should give each series-pair speaker the same current and half the string voltage', () => {
      const spa = sut.channels[1]!;
      const s2 = spa.loads.find((l) => l.itemId === 'sp-s2')!;
      const s3 = spa.loads.find((l) => l.itemId === 'sp-s3')!;
      expect(s2.currentA).toBeCloseTo(s3.currentA, 12);
      expect(s2.voltageV).toBeCloseTo(s3.voltageV, 12);
      // With ideal cable the 16 Ω string takes V/16 at the amp's voltage.
      expect(s2.idealPowerW).toBeCloseTo((640 / 16 ** 2) * 8, 9);
      expect(s3.runIds).toEqual(['run-trunk-in', 'run-trunk-out', 'run-spa-trunk', 'run-s2', 'run-s3']);
    });

    it('should conserve power on every channel', () => {
      for (const ch of sut.channels) {
        const loads = ch.loads.reduce((s, l) => s + l.powerW, 0);
        expect(loads + ch.cableDissipationW).toBeCloseTo(ch.amplifierOutputW, 9);
      }
    });

    it('should place tied items within 1.5 cm of where they were taped from', () => {
      const expected: Record<string, [number, number]> = { 'j-patio': [6, 8], 'sp-p2': [6, 13.5], 'sp-s2': [20, 10], 'se-1': [14, 14] };
      for (const [id, [x, y]] of Object.entries(expected)) {
        const p = sut.positions.find((q) => q.itemId === id)!;
        expect(Math.hypot(p.x - x, p.y - y)).toBeLessThan(0.015);
      }
      expect(sut.positions.find((p) => p.itemId === 'j-patio')!.method).toBe('least_squares');
    });

    it('should produce valid RFC 7946 GeoJSON in [lon, lat] order', () => {
      const gj = sut.geojson!;
      expect(validateGeoJson(gj)).toEqual([]);
      // [CHK] an independent validator agrees (docs/reference.md §6).
      expect(getIssues(JSON.stringify(gj))).toEqual([]);
      expect(gj.features).toHaveLength(DEMO_AS_BUILT.runs.length + DEMO_AS_BUILT.items.length);
      expect('crs' in gj).toBe(false);
      const point = gj.features.find((f) => f.id === 'sp-p1')!.geometry!;
      const [lon, lat] = point.coordinates as [number, number];
      expect(lon).toBeCloseTo(-105, 3);
      expect(lat).toBeCloseTo(40, 3);
    });

    it('should pass the recorded commissioning checks', () => {
      expect(sut.checks.map((c) => c.status)).toEqual(['ok', 'ok', 'ok']);
    });

    it('should total cable by type', () => {
      expect(sut.cableTotals.find((t) => t.cableType === '14/2 direct burial')).toMatchObject({ runCount: 6, lengthM: 33.3 });
      expect(sut.cableTotals.find((t) => t.cableType === '14/4 direct burial')).toMatchObject({ spareLengthM: 15.2 });
    });

    it('should echo the analysis temperature and scale resistance with it', () => {
      const warm = analyzeAsBuilt(AsBuiltSchema.parse(DEMO_AS_BUILT), { conductorTemperatureC: 40 });
      expect(warm.assumptions.conductorTemperatureC).toBe(40);
      expect(sut.assumptions.conductorTemperatureC).toBe(20);
      expect(warm.runs[0]!.pairLoopOhm / sut.runs[0]!.pairLoopOhm).toBeCloseTo(1 + 0.00393 * 20, 12);
    });
  });

  describe('single speaker loss', () => {
    // Worked by hand from [NBS-H100] (16 AWG 4.016 Ω/1000 ft, docs/reference.md §3): 100 ft one way into
    // 8 Ω is a 0.8032 Ω loop. Level drop 20·log10(8.8032 / 8) = 0.831 dB; as power against ideal cable
    // 1 − (8 / 8.8032)² = 17.4 %; dissipated in the cable 0.8032 / 8.8032 = 9.12 % of the amplifier's output.
    it('should give the level drop and the cable dissipation worked by hand', () => {
      const sut = analyzeAsBuilt(single(30.48, 16, 8));
      const load = sut.channels[0]!.loads[0]!;
      expect(load.cableLossDb).toBeCloseTo(0.831, 3);
      expect(load.powerLossPct).toBeCloseTo(17.4, 1);
      expect(sut.channels[0]!.cableDissipationPct).toBeCloseTo(9.12, 2);
      expect(sut.channels[0]!.outputBasis).toBe('rated_8_ohm');
      expect(load.idealPowerW).toBeCloseTo(100, 9);
    });

    it('should flag the loss and suggest the thinnest gauge that meets the limit', () => {
      const sut = analyzeAsBuilt(single(30.48, 16, 8));
      expect(sut.findings.map((f) => f.code)).toContain('CABLE_LOSS_OVER_LIMIT');
      // 14 AWG over 100 ft into 8 Ω loses 0.532 dB (> 0.5); 12 AWG 0.338 dB → 12 AWG.
      expect(sut.runs[0]!.gaugeSuggestion).toMatchObject({ installedMeetsLimit: false, suggestedGauge: { system: 'awg', awg: 12 } });
    });

    it('should suggest a thinner gauge when the installed one has room to spare', () => {
      const sut = analyzeAsBuilt(single(5, 12, 8));
      expect(sut.runs[0]!.gaugeSuggestion).toMatchObject({ installedMeetsLimit: true, suggestedGauge: { system: 'awg', awg: 18 } });
    });

    it('should respect the loss limit option', () => {
      expect(codes(single(30.48, 16, 8), { lossLimitDb: 1 })).not.toContain('CABLE_LOSS_OVER_LIMIT');
    });

    it('should report when no standard gauge can meet the limit', () => {
      const sut = analyzeAsBuilt(single(400, 16, 4));
      expect(sut.runs[0]!.gaugeSuggestion!.suggestedGauge).toBeNull();
      expect(sut.findings.map((f) => f.code)).toContain('NO_GAUGE_MEETS_LOSS_LIMIT');
    });
  });

  describe('wiring faults', () => {
    it('should flag a load below the amplifier minimum at the amplifier', () => {
      const ab = demo();
      ab.items.push(speaker('sp-s4', 8));
      ab.runs.push(run('run-s4', 'j-spa', 'sp-s4', 5, SPA));
      const sut = analyzeAsBuilt(AsBuiltSchema.parse(ab));
      const finding = sut.findings.find((f) => f.code === 'LOAD_BELOW_AMP_MINIMUM')!;
      expect(finding).toMatchObject({ severity: 'critical', path: ['items', 0], channel: SPA });
      expect(finding.data!['loadOhmNominal']).toBeCloseTo(16 / 5, 12); // 8 ‖ 8 ‖ 16
    });

    it('should flag a short', () => {
      expect(codes(single(1, 12, 0.1))).toContain('CHANNEL_SHORT');
    });

    it('should flag a speaker fed only through a spare run', () => {
      const ab = demo();
      ab.runs[7]!.isSpare = true;
      const sut = analyzeAsBuilt(AsBuiltSchema.parse(ab));
      expect(sut.findings.find((f) => f.code === 'SPEAKER_ONLY_ON_SPARE_RUN')).toMatchObject({ itemId: 'sp-s1', path: ['items', 9] });
    });

    it('should flag a speaker on no channel', () => {
      const ab = demo();
      ab.items.push(speaker('sp-lonely', 8));
      expect(codes(ab)).toContain('SPEAKER_ON_NO_CHANNEL');
    });

    it('should flag a loop and leave that channel unsolved', () => {
      const ab = demo();
      ab.runs.push(run('run-loop', 'sp-p1', 'sp-p2', 4, PATIO));
      const sut = analyzeAsBuilt(AsBuiltSchema.parse(ab));
      expect(sut.findings.find((f) => f.code === 'LOOP_IN_WIRING')).toMatchObject({ severity: 'critical', channel: PATIO });
      expect(sut.channels[0]!.isSolved).toBe(false);
      expect(sut.channels[1]!.isSolved).toBe(true);
    });

    it('should combine two runs between the same items in parallel rather than call it a loop', () => {
      const ab = demo();
      ab.runs.push({ ...structuredClone(ab.runs[2]!), id: 'run-p1-b' });
      const sut = analyzeAsBuilt(AsBuiltSchema.parse(ab));
      expect(sut.findings.map((f) => f.code)).not.toContain('LOOP_IN_WIRING');
      const node = sut.channels[0]!.nodes.find((n) => n.itemId === 'sp-p1')!;
      expect(node.runIds).toEqual(['run-p1', 'run-p1-b']);
      expect(node.runLoopOhm).toBeCloseTo(sut.runs[2]!.pairLoopOhm / 2, 12);
    });

    it('should flag a run that carries a channel but does not reach the amplifier', () => {
      const ab = demo();
      ab.items.push(speaker('sp-far', 8), { id: 'j-far', kind: 'junction', label: 'Far splice' });
      ab.runs.push(run('run-far', 'j-far', 'sp-far', 5, PATIO));
      const sut = analyzeAsBuilt(AsBuiltSchema.parse(ab));
      expect(sut.findings.find((f) => f.code === 'RUN_NOT_CONNECTED_TO_AMP')).toMatchObject({ runId: 'run-far', path: ['runs', 11, 'pairs'] });
    });

    it('should flag a live branch that ends at a splice', () => {
      const ab = demo();
      ab.items.push({ id: 'j-empty', kind: 'junction', label: 'Empty splice' });
      ab.runs.push(run('run-empty', 'j-patio', 'j-empty', 3, PATIO));
      expect(codes(ab)).toContain('BRANCH_ENDS_WITHOUT_LOAD');
    });

    it('should flag a speaker joined to two channels, but not a DVC sub with separate coils', () => {
      const ab = demo();
      ab.runs.push(run('run-x', 'j-spa', 'sp-p3', 6, SPA));
      expect(codes(ab)).toContain('ITEM_ON_TWO_CHANNELS');

      const sep = demo();
      const sub = sep.items[7]!;
      if (sub.kind === 'subwoofer') sub.coilWiring = 'separate_channels';
      sep.runs.push(run('run-sub-b', 'j-spa', 'sub-1', 6, SPA));
      const sut = analyzeAsBuilt(AsBuiltSchema.parse(sep));
      expect(sut.findings.map((f) => f.code)).not.toContain('ITEM_ON_TWO_CHANNELS');
      // Each channel sees one 8 Ω coil.
      expect(sut.channels[0]!.loads.find((l) => l.itemId === 'sub-1')!.loadOhm).toBe(8);
      expect(sut.channels[1]!.loads.find((l) => l.itemId === 'sub-1')!.loadOhm).toBe(8);
    });

    it('should halve the loop resistance when one channel rides both pairs of a run', () => {
      const ab = single(20, 14, 8);
      ab.runs[0]!.conductors = 4;
      ab.runs[0]!.pairs.push({ pairIndex: 2, channel: { amplifierItemId: 'amp', channelId: 'a' } });
      const sut = analyzeAsBuilt(AsBuiltSchema.parse(ab));
      expect(sut.channels[0]!.nodes[1]!.runLoopOhm).toBeCloseTo(sut.runs[0]!.pairLoopOhm / 2, 12);
    });
  });

  describe('constant-voltage channel', () => {
    function cvJob(taps: number[]): Mutable {
      return {
        zones: [],
        referencePoints: [],
        items: [
          {
            id: 'amp',
            kind: 'amplifier',
            label: 'CV amp',
            channels: [{ id: 'cv', name: 'Garden line', constantVoltage: { lineVoltage: '70V', ratedWatts: 100 } }],
            ratedWatts8Ohm: 100,
            minimumImpedanceOhm: 4,
          },
          ...taps.map((w, i) => ({ id: `s${i}`, kind: 'speaker' as const, label: `S${i}`, constantVoltage: { lineVoltage: '70V' as const, tapWatts: w } })),
        ],
        runs: taps.map((_, i) => run(`r${i}`, 'amp', `s${i}`, 10, { amplifierItemId: 'amp', channelId: 'cv' })),
        checks: [],
      };
    }

    it('should load eight 10 W taps to 80 % without a finding and see 62.5 Ω', () => {
      const sut = analyzeAsBuilt(AsBuiltSchema.parse(cvJob(Array<number>(8).fill(10))));
      expect(sut.channels[0]!.cv).toMatchObject({ totalTapWatts: 80, status: 'ok' });
      // 70.71² / 80 W = 62.5 Ω (V² = 5000 on the 70.7 V line).
      expect(sut.channels[0]!.loadOhmNominal).toBeCloseTo(62.5, 9);
      expect(sut.findings.filter((f) => f.code.startsWith('CV'))).toEqual([]);
    });

    it.each([
      [[10, 10, 10, 10, 10, 10, 10, 10, 5], 'CV_TAPS_OVER_HEADROOM'],
      [Array<number>(11).fill(10), 'CV_OVERLOAD'],
    ])('should flag taps %o with %s', (taps, code) => {
      expect(codes(cvJob(taps))).toContain(code);
    });

    it('should flag a low-impedance speaker on the line', () => {
      const ab = cvJob([10]);
      ab.items.push(speaker('lowz', 8));
      ab.runs.push(run('rz', 'amp', 'lowz', 5, { amplifierItemId: 'amp', channelId: 'cv' }));
      expect(codes(ab)).toContain('LOW_IMPEDANCE_SPEAKER_ON_CV_LINE');
    });
  });

  describe('geometry findings', () => {
    it('should flag a route much shorter than the measured cable', () => {
      const ab = demo();
      ab.runs[3]!.measuredLengthM = 12;
      expect(codes(ab)).toContain('ROUTE_LENGTH_MISMATCH');
    });

    it('should ask for a side hint when two ties leave two mirror positions', () => {
      const ab = demo();
      delete ab.items[4]!.sideHint;
      const sut = analyzeAsBuilt(AsBuiltSchema.parse(ab));
      expect(sut.findings.find((f) => f.code === 'POSITION_SIDE_HINT_MISSING')).toMatchObject({ path: ['items', 4, 'sideHint'] });
    });

    it('should flag three ties that disagree', () => {
      const ab = demo();
      ab.items[3]!.ties![2]!.distanceM += 1.5;
      expect(codes(ab)).toContain('POSITION_TIES_DISAGREE');
    });

    it('should omit GeoJSON without a site origin', () => {
      const ab = demo();
      delete ab.site;
      expect(analyzeAsBuilt(AsBuiltSchema.parse(ab)).geojson).toBeNull();
    });
  });

  it('should reject bad options with the field path', () => {
    expect(() => analyzeAsBuilt(AsBuiltSchema.parse(DEMO_AS_BUILT), { lossLimitDb: -1 })).toThrow(/lossLimitDb/);
  });
});
