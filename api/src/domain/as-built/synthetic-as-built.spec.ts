import { describe, expect, it } from 'vitest';

import { analyzeAsBuilt } from '../analysis/analyze.js';
import { AsBuiltSchema } from './as-built.schema.js';
import { generateSyntheticAsBuilt } from './synthetic-as-built.js';

describe(generateSyntheticAsBuilt.name, () => {
  const ab = generateSyntheticAsBuilt();

  it('should generate a valid 500-item, 600-run as-built', () => {
    const result = AsBuiltSchema.safeParse(ab);
    expect(result.success ? [] : result.error.issues.slice(0, 3)).toEqual([]);
    expect(ab.items).toHaveLength(500);
    expect(ab.runs).toHaveLength(600);
  });

  it('should be deterministic', () => {
    expect(generateSyntheticAsBuilt()).toEqual(ab);
  });

  it('should analyse without wiring faults', () => {
    const sut = analyzeAsBuilt(ab);
    const wiring = sut.findings.filter((f) => ['LOOP_IN_WIRING', 'RUN_NOT_CONNECTED_TO_AMP', 'SPEAKER_ON_NO_CHANNEL', 'LOAD_BELOW_AMP_MINIMUM'].includes(f.code));
    expect(wiring).toEqual([]);
    expect(sut.channels.every((c) => c.isSolved && c.loads.length === 18)).toBe(true);
  });
});
