import { describe, expect, it } from 'vitest';

import { DEMO_AS_BUILT } from '../as-built/demo-as-built.js';
import { validateRecord } from './record-validation.js';

describe('validateRecord', () => {
  it('should accept the demo as-built', () => {
    expect(validateRecord(DEMO_AS_BUILT, ['runs', 0])).toEqual([]);
  });

  it.each<[string, (runs: typeof DEMO_AS_BUILT.runs) => typeof DEMO_AS_BUILT.runs, (string | number)[], string]>([
    ['an issue inside the focused record, relative to it', (runs) => runs.map((r, i) => (i === 2 ? { ...r, toItemId: 'nowhere' } : r)), ['runs', 2], 'toItemId'],
    ['a reading inside the focused reading', (runs) => runs.map((r, i) => (i === 3 ? { ...r, depthReadings: [{ stationM: 500, depthM: 0.2 }] } : r)), ['runs', 3, 'depthReadings', 0], 'stationM'],
    ['an issue elsewhere, with its as-built path', (runs) => runs.map((r, i) => (i === 2 ? { ...r, toItemId: 'nowhere' } : r)), ['runs', 4], 'asBuilt.runs.2.toItemId'],
  ])('should report %s', (_name, mutate, focus, path) => {
    const issues = validateRecord({ ...DEMO_AS_BUILT, runs: mutate(DEMO_AS_BUILT.runs) }, focus);
    expect(issues.map((i) => i.path)).toEqual([path]);
  });
});
