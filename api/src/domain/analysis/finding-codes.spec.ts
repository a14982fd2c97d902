import { describe, expect, it } from 'vitest';

import { AsBuiltSchema, type AsBuilt } from '../as-built/as-built.schema.js';
import { DEMO_AS_BUILT } from '../as-built/demo-as-built.js';
import type { Item } from '../as-built/item.schema.js';
import type { Run } from '../as-built/run.schema.js';
import type { AnalysisOptionsInput } from './analysis-options.schema.js';
import { analyzeAsBuilt } from './analyze.js';
import { FINDING_CODES, type FindingCode, type FindingSeverity, findingText } from './finding.js';

/*
 * Every finding code, raised by at least one small scenario, with its severity, its path into the
 * as-built and the numbers its message prints. The numbers are worked by hand in the comments (series and
 * parallel resistance, the two-circle intersection, the NEC table cell), not recomputed with our code.
 * A code added to FINDING_CODES without a scenario here fails the last test.
 */

type Mutable = { -readonly [K in keyof AsBuilt]: AsBuilt[K] };
type ChannelRef = { amplifierItemId: string; channelId: string };

const A: ChannelRef = { amplifierItemId: 'amp', channelId: 'a' };

function run(id: string, from: string, to: string, lengthM: number, channel: ChannelRef | null, extra: Partial<Run> = {}): Run {
  return {
    id,
    label: id,
    fromItemId: from,
    toItemId: to,
    cableType: '14/2 direct burial',
    gauge: { system: 'awg', awg: 14 },
    conductors: 2,
    pairs: [{ pairIndex: 1, channel }],
    measuredLengthM: lengthM,
    method: 'direct_burial',
    depthReadings: [{ stationM: 0.5, depthM: 0.2 }],
    ...extra,
  } as Run;
}

function speaker(id: string, ohm: number, extra: Partial<Item> = {}): Item {
  return { id, kind: 'speaker', label: id, nominalImpedanceOhm: ohm, position: { x: 1, y: 1, source: 'manual' }, ...extra } as Item;
}

function amplifier(id = 'amp', extra: Record<string, unknown> = {}): Item {
  return {
    id,
    kind: 'amplifier',
    label: id === 'amp' ? 'Amp' : id,
    channels: [{ id: 'a', name: 'Channel A' }],
    ratedWatts8Ohm: 100,
    ratedWatts4Ohm: 160,
    minimumImpedanceOhm: 4,
    ...extra,
  } as Item;
}

/** One channel, one speaker, one run. */
function single(lengthM = 5, ohm = 8, runExtra: Partial<Run> = {}): Mutable {
  return {
    zones: [],
    referencePoints: [],
    items: [amplifier(), speaker('sp', ohm)],
    runs: [run('r1', 'amp', 'sp', lengthM, A, runExtra)],
    checks: [],
  };
}

/** A 70 V line with the given tap watts (the handbook's 70.7 V system: Z = V²/P). */
function cvLine(taps: number[], ratedWatts = 100): Mutable {
  return {
    zones: [],
    referencePoints: [],
    items: [
      amplifier('amp', { channels: [{ id: 'a', name: 'Garden line', constantVoltage: { lineVoltage: '70V', ratedWatts } }] }),
      ...taps.map((w, i) => ({ id: `s${i}`, kind: 'speaker', label: `S${i}`, constantVoltage: { lineVoltage: '70V', tapWatts: w } }) as Item),
    ],
    runs: taps.map((_, i) => run(`r${i}`, 'amp', `s${i}`, 10, A)),
    checks: [],
  };
}

/** Reference points 10 m apart on the x axis, and one speaker tied to both. */
function tied(r0: number, r1: number, extra: Partial<Item> = {}): Mutable {
  const ab = single();
  ab.referencePoints = [
    { id: 'rp-a', label: 'Corner A', x: 0, y: 0 },
    { id: 'rp-b', label: 'Corner B', x: 10, y: 0 },
  ];
  ab.items[1] = speaker('sp', 8, {
    position: undefined,
    ties: [
      { referencePointId: 'rp-a', distanceM: r0 },
      { referencePointId: 'rp-b', distanceM: r1 },
    ],
    sideHint: 'left',
    ...extra,
  });
  return ab;
}

interface Scenario {
  build: () => Mutable;
  options?: AnalysisOptionsInput;
  severity: FindingSeverity;
  path: (string | number)[];
  /** Fragments the message must contain, usually the numbers it prints. */
  says: string[];
  /** Fragments the text must contain when written for an imperial reader (`findingText`). */
  saysImperial?: string[];
}

const SCENARIOS: Record<FindingCode, Scenario> = {
  // ---- loads ----------------------------------------------------------------------------------------
  LOAD_BELOW_AMP_MINIMUM: {
    // Three 8 Ω speakers in parallel: 8/3 = 2.67 Ω, under the amplifier's 4 Ω minimum.
    build: () => {
      const ab = single(2, 8);
      ab.items.push(speaker('sp2', 8), speaker('sp3', 8));
      ab.runs.push(run('r2', 'amp', 'sp2', 2, A), run('r3', 'amp', 'sp3', 2, A));
      return ab;
    },
    severity: 'critical',
    path: ['items', 0],
    says: ['2.67 Ω of speakers', '4 Ω minimum'],
  },
  CHANNEL_SHORT: {
    // A 0.1 Ω "speaker" (a dead short) on 1 m of 14 AWG: 0.1 + 2 × 1 m × 8.28 mΩ/m (NBS 2.525 Ω/1000 ft)
    // = 0.117 Ω, under the 0.5 Ω short threshold.
    build: () => single(1, 0.1),
    severity: 'critical',
    path: ['items', 0],
    says: ['0.117 Ω', 'effectively a short'],
  },
  CHANNEL_OPEN: {
    // Amp → splice → splice, no speaker anywhere: infinite impedance.
    build: () => ({
      zones: [],
      referencePoints: [],
      items: [
        amplifier(),
        { id: 'j1', kind: 'junction', label: 'Splice 1' } as Item,
        { id: 'j2', kind: 'junction', label: 'Splice 2' } as Item,
      ],
      runs: [run('r1', 'amp', 'j1', 5, A), run('r2', 'j1', 'j2', 5, A)],
      checks: [],
    }),
    severity: 'warning',
    path: ['items', 0],
    says: ['Channel A', 'open circuit'],
  },
  BRANCH_ENDS_WITHOUT_LOAD: {
    build: () => {
      const ab = single();
      ab.items.push({ id: 'j-empty', kind: 'junction', label: 'Empty splice' } as Item);
      ab.runs.push(run('r-empty', 'amp', 'j-empty', 3, A));
      return ab;
    },
    severity: 'warning',
    path: ['items', 2],
    says: ['Empty splice'],
  },
  CABLE_LOSS_OVER_LIMIT: {
    // Worked by hand from NBS Handbook 100's 14 AWG resistance (2.525 Ω per 1000 ft at 20 °C): 200 ft one
    // way is a 1.01 Ω loop. Level drop 20·log10(8 / 9.01) = 1.03 dB, i.e. (8 / 9.01)² → 21.2 % less power
    // than ideal cable; the cable dissipates 1.01 / 9.01 = 11.2 % of the amplifier's output.
    build: () => single(60.96, 8),
    severity: 'warning',
    path: ['items', 1],
    says: ['level drop at the speaker 1.03 dB', '21.2 % less power than with ideal cable', '11.2 % of the amplifier'],
  },
  SPEAKER_ON_NO_CHANNEL: {
    build: () => {
      const ab = single();
      ab.items.push(speaker('sp-lonely', 8, { label: 'Lonely speaker' }));
      return ab;
    },
    severity: 'warning',
    path: ['items', 2],
    says: ['Lonely speaker'],
  },
  SPEAKER_ONLY_ON_SPARE_RUN: {
    build: () => single(5, 8, { isSpare: true }),
    severity: 'warning',
    path: ['items', 1],
    says: ['sp'],
  },
  RUN_NOT_CONNECTED_TO_AMP: {
    build: () => {
      const ab = single();
      ab.items.push(speaker('sp-far', 8), { id: 'j-far', kind: 'junction', label: 'Far splice' } as Item);
      ab.runs.push(run('r-far', 'j-far', 'sp-far', 5, A));
      return ab;
    },
    severity: 'critical',
    path: ['runs', 1, 'pairs'],
    says: ['r-far'],
  },
  LOOP_IN_WIRING: {
    build: () => {
      const ab = single();
      ab.items.push(speaker('sp2', 8));
      ab.runs.push(run('r2', 'amp', 'sp2', 5, A), run('r3', 'sp', 'sp2', 5, A));
      return ab;
    },
    severity: 'critical',
    path: ['runs', 2],
    says: ['closes a loop'],
  },
  ITEM_ON_TWO_CHANNELS: {
    build: () => {
      const ab = single();
      (ab.items[0] as { channels: unknown[] }).channels.push({ id: 'b', name: 'Channel B' });
      ab.runs.push(run('r2', 'amp', 'sp', 5, { amplifierItemId: 'amp', channelId: 'b' }));
      return ab;
    },
    severity: 'critical',
    path: ['items', 1],
    says: ['sp'],
  },
  AMPLIFIER_OUTPUTS_JOINED: {
    build: () => {
      const ab = single();
      ab.items.push(amplifier('amp-2', { label: 'Second amp' }));
      ab.runs.push(run('r-join', 'amp', 'amp-2', 3, A));
      return ab;
    },
    severity: 'critical',
    path: ['runs', 1],
    says: ['Second amp', 'must never be joined'],
  },
  CV_TAPS_OVER_HEADROOM: {
    // 85 W of taps on a 100 W output: over the 80 % headroom rule (common practice, no published source).
    build: () => cvLine([10, 10, 10, 10, 10, 10, 10, 10, 5]),
    severity: 'warning',
    path: ['items', 0],
    says: ['85 W', '100 W', '85 %', '80 %'],
  },
  CV_OVERLOAD: {
    // 110 W of taps on a 100 W output: more than it can deliver ([CVH]: taps must not exceed the amplifier).
    build: () => cvLine(Array<number>(11).fill(10)),
    severity: 'critical',
    path: ['items', 0],
    says: ['110 W', '100 W', '110 %'],
  },
  CV_LINE_VOLTAGE_MISMATCH: {
    build: () => {
      const ab = cvLine([10]);
      ab.items[1] = { id: 's0', kind: 'speaker', label: 'S0', constantVoltage: { lineVoltage: '100V', tapWatts: 10 } } as Item;
      return ab;
    },
    severity: 'warning',
    path: ['items', 1, 'constantVoltage', 'lineVoltage'],
    says: ['100V line', '70V line'],
  },
  LOW_IMPEDANCE_SPEAKER_ON_CV_LINE: {
    build: () => {
      const ab = cvLine([10]);
      ab.items.push(speaker('lowz', 8));
      ab.runs.push(run('rz', 'amp', 'lowz', 5, A));
      return ab;
    },
    severity: 'critical',
    path: ['items', 2],
    says: ['lowz', '70V line'],
  },
  CV_SPEAKER_ON_LOW_IMPEDANCE_CHANNEL: {
    build: () => {
      const ab = single();
      ab.items[1] = { id: 'sp', kind: 'speaker', label: 'Tapped speaker', constantVoltage: { lineVoltage: '70V', tapWatts: 10 } } as Item;
      return ab;
    },
    severity: 'warning',
    path: ['items', 1],
    says: ['Tapped speaker', 'low-impedance output'],
  },
  NO_GAUGE_MEETS_LOSS_LIMIT: {
    // 400 m into 4 Ω: even 10 AWG's loop (2 × 400 m × 3.28 mΩ/m = 2.6 Ω) costs several dB.
    build: () => single(400, 4),
    severity: 'info',
    path: ['runs', 0, 'gauge'],
    says: [],
  },
  // ---- depth ----------------------------------------------------------------------------------------
  DEPTH_SHALLOW: {
    // NEC Table 300.5 column 5 (≤ 30 V), all other locations: 6 in (150 mm). 10 cm = 3.94 in is shallower:
    // 3 7/8 in to the eighth, 2 in short; 2 m = 78.7 in = 6 ft 7 in (1 in = 0.0254 m, NIST SP 811 B.8).
    build: () => single(5, 8, { depthReadings: [{ stationM: 2, depthM: 0.1 }] }),
    severity: 'warning',
    path: ['runs', 0, 'depthReadings', 0],
    says: ['10 cm of cover', 'at 2 m from', 'is 15 cm, 5 cm short'],
    saysImperial: ['3 7/8 in of cover', 'at 6 ft 7 in from', 'is 6 in, 2 in short'],
  },
  DEPTH_NOT_RECORDED: {
    build: () => single(5, 8, { depthReadings: [] }),
    severity: 'warning',
    path: ['runs', 0, 'depthReadings'],
    says: ['no depth readings'],
  },
  DEPTH_NO_RULE: {
    build: () => single(5, 8),
    options: { depthRules: { name: 'Empty', rules: [] } },
    severity: 'info',
    path: ['runs', 0, 'location'],
    says: ['direct burial', 'not checked'],
  },
  DEPTH_RULE_OVER_30V: {
    // A 70.7 V constant-voltage line is outside NEC Table 300.5 column 5 (≤ 30 V); the default table checks
    // it against column 1, 24 in (600 mm) for direct-burial cable — 60 cm, or the 24 in it was written in.
    build: () => {
      const ab = cvLine([10]);
      ab.runs[0]!.depthReadings = [{ stationM: 1, depthM: 0.65 }];
      return ab;
    },
    severity: 'info',
    path: ['runs', 0, 'method'],
    says: ['a 70V constant-voltage line', '60 cm of cover', 'authority having jurisdiction'],
    saysImperial: ['24 in of cover'],
  },
  // ---- geometry -------------------------------------------------------------------------------------
  POSITION_FROM_TIES_FAILED: {
    // Bourke: circles of 2 m and 3 m whose centres are 10 m apart do not meet.
    build: () => tied(2, 3),
    severity: 'warning',
    path: ['items', 1, 'ties'],
    says: ['could not be placed from its ties'],
  },
  POSITION_WEAK_GEOMETRY: {
    // Circles of 5.05 m about points 10 m apart meet at ~164° (cos θ = (2·5.05² − 10²)/(2·5.05²) = −0.961):
    // a 5 cm tape error moves the point by metres along y.
    build: () => tied(5.05, 5.05),
    severity: 'warning',
    path: ['items', 1, 'ties'],
    says: ['shallow angle'],
  },
  POSITION_TIES_DISAGREE: {
    // Three ties: 6 and 8 m give (3.6, 4.8) (Bourke's 6-8-10 case); the third is 1.5 m longer than it should be.
    build: () => {
      const ab = tied(6, 8);
      ab.referencePoints.push({ id: 'rp-c', label: 'Post C', x: 3.6, y: 10 });
      (ab.items[1] as { ties: unknown[] }).ties.push({ referencePointId: 'rp-c', distanceM: 5.2 + 1.5 });
      return ab;
    },
    severity: 'warning',
    path: ['items', 1, 'ties'],
    says: ['disagree'],
  },
  POSITION_SIDE_HINT_MISSING: {
    build: () => tied(6, 8, { sideHint: undefined }),
    severity: 'warning',
    path: ['items', 1, 'sideHint'],
    says: ['two mirror positions'],
  },
  POSITION_UNKNOWN: {
    build: () => tied(6, 8, { ties: [{ referencePointId: 'rp-a', distanceM: 6 }] }),
    severity: 'warning',
    path: ['items', 1, 'ties'],
    says: ['one tie'],
  },
  ROUTE_LENGTH_MISMATCH: {
    // A drawn route of 10 m against 30 m of measured cable.
    build: () =>
      single(30, 8, {
        route: [
          { x: 0, y: 0 },
          { x: 10, y: 0 },
        ],
      } as Partial<Run>),
    severity: 'warning',
    path: ['runs', 0, 'measuredLengthM'],
    says: ['10 m', '30 m'],
  },
  // ---- commissioning checks -------------------------------------------------------------------------
  CHECK_READING_LOW: {
    // Expected: 8 Ω + a 5 m loop of 14 AWG (2 × 5 m × 8.28 mΩ/m = 0.083 Ω) = 8.08 Ω, accepted within
    // 0.75–1.25 of it (common practice, no published source) → 6.06–10.1 Ω.
    build: () => withCheck({ quantity: 'impedance', measuredOhm: 4 }),
    severity: 'warning',
    path: ['checks', 0, 'measuredOhm'],
    says: ['4 Ω', '6.06–10.1 Ω'],
  },
  CHECK_READING_HIGH: {
    build: () => withCheck({ quantity: 'impedance', measuredOhm: 12 }),
    severity: 'warning',
    path: ['checks', 0, 'measuredOhm'],
    says: ['12 Ω', '6.06–10.1 Ω'],
  },
  CHECK_SHORT: {
    build: () => withCheck({ quantity: 'dc_resistance', measuredOhm: 0.1 }),
    severity: 'critical',
    path: ['checks', 0, 'measuredOhm'],
    says: ['0.1 Ω'],
  },
  CHECK_OPEN: {
    // DC band: a coil reads 0.6–0.95 of its nominal 8 Ω (from memory; common practice), plus the 0.083 Ω
    // loop, widened by the 5 % meter allowance: (4.8 + 0.083) × 0.95 = 4.64 to (7.6 + 0.083) × 1.05 = 8.07 Ω.
    build: () => withCheck({ quantity: 'dc_resistance', measuredOhm: 5000 }),
    severity: 'critical',
    path: ['checks', 0, 'measuredOhm'],
    says: ['5000 Ω', '4.64–8.07 Ω'],
  },
  CHECK_NOT_COMPARABLE: {
    // The check's channel has a loop, so its load is not computed and the reading cannot be compared.
    build: () => {
      const ab = LOOP();
      ab.checks = [{ id: 'chk', channel: A, quantity: 'impedance', measuredOhm: 4 }];
      return ab;
    },
    severity: 'info',
    path: ['checks', 0, 'measuredOhm'],
    says: ['could not be computed'],
  },
  CHECK_POLARITY: {
    build: () => withCheck({ quantity: 'impedance', measuredOhm: 8, isPolarityOk: false }),
    severity: 'warning',
    path: ['checks', 0, 'isPolarityOk'],
    says: ['reversed polarity'],
  },
  CHECK_INSULATION: {
    build: () => withCheck({ quantity: 'impedance', measuredOhm: 8, isInsulationOk: false }),
    severity: 'critical',
    path: ['checks', 0, 'isInsulationOk'],
    says: ['insulation'],
  },
};

function LOOP(): Mutable {
  return SCENARIOS.LOOP_IN_WIRING.build();
}

function withCheck(check: Record<string, unknown>): Mutable {
  const ab = single(5, 8);
  ab.checks = [{ id: 'chk', channel: A, ...check } as Mutable['checks'][number]];
  return ab;
}

describe('finding codes', () => {
  it.each(Object.entries(SCENARIOS))('%s is raised with its severity, path and numbers', (code, scenario) => {
    const analysis = analyzeAsBuilt(AsBuiltSchema.parse(scenario.build()), scenario.options ?? {});
    const finding = analysis.findings.find((f) => f.code === code);
    expect(finding, `${code} among ${analysis.findings.map((f) => f.code).join(', ')}`).toBeDefined();
    expect(finding!.severity).toBe(scenario.severity);
    expect(finding!.path).toEqual(scenario.path);
    for (const fragment of scenario.says) expect(finding!.message).toContain(fragment);
    // Composed from numbers: the same finding in feet and inches for an imperial reader, no metric left.
    for (const fragment of scenario.saysImperial ?? []) expect(findingText(finding!, 'imperial')).toContain(fragment);
    expect(findingText(finding!, 'metric')).toBe(finding!.message);
    if (finding!.parts) expect(findingText(finding!, 'imperial')).not.toMatch(/\d\s?(cm|m|mm)\b/);
  });

  it('has a scenario for every code (a new code needs one here)', () => {
    expect(Object.keys(SCENARIOS).sort()).toEqual([...FINDING_CODES].sort());
  });

  it('raises none of them on the demo job but its one shallow station', () => {
    const codes = analyzeAsBuilt(AsBuiltSchema.parse(DEMO_AS_BUILT)).findings.map((f) => f.code);
    expect(codes).toEqual(['DEPTH_SHALLOW']);
  });
});
