import type { AsBuilt } from './as-built.schema.js';
import type { Item } from './item.schema.js';
import type { Run } from './run.schema.js';

/** Small deterministic PRNG (mulberry32) so generated jobs are identical run to run. */
function prng(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/**
 * A large, valid, deterministic as-built for benchmarks and scale tests: 10 amplifiers × 2 channels,
 * each channel a wall entry → splice → 3 branch splices → 3 series pairs of 16 Ω speakers each, 40 capped spare runs, 60 doubled trunk runs and 50 abandoned runs: 500 items and
 * 600 runs, every item tied to reference points, every buried run with a route and depth readings.
 */
export function generateSyntheticAsBuilt(seed = 1): AsBuilt {
  const rand = prng(seed);
  const items: Item[] = [];
  const runs: Run[] = [];
  const refs = [
    { id: 'rp-0', label: 'Corner A', x: 0, y: 0 },
    { id: 'rp-1', label: 'Corner B', x: 400, y: 0 },
    { id: 'rp-2', label: 'Corner C', x: 200, y: 300 },
  ];
  const tiesFor = (x: number, y: number, three: boolean): Pick<Item, 'ties' | 'sideHint'> => {
    const chosen = three ? refs : [refs[0]!, refs[1]!];
    return {
      ties: chosen.map((r) => ({ referencePointId: r.id, distanceM: Math.round(Math.hypot(x - r.x, y - r.y) * 100) / 100 })),
      sideHint: y > 0 ? 'left' : 'right',
    };
  };
  const pos = new Map<string, { x: number; y: number }>();
  const addItem = (item: Item, x: number, y: number, three = true): string => {
    items.push({ ...item, ...tiesFor(x, y, three) } as Item);
    pos.set(item.id, { x, y });
    return item.id;
  };
  const addRun = (
    id: string,
    from: string,
    to: string,
    awg: number,
    pairs: Run['pairs'],
    extra: Partial<Run> = {},
  ): void => {
    const a = pos.get(from)!;
    const b = pos.get(to)!;
    const mid = { x: (a.x + b.x) / 2 + (rand() - 0.5) * 2, y: (a.y + b.y) / 2 + (rand() - 0.5) * 2 };
    const route = [a, mid, b];
    const planLength = Math.hypot(mid.x - a.x, mid.y - a.y) + Math.hypot(b.x - mid.x, b.y - mid.y);
    const measuredLengthM = Math.round((planLength + 0.3 + rand() * 0.5) * 10) / 10;
    runs.push({
      id,
      label: id,
      fromItemId: from,
      toItemId: to,
      cableType: `${awg}/${pairs.length * 2} direct burial`,
      gauge: { system: 'awg', awg },
      conductors: Math.max(2, pairs.length * 2),
      pairs,
      measuredLengthM,
      method: 'direct_burial',
      route,
      depthReadings: [0.2, 0.5, 0.8].map((f) => ({ stationM: Math.round(measuredLengthM * f * 10) / 10, depthM: 0.16 + rand() * 0.12 })),
      ...extra,
    });
  };

  const amps: string[] = [];
  const wallEntries: string[] = [];
  const splices: string[] = [];
  for (let a = 0; a < 10; a += 1) {
    const ax = 20 + a * 36;
    const amp = addItem(
      {
        id: `amp-${a}`,
        kind: 'amplifier',
        label: `Amplifier ${a}`,
        channels: [
          { id: 'ch-a', name: 'A' },
          { id: 'ch-b', name: 'B' },
        ],
        ratedWatts8Ohm: 150,
        ratedWatts4Ohm: 250,
        minimumImpedanceOhm: 2,
      },
      ax,
      -4,
    );
    // The amplifier is indoors: placed on the plan, not tied.
    const ampItem = items[items.length - 1]!;
    delete ampItem.ties;
    delete ampItem.sideHint;
    ampItem.position = { x: ax, y: -4, source: 'manual', accuracyM: 0.5 };
    amps.push(amp);
    const we = addItem({ id: `we-${a}`, kind: 'wall_entry', label: `Wall entry ${a}` }, ax, 1, true);
    wallEntries.push(we);
    const channels = [
      { amplifierItemId: amp, channelId: 'ch-a' },
      { amplifierItemId: amp, channelId: 'ch-b' },
    ];
    addRun(`run-${a}-trunk`, amp, we, 12, [
      { pairIndex: 1, channel: channels[0]! },
      { pairIndex: 2, channel: channels[1]! },
    ], { method: 'indoor', route: undefined, depthReadings: undefined });
    channels.forEach((channel, c) => {
      const jx = ax + (c === 0 ? -8 : 8);
      const j = addItem({ id: `j-${a}-${c}`, kind: 'junction', label: `Splice ${a}-${c}` }, jx, 8, true);
      splices.push(j);
      addRun(`run-${a}-${c}-main`, we, j, 10, [{ pairIndex: 1, channel }]);
      for (let b = 0; b < 3; b += 1) {
        const bx = jx + (b - 1) * 6;
        const bj = addItem({ id: `j-${a}-${c}-${b}`, kind: 'junction', label: `Branch ${a}-${c}-${b}` }, bx, 14 + b * 4, true);
        splices.push(bj);
        addRun(`run-${a}-${c}-${b}`, j, bj, 12, [{ pairIndex: 1, channel }]);
        let previous: string | null = null;
        for (let s = 0; s < 6; s += 1) {
          // Speakers go in series pairs (16 + 16 Ω); the nine pairs of a channel are in parallel: 3.56 Ω.
          const isSeriesHead = s % 2 === 0;
          const sp = addItem(
            {
              id: `sp-${a}-${c}-${b}-${s}`,
              kind: 'speaker',
              label: `Speaker ${a}-${c}-${b}-${s}`,
              nominalImpedanceOhm: 16,
              ...(isSeriesHead ? { onwardWiring: 'series' as const } : {}),
            },
            bx + (s - 2.5) * 1.5,
            20 + b * 4 + s * 1.5,
          );
          const from = !isSeriesHead && previous !== null ? previous : bj;
          addRun(`run-${a}-${c}-${b}-${s}`, from, sp, 14, [{ pairIndex: 1, channel }]);
          previous = sp;
        }
      }
    });
  }
  for (let s = 0; s < 40; s += 1) {
    const we = wallEntries[s % wallEntries.length]!;
    const at = pos.get(we)!;
    const se = addItem({ id: `se-${s}`, kind: 'spare_end', label: `Spare end ${s}`, isCapped: true }, at.x + 3, 10 + s * 2);
    addRun(`run-spare-${s}`, we, se, 14, [
      { pairIndex: 1, channel: null },
      { pairIndex: 2, channel: null },
    ], { isSpare: true });
  }
  for (let d = 0; d < 60; d += 1) {
    const a = d % 10;
    const c = Math.floor(d / 10) % 2;
    const b = Math.floor(d / 20);
    const channel = { amplifierItemId: `amp-${a}`, channelId: c === 0 ? 'ch-a' : 'ch-b' };
    addRun(`run-double-${d}`, `j-${a}-${c}`, `j-${a}-${c}-${b}`, 12, [{ pairIndex: 1, channel }]);
  }
  for (let x = 0; x < 50; x += 1) {
    const from = splices[Math.floor(rand() * splices.length)]!;
    let to = splices[Math.floor(rand() * splices.length)]!;
    if (to === from) to = splices[(splices.indexOf(from) + 1) % splices.length]!;
    addRun(`run-old-${x}`, from, to, 16, [{ pairIndex: 1, channel: null }], { isAbandoned: true });
  }
  return {
    site: { northAzimuthDeg: 7, origin: { lat: 38, lon: -97 } },
    zones: [],
    referencePoints: refs,
    items,
    runs,
    checks: amps.flatMap((amp) => [
      { id: `chk-${amp}-a`, channel: { amplifierItemId: amp, channelId: 'ch-a' }, quantity: 'dc_resistance' as const, measuredOhm: 2.9 },
      { id: `chk-${amp}-b`, channel: { amplifierItemId: amp, channelId: 'ch-b' }, quantity: 'impedance' as const, measuredOhm: 3.9 },
    ]),
  };
}
