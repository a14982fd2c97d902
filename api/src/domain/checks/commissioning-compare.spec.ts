import { describe, expect, it } from 'vitest';

import { AsBuiltSchema, type AsBuilt } from '../as-built/as-built.schema.js';
import { DEMO_AS_BUILT } from '../as-built/demo-as-built.js';
import { analyzeAsBuilt } from '../analysis/analyze.js';
import { compareCommissioningChecks } from './commissioning-compare.js';

type Mutable = { -readonly [K in keyof AsBuilt]: AsBuilt[K] };

function checkWith(index: number, measuredOhm: number, mutate: (ab: Mutable) => void = () => undefined) {
  const ab: Mutable = structuredClone(DEMO_AS_BUILT);
  ab.checks[index]!.measuredOhm = measuredOhm;
  mutate(ab);
  const sut = analyzeAsBuilt(AsBuiltSchema.parse(ab));
  return { result: sut.checks[index]!, findings: sut.findings.filter((f) => f.path[0] === 'checks') };
}

describe(compareCommissioningChecks.name, () => {
  it('should compute the patio DC resistance from the recorded coil resistances and cable', () => {
    // 12.8 ‖ 12.8 ‖ 12.8 ‖ (2 × 6.1) plus the loop resistance of every run.
    const { result } = checkWith(0, 3.4);
    expect(result.status).toBe('ok');
    expect(result.expectedOhm!).toBeGreaterThan(1 / (3 / 12.8 + 1 / 12.2));
    expect(result.expectedOhm!).toBeLessThan(1 / (3 / 12.8 + 1 / 12.2) + 0.2);
  });

  it.each([
    [0, 0.2, 'short', 'CHECK_SHORT', 'critical'],
    [0, 40, 'open', 'CHECK_OPEN', 'critical'],
    [0, 2.5, 'low', 'CHECK_READING_LOW', 'warning'],
    [0, 4.2, 'high', 'CHECK_READING_HIGH', 'warning'],
    [1, 2.9, 'low', 'CHECK_READING_LOW', 'warning'],
    [2, 8, 'high', 'CHECK_READING_HIGH', 'warning'],
  ] as const)('should rate check %i reading %f Ω as %s', (index, ohm, status, code, severity) => {
    const { result, findings } = checkWith(index, ohm);
    expect(result.status).toBe(status);
    expect(result.explanation.length).toBeGreaterThan(20);
    expect(findings).toEqual([expect.objectContaining({ code, severity, path: ['checks', index, 'measuredOhm'] })]);
  });

  it('should widen the band around nominal when no DC resistance is recorded', () => {
    const { result } = checkWith(2, 4.3);
    // Spa: 8 ‖ (8 + 8) = 5.33 Ω nominal; DC band 0.6–0.95 of nominal plus cable and meter allowance.
    expect(result.expectedLowOhm!).toBeLessThan(5.333 * 0.6 + 0.3);
    expect(result.expectedHighOhm!).toBeGreaterThan(5.333 * 0.95);
  });

  it('should report polarity and insulation failures', () => {
    const { findings } = checkWith(0, 3.4, (ab) => {
      ab.checks[0]!.isPolarityOk = false;
      ab.checks[0]!.isInsulationOk = false;
    });
    expect(findings.map((f) => f.code).sort()).toEqual(['CHECK_INSULATION', 'CHECK_POLARITY']);
  });

  it('should not compare DC resistance on a constant-voltage channel', () => {
    const { result } = checkWith(0, 3.4, (ab) => {
      const amp = ab.items[0]!;
      if (amp.kind === 'amplifier') amp.channels[0]!.constantVoltage = { lineVoltage: '70V', ratedWatts: 100 };
    });
    expect(result.status).toBe('not_comparable');
  });
});
