import { readFileSync } from 'node:fs';

import { describe, expect, it } from 'vitest';

import { loopResistanceOhm, singleLoadLossDb } from '../cable/run-cable.js';
import { conductorResistanceOhmPerM } from '../cable/wire.js';
import { checkCvLoad, cvLineVoltageV, cvTapImpedanceOhm } from './constant-voltage.js';

interface CvFixture {
  source: string;
  tap_table: { line_v: number; tap_w: number; primary_ohm: number }[];
  taps_70_7V_ohm_published: Record<string, number>;
  example_26W_total_line_ohm: number;
  examples: Record<string, unknown>[];
}

const cv = JSON.parse(
  readFileSync(new URL('../../../../test/fixtures/reference/constant_voltage.json', import.meta.url), 'utf8'),
) as CvFixture;

describe(cvTapImpedanceOhm.name, () => {
  // Z = V²/P tap table (QSL / FUZ, REFERENCE.md §3): 25, 70.7, 70.71 and 100 V lines.
  it.each(cv.tap_table.map((r) => [r.line_v, r.tap_w, r.primary_ohm] as const))(
    'should give a %f V line with a %f W tap %f Ω',
    (v, w, z) => {
      expect(cvTapImpedanceOhm(v, w)).toBeCloseTo(z, 1);
    },
  );

  // EIA 70.7 V primary-tap table (QSL): 1 W → 5000 Ω, 2 W → 2500, 5 W → 1000, 10 W → 500 (within 0.05 %).
  it.each(Object.entries(cv.taps_70_7V_ohm_published).map(([w, z]) => [Number(w), z] as const))(
    'should match the published 70.7 V table: %i W → %i Ω',
    (w, z) => {
      expect(Math.abs(cvTapImpedanceOhm(cvLineVoltageV('70V'), w) / z - 1)).toBeLessThan(0.0005);
    },
  );

  // Handbook worked example (QSL): 6 W + 10 W + 10 W on a 70.7 V line → 26 W → 192.3 Ω with V² = 5000.
  it('should reproduce the 26 W handbook example', () => {
    const check = checkCvLoad(cvLineVoltageV('70V'), [6, 10, 10], 30);
    expect(check.totalTapWatts).toBe(26);
    expect(check.lineOhm).toBeCloseTo(cv.example_26W_total_line_ohm, 1);
  });
});

describe(cvLineVoltageV.name, () => {
  it.each([
    ['25V', 25],
    ['70V', 70.7107],
    ['100V', 100],
  ] as const)('should give %s as %f V rms', (line, v) => {
    expect(cvLineVoltageV(line)).toBeCloseTo(v, 4);
  });
});

describe(checkCvLoad.name, () => {
  // Derived example (constant_voltage.json): eight 10 W taps on 70.7 V, 100 W amp → 62.48 Ω, 1.1315 A, 80 %.
  it('should pass eight 10 W taps on a 100 W amplifier at exactly 80 % (common practice)', () => {
    const sut = checkCvLoad(70.7, Array<number>(8).fill(10), 100);
    expect(sut.lineOhm).toBeCloseTo(62.481, 3);
    expect(sut.lineCurrentA).toBeCloseTo(1.1315, 4);
    expect(sut.loadFraction).toBeCloseTo(0.8, 12);
    expect(sut.status).toBe('ok');
  });

  it.each([
    [[10, 10, 10, 10, 10, 10, 10, 10, 5], 'over_headroom'],
    [Array<number>(11).fill(10), 'overload'],
    [[], 'ok'],
  ] as const)('should rate taps %o on 100 W as %s', (taps, status) => {
    expect(checkCvLoad(70.7, taps, 100).status).toBe(status);
  });

  // Derived example: the same 80 W line over 300 ft of 16 AWG → R_loop 2.4096 Ω, −0.329 dB, 3.7 % lost.
  it('should give the 300 ft 16 AWG line loss of the worked example', () => {
    const rLoop = loopResistanceOhm(300 * 0.3048, conductorResistanceOhmPerM({ system: 'awg', awg: 16 }));
    expect(rLoop).toBeCloseTo(2.4096, 3);
    const z = checkCvLoad(70.7, Array<number>(8).fill(10), 100).lineOhm;
    expect(singleLoadLossDb(z, rLoop)).toBeCloseTo(0.3287, 3);
    expect(rLoop / (z + rLoop)).toBeCloseTo(0.0371, 4);
  });

  // FUZ: minimum load of a 100 V / 500 W output is V²/P = 20 Ω.
  it('should give a 100 V, 500 W output a 20 Ω minimum line impedance', () => {
    expect(cvTapImpedanceOhm(100, 500)).toBe(20);
  });
});
