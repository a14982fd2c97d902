import { describe, expect, it } from 'vitest';

import { AsBuiltSchema, type AsBuilt } from './as-built.schema.js';
import { DEMO_AS_BUILT } from './demo-as-built.js';

type Mutable = { -readonly [K in keyof AsBuilt]: AsBuilt[K] };

function demo(): Mutable {
  return structuredClone(DEMO_AS_BUILT);
}

function issuePaths(input: unknown): string[] {
  const result = AsBuiltSchema.safeParse(input);
  return result.success ? [] : result.error.issues.map((i) => i.path.join('.'));
}

function withRun(mutate: (ab: Mutable) => void): string[] {
  const ab = demo();
  mutate(ab);
  return issuePaths(ab);
}

describe('AsBuiltSchema', () => {
  it('should accept the demo as-built', () => {
    expect(issuePaths(DEMO_AS_BUILT)).toEqual([]);
  });

  it.each<[string, (ab: Mutable) => void, string]>([
    ['a negative length', (ab) => void (ab.runs[3]!.measuredLengthM = -5), 'runs.3.measuredLengthM'],
    ['a zero length', (ab) => void (ab.runs[3]!.measuredLengthM = 0), 'runs.3.measuredLengthM'],
    ['a NaN depth', (ab) => void (ab.runs[1]!.depthReadings![2]!.depthM = Number.NaN), 'runs.1.depthReadings.2.depthM'],
    ['an infinite length', (ab) => void (ab.runs[0]!.measuredLengthM = Infinity), 'runs.0.measuredLengthM'],
    ['a NaN route point', (ab) => void (ab.runs[2]!.route![1]!.x = Number.NaN), 'runs.2.route.1.x'],
    ['a GPS bend without its accuracy', (ab) => void (ab.runs[2]!.route![1] = { x: 1, y: 2, source: 'gps' }), 'runs.2.route.1.accuracyM'],
    ['a negative bend accuracy', (ab) => void (ab.runs[2]!.route![1] = { x: 1, y: 2, source: 'gps', accuracyM: -1 }), 'runs.2.route.1.accuracyM'],
    ['an unknown bend source', (ab) => void (ab.runs[2]!.route![1] = { x: 1, y: 2, source: 'compass' as 'gps', accuracyM: 3 }), 'runs.2.route.1.source'],
    ['a fractional AWG', (ab) => void (ab.runs[0]!.gauge = { system: 'awg', awg: 13.5 }), 'runs.0.gauge.awg'],
    ['an AWG beyond 4/0', (ab) => void (ab.runs[0]!.gauge = { system: 'awg', awg: -7 }), 'runs.0.gauge.awg'],
    ['an unknown metric size', (ab) => void (ab.runs[0]!.gauge = { system: 'mm2', mm2: 3 }), 'runs.0.gauge.mm2'],
    ['a run to a missing item', (ab) => void (ab.runs[4]!.toItemId = 'sp-nowhere'), 'runs.4.toItemId'],
    ['a run from a missing item', (ab) => void (ab.runs[4]!.fromItemId = 'j-nowhere'), 'runs.4.fromItemId'],
    ['a run to itself', (ab) => void (ab.runs[4]!.toItemId = ab.runs[4]!.fromItemId), 'runs.4.toItemId'],
    ['a duplicate item id', (ab) => void (ab.items[5]!.id = ab.items[4]!.id), 'items.5.id'],
    ['a duplicate run id', (ab) => void (ab.runs[6]!.id = ab.runs[2]!.id), 'runs.6.id'],
    ['a pair the cable does not have', (ab) => void (ab.runs[2]!.pairs[0]!.pairIndex = 2), 'runs.2.pairs.0.pairIndex'],
    ['a channel the amp does not have', (ab) => void (ab.runs[2]!.pairs[0]!.channel = { amplifierItemId: 'amp-1', channelId: 'ch-9' }), 'runs.2.pairs.0.channel.channelId'],
    ['a channel on an item that is not an amp', (ab) => void (ab.runs[2]!.pairs[0]!.channel = { amplifierItemId: 'j-patio', channelId: 'ch-patio' }), 'runs.2.pairs.0.channel.amplifierItemId'],
    ['a tie to a missing reference point', (ab) => void (ab.items[4]!.ties![1]!.referencePointId = 'rp-shed'), 'items.4.ties.1.referencePointId'],
    ['a zone that does not exist', (ab) => void (ab.items[4]!.zoneId = 'zone-deck'), 'items.4.zoneId'],
    ['a check on a missing channel', (ab) => void (ab.checks[0]!.channel.channelId = 'ch-x'), 'checks.0.channel.channelId'],
    ['a depth station far past the run', (ab) => void (ab.runs[3]!.depthReadings![0]!.stationM = 60), 'runs.3.depthReadings.0.stationM'],
    ['an empty id', (ab) => void (ab.runs[3]!.id = ''), 'runs.3.id'],
    ['an id longer than 64 characters', (ab) => void (ab.runs[3]!.id = 'x'.repeat(65)), 'runs.3.id'],
  ])('should reject %s with the path %s', (_name, mutate, path) => {
    expect(withRun(mutate)).toContain(path);
  });

  it('should accept route bends with a source, and a GPS bend with its accuracy', () => {
    const paths = withRun((ab) => {
      ab.runs[2]!.route![0] = { ...ab.runs[2]!.route![0]!, source: 'manual' };
      ab.runs[2]!.route![1] = { ...ab.runs[2]!.route![1]!, source: 'gps', accuracyM: 4.5 };
    });
    expect(paths).toEqual([]);
  });

  it('should reject a cycle in the wiring on the run that closes it', () => {
    const paths = withRun((ab) => {
      ab.runs.push({ ...structuredClone(ab.runs[2]!), id: 'run-back', label: 'P1 back to splice', fromItemId: 'sp-p1', toItemId: 'j-patio' });
    });
    expect(paths).toEqual([`runs.${DEMO_AS_BUILT.runs.length}.toItemId`]);
  });

  it('should reject a three-run cycle', () => {
    const paths = withRun((ab) => {
      const base = structuredClone(ab.runs[2]!);
      ab.runs.push({ ...base, id: 'c1', fromItemId: 'sp-p1', toItemId: 'sp-p2' });
      ab.runs.push({ ...base, id: 'c2', fromItemId: 'sp-p2', toItemId: 'j-patio' });
    });
    expect(paths).toHaveLength(1);
    expect(paths[0]).toMatch(/^runs\.1[12]\.toItemId$/);
  });

  it('should not treat spare runs as part of a cycle', () => {
    const paths = withRun((ab) => {
      ab.runs.push({ ...structuredClone(ab.runs[2]!), id: 'run-back', fromItemId: 'sp-p1', toItemId: 'j-patio', isSpare: true });
    });
    expect(paths).toEqual([]);
  });

  it.each<[string, (ab: Mutable) => void, string]>([
    [
      'a speaker with neither impedance nor tap',
      (ab) => {
        const sp = ab.items[4]!;
        if (sp.kind === 'speaker') delete sp.nominalImpedanceOhm;
      },
      'items.4.nominalImpedanceOhm',
    ],
    [
      'a speaker with both impedance and tap',
      (ab) => {
        const sp = ab.items[4]!;
        if (sp.kind === 'speaker') sp.constantVoltage = { lineVoltage: '70V', tapWatts: 5 };
      },
      'items.4.nominalImpedanceOhm',
    ],
    [
      'a dual voice coil sub without coil wiring',
      (ab) => {
        const sub = ab.items[7]!;
        if (sub.kind === 'subwoofer') delete sub.coilWiring;
      },
      'items.7.coilWiring',
    ],
    ['an unknown item kind', (ab) => void ((ab.items[3] as { kind: string }).kind = 'bollard'), 'items.3.kind'],
    ['a negative impedance', (ab) => void ((ab.items[4] as { nominalImpedanceOhm: number }).nominalImpedanceOhm = -8), 'items.4.nominalImpedanceOhm'],
  ])('should reject %s with the path %s', (_name, mutate, path) => {
    expect(withRun(mutate)).toContain(path);
  });

  it('should reject hostile array sizes at the array', () => {
    const ab = demo();
    const item = ab.items[3]!;
    ab.items = Array.from({ length: 5001 }, (_, i) => ({ ...item, id: `j-${i}` }));
    expect(issuePaths(ab)).toContain('items');
  });

  it('should reject a payload that is not an object', () => {
    expect(issuePaths('[]')).toEqual(['']);
  });
});
