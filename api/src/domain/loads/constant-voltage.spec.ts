import { readFileSync } from 'node:fs';

import { describe, expect, it } from 'vitest';

import { loopResistanceOhm, singleLoadLossDb } from '../cable/run-cable.js';
import { conductorResistanceOhmPerM } from '../cable/wire.js';
import { checkCvLoad, cvLineVoltageV, cvTapImpedanceOhm } from './constant-voltage.js';

interface CvFixture {
  source: string;
  taps_70_7V_ohm_published: Record<string, number>;
  example_26W_total_line_ohm: number;
  examples: Record<string, unknown>[];
}

const cv = JSON.parse(
  readFileSync(new URL('../../../../test/fixtures/reference/constant_voltage.json', import.meta.url), 'utf8'),
) as CvFixture;

describe(cvTapImpedanceOhm.name, () => {
  // EIA 70.7 V primary-tap table [CVH]: 1 W → 5000 Ω, 2 W → 2500, 5 W → 1000, 10 W → 500 (within 0.05 %).
  it.each(Object.entries(cv.taps_70_7V_ohm_published).map(([w, z]) => [Number(w), z] as const))(
    'should match the published 70.7 V table: %i W → %i Ω',
    (w, z) => {
      expect(Math.abs(cvTapImpedanceOhm(cvLineVoltageV('70V'), w) / z - 1)).toBeLessThan(0.0005);
    },
  );

  // Handbook worked example [CVH]: 6 W + 10 W + 10 W on a 70.7 V line → 26 W → 192.3 Ω with V² = 5000.
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
  // Common practice (no published source): taps up to 80 % of the rating pass. Eight 10 W taps on the
  // 70.7 V line: by the [CVH] table each tap is 500 Ω, eight in parallel 62.5 Ω.
  it('should pass eight 10 W taps on a 100 W amplifier at exactly 80 % (common practice)', () => {
    const sut = checkCvLoad(cvLineVoltageV('70V'), Array<number>(8).fill(10), 100);
    expect(Math.abs(sut.lineOhm / 62.5 - 1)).toBeLessThan(0.0005);
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

  // Worked by hand from [NBS-H100] (16 AWG 4.016 Ω/1000 ft): the 62.5 Ω line over 300 ft one way has a
  // 2.41 Ω loop; level drop 20·log10((62.5 + 2.41)/62.5) = 0.328 dB.
  it('should give the 300 ft 16 AWG line loss worked by hand', () => {
    const rLoop = loopResistanceOhm(300 * 0.3048, conductorResistanceOhmPerM({ system: 'awg', awg: 16 }));
    expect(rLoop).toBeCloseTo(2.41, 2);
    const z = checkCvLoad(cvLineVoltageV('70V'), Array<number>(8).fill(10), 100).lineOhm;
    expect(singleLoadLossDb(z, rLoop)).toBeCloseTo(0.328, 2);
  });

  // [CVN]: minimum load of a 100 V / 500 W output is V²/P = 20 Ω.
  it('should give a 100 V, 500 W output a 20 Ω minimum line impedance', () => {
    expect(cvTapImpedanceOhm(100, 500)).toBe(20);
  });
});
