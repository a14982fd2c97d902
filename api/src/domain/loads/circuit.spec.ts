import { readFileSync } from 'node:fs';

import fc from 'fast-check';
import { describe, expect, it } from 'vitest';

import { CircuitTreeBuilder, parallelOhm, seriesOhm, solveCircuit, type CircuitTree } from './circuit.js';

interface LoadsFixture {
  source: string;
  loads_ohm: Record<string, number>;
  extra: Record<string, number>;
}

const textbook = JSON.parse(
  readFileSync(new URL('../../../../test/fixtures/reference/loads_textbook.json', import.meta.url), 'utf8'),
) as LoadsFixture;

describe(parallelOhm.name, () => {
  // Textbook series/parallel combinations ([ECT], docs/reference.md §3, loads_textbook.json).
  it.each([
    ['DVC 2×8 Ω coils in parallel', parallelOhm([8, 8]), textbook.loads_ohm['dvc_2x8_parallel']],
    ['DVC 2×8 Ω coils in series', seriesOhm([8, 8]), textbook.loads_ohm['dvc_2x8_series']],
    ['DVC 2×4 Ω coils in parallel', parallelOhm([4, 4]), textbook.loads_ohm['dvc_2x4_parallel']],
    ['DVC 2×4 Ω coils in series', seriesOhm([4, 4]), textbook.loads_ohm['dvc_2x4_series']],
    ['two DVC 2×4, each series, subs in parallel', parallelOhm([seriesOhm([4, 4]), seriesOhm([4, 4])]), textbook.loads_ohm['two_dvc_2x4_series_each_then_parallel']],
    ['two DVC 2×4, each parallel, subs in parallel', parallelOhm([parallelOhm([4, 4]), parallelOhm([4, 4])]), textbook.loads_ohm['two_dvc_2x4_parallel_each_then_parallel']],
    ['two DVC 2×4, each parallel, subs in series', seriesOhm([parallelOhm([4, 4]), parallelOhm([4, 4])]), textbook.extra['two_dvc_2x4_parallel_each_then_series']],
    ['three 8 Ω in parallel', parallelOhm([8, 8, 8]), textbook.loads_ohm['three_8_parallel']],
    ['8 ‖ 4 ‖ 16', parallelOhm([8, 4, 16]), textbook.loads_ohm['8_4_16_parallel']],
    ['8 ‖ 4', parallelOhm([8, 4]), textbook.extra['8_parallel_4']],
    ['four 8 Ω as two series strings in parallel', parallelOhm([seriesOhm([8, 8]), seriesOhm([8, 8])]), textbook.extra['four_8_as_two_series_strings_in_parallel']],
  ])('should combine %s', (_name, computed, expected) => {
    expect(computed).toBeCloseTo(expected!, 10);
  });

  it('should treat an empty list or open branches as open', () => {
    expect(parallelOhm([])).toBe(Infinity);
    expect(parallelOhm([Infinity, 8])).toBe(8);
  });
});

describe(solveCircuit.name, () => {
  it('should solve the textbook voltage divider: 10 V, 2 Ω line, 8 Ω load', () => {
    const b = new CircuitTreeBuilder();
    const load = b.add(0, 2, 8);
    const sut = solveCircuit(b.build(), 10);
    expect(sut.inputOhm).toBe(10);
    expect(sut.sourceCurrentA).toBeCloseTo(1, 12);
    expect(sut.loadVoltageV[load]).toBeCloseTo(8, 12);
    expect(sut.loadPowerW[load]).toBeCloseTo(8, 12);
    expect(sut.edgePowerW[load]).toBeCloseTo(2, 12);
  });

  it('should solve a trunk to a splice feeding two speakers in parallel', () => {
    // amp —0.5 Ω— J; J —0.2 Ω— 8 Ω; J —0.3 Ω— 16 Ω. Z = 0.5 + (8.2 ‖ 16.3).
    const b = new CircuitTreeBuilder();
    const j = b.add(0, 0.5, Infinity);
    const s1 = b.add(j, 0.2, 8);
    const s2 = b.add(j, 0.3, 16);
    const sut = solveCircuit(b.build(), 20);
    const zBranches = (8.2 * 16.3) / (8.2 + 16.3);
    expect(sut.inputOhm).toBeCloseTo(0.5 + zBranches, 12);
    const vJ = (20 * zBranches) / (0.5 + zBranches);
    expect(sut.terminalVoltageV[j]).toBeCloseTo(vJ, 10);
    expect(sut.loadVoltageV[s1]).toBeCloseTo((vJ * 8) / 8.2, 10);
    expect(sut.loadVoltageV[s2]).toBeCloseTo((vJ * 16) / 16.3, 10);
    // Kirchhoff's current law at the splice.
    expect(sut.branchCurrentA[s1]! + sut.branchCurrentA[s2]!).toBeCloseTo(sut.branchCurrentA[j]!, 12);
  });

  it('should solve a series string amp → A → B exactly as one loop', () => {
    // A is wired 'series': loop = R1 + 8 + R2 + 8 = 1 + 8 + 1 + 8 = 18 Ω.
    const b = new CircuitTreeBuilder();
    const a = b.add(0, 1, 8, true);
    const bb = b.add(a, 1, 8);
    const sut = solveCircuit(b.build(), 18);
    expect(sut.inputOhm).toBeCloseTo(18, 12);
    expect(sut.loadCurrentA[a]).toBeCloseTo(1, 12);
    expect(sut.loadCurrentA[bb]).toBeCloseTo(1, 12);
    expect(sut.loadVoltageV[a]).toBeCloseTo(8, 12);
    expect(sut.loadVoltageV[bb]).toBeCloseTo(8, 12);
    expect(sut.cablePowerW).toBeCloseTo(2, 12);
  });

  it('should close a series string at an item with no onward run', () => {
    const b = new CircuitTreeBuilder();
    b.add(0, 0, 8, true);
    expect(solveCircuit(b.build(), 1).inputOhm).toBe(8);
  });

  it('should report an open circuit when nothing is connected beyond a splice', () => {
    const b = new CircuitTreeBuilder();
    const j = b.add(0, 0.5, Infinity);
    const sut = solveCircuit(b.build(), 10);
    expect(sut.inputOhm).toBe(Infinity);
    expect(sut.sourceCurrentA).toBe(0);
    expect(sut.terminalVoltageV[j]).toBe(10);
  });
});

const nodeSpec = fc.record({
  pick: fc.nat(),
  edge: fc.double({ min: 0.001, max: 2, noNaN: true }),
  load: fc.oneof(fc.constant(Infinity), fc.double({ min: 2, max: 32, noNaN: true })),
  isSeries: fc.boolean(),
});

function buildTree(specs: readonly { pick: number; edge: number; load: number; isSeries: boolean }[]): CircuitTreeBuilder {
  const b = new CircuitTreeBuilder();
  for (const s of specs) b.add(s.pick % b.parent.length, s.edge, s.load, s.isSeries);
  return b;
}

describe('channel circuit properties', () => {
  it('should never raise the load impedance when a speaker is added in parallel', () => {
    fc.assert(
      fc.property(
        fc.array(nodeSpec, { minLength: 1, maxLength: 25 }),
        fc.nat(),
        fc.double({ min: 0.001, max: 2, noNaN: true }),
        fc.double({ min: 2, max: 32, noNaN: true }),
        (specs, pick, edge, load) => {
          const b = buildTree(specs);
          const before = solveCircuit(b.build(), 1).inputOhm;
          // Attach to a point where onward branches are in parallel (the amp, a splice, a loop-through speaker).
          const candidates = b.order.filter((n) => n === 0 || !b.isSeries[n] || !Number.isFinite(b.loadOhm[n]!));
          b.add(candidates[pick % candidates.length]!, edge, load);
          const after = solveCircuit(b.build(), 1).inputOhm;
          expect(after).toBeLessThanOrEqual(before * (1 + 1e-12));
        },
      ),
    );
  });

  it('should conserve power: source = loads + cable', () => {
    fc.assert(
      fc.property(fc.array(nodeSpec, { minLength: 1, maxLength: 25 }), fc.double({ min: 1, max: 100, noNaN: true }), (specs, v) => {
        const tree: CircuitTree = buildTree(specs).build();
        const sut = solveCircuit(tree, v);
        const loads = sut.loadPowerW.reduce((s, p) => s + p, 0);
        expect(loads + sut.cablePowerW).toBeCloseTo(sut.sourcePowerW, 6);
      }),
    );
  });
});
