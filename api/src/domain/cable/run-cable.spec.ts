import { readFileSync } from 'node:fs';

import fc from 'fast-check';
import { describe, expect, it } from 'vitest';

import { awgAreaMm2, conductorResistanceOhmPerM } from './wire.js';
import { cableTotalsByType, loopResistanceOhm, singleLoadLossDb, STANDARD_GAUGES } from './run-cable.js';

interface LossFixture {
  source: string;
  rows: { awg: number; one_way_ft: number; load_ohm: number; r_loop_ohm: number; loss_db: number; fraction_of_amp_power_lost_in_cable: number }[];
  max_length_5pct: { awg: number; load_ohm: number; max_one_way_ft_for_5pct: number }[];
  russell_published_max_one_way_ft_5pct: Record<string, number[]> & { loads: number[] };
}

const loss = JSON.parse(
  readFileSync(new URL('../../../../test/fixtures/reference/speaker_cable_loss.json', import.meta.url), 'utf8'),
) as LossFixture;

const FT = 0.3048;
const ohmPerM = (awg: number): number => conductorResistanceOhmPerM({ system: 'awg', awg });

describe(loopResistanceOhm.name, () => {
  // Worked by hand from [NBS-H100] resistance at 20 °C (docs/reference.md §3): 16 AWG, 100 ft one way →
  // 2 × 100 ft × 4.016 Ω/1000 ft = 0.8032 Ω loop. Our resistance comes from the [IACS] formula instead.
  it.each(loss.rows.map((r) => [r.awg, r.one_way_ft, r.r_loop_ohm] as const))(
    'should give %i AWG over %i ft a loop of %f Ω',
    (awg, ft, rLoop) => {
      expect(loopResistanceOhm(ft * FT, ohmPerM(awg))).toBeCloseTo(rLoop, 3);
    },
  );

  it('should halve the loop resistance when two pairs carry one channel', () => {
    expect(loopResistanceOhm(30, 0.01, 2)).toBeCloseTo(0.3, 12);
  });
});

describe(singleLoadLossDb.name, () => {
  // Worked by hand from [NBS-H100] resistances (docs/reference.md §3, speaker_cable_loss.json): 14 AWG,
  // 100 ft, 8 Ω → 20·log10(8 / 8.505) = −0.532 dB (we report 0.532 dB of level drop).
  it.each(loss.rows.map((r) => [r.awg, r.one_way_ft, r.load_ohm, r.loss_db] as const))(
    'should give %i AWG, %i ft into %i Ω a level drop of %f dB',
    (awg, ft, z, lossDb) => {
      const rLoop = loopResistanceOhm(ft * FT, ohmPerM(awg));
      expect(Math.abs(singleLoadLossDb(z, rLoop) + lossDb)).toBeLessThan(0.005);
    },
  );

  // [RUS] published table (max one-way run for loop resistance ≤ 5 % of the load), within
  // the table's own rounding of ±6 %: e.g. 14 AWG at 8 Ω → 80 ft.
  const russell = loss.russell_published_max_one_way_ft_5pct;
  const cases = ['18', '16', '14', '12', '10'].flatMap((awg) =>
    russell.loads.map((z, i) => [Number(awg), z, russell[awg]![i]!] as const),
  );
  it.each(cases)('should reproduce the published 5 %% table: %i AWG at %i Ω → %i ft max', (awg, z, ft) => {
    const maxFt = (0.05 * z) / (2 * ohmPerM(awg)) / FT;
    expect(Math.abs(maxFt / ft - 1)).toBeLessThan(0.06);
  });

  it('should grow with length and fall with conductor area (property)', () => {
    const gauges = [18, 16, 14, 12, 10, 8];
    fc.assert(
      fc.property(
        fc.double({ min: 1, max: 300, noNaN: true }),
        fc.double({ min: 0.1, max: 100, noNaN: true }),
        fc.double({ min: 2, max: 32, noNaN: true }),
        fc.integer({ min: 0, max: gauges.length - 2 }),
        (length, extra, z, g) => {
          const thin = gauges[g]!;
          const thick = gauges[g + 1]!;
          expect(awgAreaMm2(thick)).toBeGreaterThan(awgAreaMm2(thin));
          const lossShort = singleLoadLossDb(z, loopResistanceOhm(length, ohmPerM(thin)));
          const lossLong = singleLoadLossDb(z, loopResistanceOhm(length + extra, ohmPerM(thin)));
          const lossThick = singleLoadLossDb(z, loopResistanceOhm(length, ohmPerM(thick)));
          expect(lossLong).toBeGreaterThan(lossShort);
          expect(lossThick).toBeLessThan(lossShort);
        },
      ),
    );
  });
});

describe(cableTotalsByType.name, () => {
  it('should total metres by cable type and keep spare and abandoned separately', () => {
    const totals = cableTotalsByType([
      { cableType: '14/2 DB', measuredLengthM: 10 },
      { cableType: '14/2 DB', measuredLengthM: 5.5, isSpare: true },
      { cableType: '12/4 DB', measuredLengthM: 20, isAbandoned: true },
    ]);
    expect(totals).toEqual([
      { cableType: '12/4 DB', runCount: 1, lengthM: 20, spareLengthM: 0, abandonedLengthM: 20 },
      { cableType: '14/2 DB', runCount: 2, lengthM: 15.5, spareLengthM: 5.5, abandonedLengthM: 0 },
    ]);
  });
});

describe('STANDARD_GAUGES', () => {
  it('should list each system thinnest first', () => {
    for (const list of [STANDARD_GAUGES.awg, STANDARD_GAUGES.mm2]) {
      const areas = list.map((g) => (g.system === 'awg' ? awgAreaMm2(g.awg) : g.mm2));
      expect(areas).toEqual([...areas].sort((a, b) => a - b));
    }
  });
});
