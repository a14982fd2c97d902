import { readFileSync } from 'node:fs';

import { describe, expect, it } from 'vitest';

import {
  awgAreaMm2,
  awgDiameterMm,
  conductorResistanceOhmPerM,
  copperTemperatureFactor,
  formatGauge,
  isKnownAwg,
  isKnownMm2,
  mm2ToEquivalentAwg,
} from './wire.js';

interface WireFixture {
  source: string;
  awg_formula: { d_mm: Record<string, number>; area_mm2: Record<string, number>; d_in_published: Record<string, number> };
  r20_ohm_per_1000ft_NBS: Record<string, number>;
  r20_ohm_per_km_computed_IACS: Record<string, number>;
  nec_ch9_table8_75C_uncoated_cu_ohm_per_kft: Record<string, { solid: number; stranded: number } | boolean>;
  iec60228_class5_max_ohm_per_km_20C_plain_tinned: Record<string, [number, number]>;
  metric_equivalent_awg_derived: Record<string, number | string>;
}

const wire = JSON.parse(
  readFileSync(new URL('../../../../test/fixtures/reference/wire.json', import.meta.url), 'utf8'),
) as WireFixture;

const FT = 0.3048;
const awgRows = (table: Record<string, unknown>): [number, number][] =>
  Object.entries(table)
    .filter(([k, v]) => /^\d+$/.test(k) && typeof v === 'number')
    .map(([k, v]) => [Number(k), v as number]);

describe(awgDiameterMm.name, () => {
  // ASTM B258 formula values (NBS Handbook 100 / HyperPhysics): e.g. 14 AWG 1.6277 mm.
  it.each(awgRows(wire.awg_formula.d_mm))('should give %i AWG a diameter of %f mm', (awg, mm) => {
    expect(awgDiameterMm(awg)).toBeCloseTo(mm, 4);
  });

  // Published inch diameters, NBS Handbook 100 / HyperPhysics wire table: 14 AWG 0.06408 in.
  it.each(awgRows(wire.awg_formula.d_in_published))('should match the published %i AWG diameter of %f in', (awg, inches) => {
    expect(awgDiameterMm(awg) / 25.4).toBeCloseTo(inches, 5);
  });

  // ASTM B258 anchors: 4/0 (n = −3) is 0.4600 in and 36 AWG is 0.0050 in.
  it.each([
    [-3, 0.46],
    [36, 0.005],
  ])('should anchor AWG %i at %f in', (awg, inches) => {
    expect(awgDiameterMm(awg) / 25.4).toBeCloseTo(inches, 6);
  });

  // Successive gauges differ in diameter by 92^(1/39) = 1.122932 (ASTM B258 / AWG article).
  it('should step the diameter by 92^(1/39) between gauges', () => {
    expect(awgDiameterMm(13) / awgDiameterMm(14)).toBeCloseTo(1.122932, 6);
  });
});

describe(awgAreaMm2.name, () => {
  // Derived from the ASTM B258 formula (REFERENCE.md §1.1): 14 AWG 2.0809 mm².
  it.each(awgRows(wire.awg_formula.area_mm2))('should give %i AWG an area of %f mm²', (awg, area) => {
    expect(awgAreaMm2(awg)).toBeCloseTo(area, 3);
  });
});

describe(conductorResistanceOhmPerM.name, () => {
  // NBS Handbook 100 / HyperPhysics wire table at 20 °C: 14 AWG 2.525 Ω/1000 ft, 12 AWG 1.588 …
  it.each(awgRows(wire.r20_ohm_per_1000ft_NBS))('should give %i AWG the published %f Ω/1000 ft at 20 °C', (awg, ohmPerKft) => {
    const computed = conductorResistanceOhmPerM({ system: 'awg', awg }) * FT * 1000;
    expect(Math.abs(computed / ohmPerKft - 1)).toBeLessThan(0.001);
  });

  // Derived IACS Ω/km (REFERENCE.md §1.1 "D" column): 14 AWG 8.286 Ω/km.
  it.each(awgRows(wire.r20_ohm_per_km_computed_IACS))('should give %i AWG %f Ω/km at 20 °C', (awg, ohmPerKm) => {
    expect(conductorResistanceOhmPerM({ system: 'awg', awg }) * 1000).toBeCloseTo(ohmPerKm, 2);
  });

  // NEC (NFPA 70) Chapter 9 Table 8, uncoated copper, SOLID, at 75 °C: 14 AWG 3.07 Ω/kFT. Our 20 °C
  // value × (1 + 0.00393·55) must land on the table within one unit of its third significant figure
  // (NEC rounds to 3 figures and sizes 18/16/14 AWG by 3-figure circular mils, 2580 instead of 2583).
  it.each(
    Object.entries(wire.nec_ch9_table8_75C_uncoated_cu_ohm_per_kft)
      .filter(([k]) => /^\d+$/.test(k))
      .map(([k, v]) => [Number(k), (v as { solid: number }).solid] as const),
  )('should reproduce NEC Table 8 for %i AWG solid at 75 °C (%f Ω/kFT)', (awg, ohmPerKft) => {
    const computed = conductorResistanceOhmPerM({ system: 'awg', awg }, 75) * FT * 1000;
    const unitOfThirdFigure = 10 ** (Math.floor(Math.log10(ohmPerKft)) - 2);
    expect(Math.abs(computed - ohmPerKft)).toBeLessThanOrEqual(unitOfThirdFigure);
  });

  // IEC 60228:2004 Table 3 class 5 plain copper maxima at 20 °C: 0.75 mm² 26.0 Ω/km … (exact table lookup).
  it.each(Object.entries(wire.iec60228_class5_max_ohm_per_km_20C_plain_tinned).map(([k, v]) => [Number(k), v[0]] as const))(
    'should look up %f mm² as %f Ω/km at 20 °C',
    (mm2, ohmPerKm) => {
      expect(conductorResistanceOhmPerM({ system: 'mm2', mm2 }) * 1000).toBeCloseTo(ohmPerKm, 9);
    },
  );

  it('should scale with temperature by 1 + 0.00393·(T − 20)', () => {
    const r20 = conductorResistanceOhmPerM({ system: 'awg', awg: 14 }, 20);
    const r40 = conductorResistanceOhmPerM({ system: 'awg', awg: 14 }, 40);
    expect(r40 / r20).toBeCloseTo(1.0786, 6);
    // NBS Handbook 100: the 20 °C → 75 °C factor is 1.21615 for 100 % IACS copper.
    expect(copperTemperatureFactor(75)).toBeCloseTo(1.21615, 5);
  });

  it.each([
    [{ system: 'awg', awg: 14.5 }],
    [{ system: 'awg', awg: 41 }],
    [{ system: 'mm2', mm2: 3 }],
  ] as const)('should throw for the unknown gauge %o', (gauge) => {
    expect(() => conductorResistanceOhmPerM(gauge)).toThrow(RangeError);
  });
});

describe(mm2ToEquivalentAwg.name, () => {
  // Derived in REFERENCE.md §1.4 ("≈ AWG" column): 2.5 mm² ≈ 13.2 AWG.
  it.each(
    Object.entries(wire.metric_equivalent_awg_derived)
      .filter(([, v]) => typeof v === 'number')
      .map(([k, v]) => [Number(k), v as number] as const),
  )('should map %f mm² to AWG %f', (mm2, awg) => {
    expect(mm2ToEquivalentAwg(mm2)).toBeCloseTo(awg, 1);
  });

  it('should invert awgAreaMm2', () => {
    expect(mm2ToEquivalentAwg(awgAreaMm2(12))).toBeCloseTo(12, 10);
  });
});

describe(isKnownMm2.name, () => {
  it.each([
    [0.75, true],
    [2.5, true],
    [3, false],
    [Number.NaN, false],
  ])('should say %f mm² is known: %s', (mm2, known) => {
    expect(isKnownMm2(mm2)).toBe(known);
  });
});

describe(isKnownAwg.name, () => {
  it.each([
    [-3, true],
    [0, true],
    [40, true],
    [-4, false],
    [12.5, false],
  ])('should say AWG %f is known: %s', (awg, known) => {
    expect(isKnownAwg(awg)).toBe(known);
  });
});

describe(formatGauge.name, () => {
  it.each([
    [{ system: 'awg', awg: 14 }, '14 AWG'],
    [{ system: 'awg', awg: 0 }, '1/0 AWG'],
    [{ system: 'awg', awg: -3 }, '4/0 AWG'],
    [{ system: 'mm2', mm2: 2.5 }, '2.5 mm²'],
  ] as const)('should format %o as %s', (gauge, text) => {
    expect(formatGauge(gauge)).toBe(text);
  });
});
