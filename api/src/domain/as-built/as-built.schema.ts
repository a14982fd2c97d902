import { z } from 'zod';

import { CommissioningCheckSchema } from '../checks/commissioning-check.schema.js';
import { SITE_FEATURE_LIMITS, SiteFeatureKindSchema, SiteFeatureShapeSchema } from '../sites/site-feature.schema.js';
import { AS_BUILT_LIMITS, FiniteSchema, IdSchema, LabelSchema, PlanPointSchema } from './common.schema.js';
import { ItemSchema, ReferencePointSchema, type Item } from './item.schema.js';
import { RunSchema, type Run } from './run.schema.js';

export const ZoneSchema = z.object({ id: IdSchema, name: LabelSchema });
export type Zone = z.infer<typeof ZoneSchema>;

/**
 * Site frame. The plan has x to the plan's right and y to the plan's top, in metres.
 * `northAzimuthDeg` is the true bearing (clockwise from true north) of the plan's +y axis: 0 when the
 * plan is drawn north-up. `origin` is the WGS84 position of plan (0, 0); without it no GeoJSON is made.
 */
/**
 * A landmark of the site (house, fence, patio …) as the drawings show it: read from the site, never
 * written through a job's as-built (the site's own routes change them).
 */
export const PlanFeatureSchema = z.object({
  id: IdSchema,
  kind: SiteFeatureKindSchema,
  name: LabelSchema,
  shape: SiteFeatureShapeSchema,
  points: z.array(PlanPointSchema).min(2).max(SITE_FEATURE_LIMITS.maxPoints),
});
export type PlanFeature = z.infer<typeof PlanFeatureSchema>;

export const SiteFrameSchema = z.object({
  /** The site's features (landmarks), drawn under the runs. */
  features: z.array(PlanFeatureSchema).max(SITE_FEATURE_LIMITS.maxFeaturesPerSite).optional(),
  northAzimuthDeg: FiniteSchema.min(-360).max(360).optional(),
  origin: z
    .object({
      lat: FiniteSchema.min(-89.9).max(89.9),
      lon: FiniteSchema.min(-180).max(180),
      heightM: FiniteSchema.min(-500).max(9000).optional(),
    })
    .optional(),
});
export type SiteFrame = z.infer<typeof SiteFrameSchema>;

const AsBuiltObjectSchema = z.object({
  site: SiteFrameSchema.optional(),
  /** Display preference only; every stored number is SI. */
  units: z.object({ length: z.enum(['metric', 'imperial']) }).optional(),
  zones: z.array(ZoneSchema).max(AS_BUILT_LIMITS.maxZones),
  referencePoints: z.array(ReferencePointSchema).max(AS_BUILT_LIMITS.maxReferencePoints),
  items: z.array(ItemSchema).max(AS_BUILT_LIMITS.maxItems),
  runs: z.array(RunSchema).max(AS_BUILT_LIMITS.maxRuns),
  checks: z.array(CommissioningCheckSchema).max(AS_BUILT_LIMITS.maxChecks),
});

type AsBuiltShape = z.infer<typeof AsBuiltObjectSchema>;
type IssueSink = { addIssue: (issue: { code: 'custom'; path: (string | number)[]; message: string }) => void };

function reportDuplicateIds(
  list: readonly { id: string }[],
  collection: string,
  ctx: IssueSink,
): Map<string, number> {
  const index = new Map<string, number>();
  list.forEach((entry, i) => {
    if (index.has(entry.id)) {
      ctx.addIssue({ code: 'custom', path: [collection, i, 'id'], message: `duplicate id "${entry.id}" in ${collection}` });
    } else {
      index.set(entry.id, i);
    }
  });
  return index;
}

function checkChannelRef(
  ref: { amplifierItemId: string; channelId: string },
  path: (string | number)[],
  items: readonly Item[],
  itemIndex: Map<string, number>,
  ctx: IssueSink,
): void {
  const i = itemIndex.get(ref.amplifierItemId);
  const amp = i === undefined ? undefined : items[i];
  if (amp === undefined) {
    ctx.addIssue({ code: 'custom', path: [...path, 'amplifierItemId'], message: `no item with id "${ref.amplifierItemId}"` });
    return;
  }
  if (amp.kind !== 'amplifier') {
    ctx.addIssue({ code: 'custom', path: [...path, 'amplifierItemId'], message: `item "${amp.id}" is a ${amp.kind}, not an amplifier` });
    return;
  }
  if (!amp.channels.some((c) => c.id === ref.channelId)) {
    ctx.addIssue({ code: 'custom', path: [...path, 'channelId'], message: `amplifier "${amp.id}" has no channel "${ref.channelId}"` });
  }
}

function checkRun(run: Run, r: number, ab: AsBuiltShape, itemIndex: Map<string, number>, ctx: IssueSink): void {
  for (const end of ['fromItemId', 'toItemId'] as const) {
    if (!itemIndex.has(run[end])) {
      ctx.addIssue({ code: 'custom', path: ['runs', r, end], message: `no item with id "${run[end]}"` });
    }
  }
  if (run.fromItemId === run.toItemId) {
    ctx.addIssue({ code: 'custom', path: ['runs', r, 'toItemId'], message: 'a run cannot start and end at the same item' });
  }
  const maxPairs = Math.floor(run.conductors / 2);
  const seenPairs = new Set<number>();
  run.pairs.forEach((pair, p) => {
    if (pair.pairIndex > maxPairs) {
      ctx.addIssue({
        code: 'custom',
        path: ['runs', r, 'pairs', p, 'pairIndex'],
        message: `pair ${pair.pairIndex} does not exist in a ${run.conductors}-conductor cable (${maxPairs} pair${maxPairs === 1 ? '' : 's'})`,
      });
    }
    if (seenPairs.has(pair.pairIndex)) {
      ctx.addIssue({ code: 'custom', path: ['runs', r, 'pairs', p, 'pairIndex'], message: `pair ${pair.pairIndex} is listed twice` });
    }
    seenPairs.add(pair.pairIndex);
    if (pair.channel !== null) checkChannelRef(pair.channel, ['runs', r, 'pairs', p, 'channel'], ab.items, itemIndex, ctx);
  });
  run.depthReadings?.forEach((reading, d) => {
    // Readings a little past the reel length happen (slack in the trench); far past it is a typo.
    if (reading.stationM > run.measuredLengthM * 1.5 + 1) {
      ctx.addIssue({
        code: 'custom',
        path: ['runs', r, 'depthReadings', d, 'stationM'],
        message: `station ${reading.stationM} m is beyond the run's measured length of ${run.measuredLengthM} m`,
      });
    }
  });
}

/**
 * Rejects a directed cycle among live runs (not spare, not abandoned): following from → to must never
 * come back. The issue is reported on the `toItemId` of the run that closes the cycle.
 */
function checkDirectedCycles(runs: readonly Run[], ctx: IssueSink): void {
  const outgoing = new Map<string, number[]>();
  runs.forEach((run, r) => {
    if (run.isSpare === true || run.isAbandoned === true) return;
    const list = outgoing.get(run.fromItemId);
    if (list === undefined) outgoing.set(run.fromItemId, [r]);
    else list.push(r);
  });
  const state = new Map<string, 1 | 2>(); // 1 = on the current path, 2 = finished
  for (const start of outgoing.keys()) {
    if (state.has(start)) continue;
    // Iterative DFS: a run-chain of thousands of items must not overflow the call stack.
    const stack: { node: string; next: number }[] = [{ node: start, next: 0 }];
    state.set(start, 1);
    while (stack.length > 0) {
      const top = stack[stack.length - 1]!;
      const edges = outgoing.get(top.node) ?? [];
      if (top.next >= edges.length) {
        state.set(top.node, 2);
        stack.pop();
        continue;
      }
      const r = edges[top.next]!;
      top.next += 1;
      const to = runs[r]!.toItemId;
      const s = state.get(to);
      if (s === 1) {
        ctx.addIssue({
          code: 'custom',
          path: ['runs', r, 'toItemId'],
          message: `this run closes a loop in the wiring: item "${to}" already feeds item "${top.node}"`,
        });
      } else if (s === undefined) {
        state.set(to, 1);
        stack.push({ node: to, next: 0 });
      }
    }
  }
}

function checkCrossReferences(ab: AsBuiltShape, ctx: IssueSink): void {
  const zoneIndex = reportDuplicateIds(ab.zones, 'zones', ctx);
  const refIndex = reportDuplicateIds(ab.referencePoints, 'referencePoints', ctx);
  const itemIndex = reportDuplicateIds(ab.items, 'items', ctx);
  reportDuplicateIds(ab.runs, 'runs', ctx);
  reportDuplicateIds(ab.checks, 'checks', ctx);

  ab.items.forEach((item, i) => {
    if (item.zoneId !== undefined && !zoneIndex.has(item.zoneId)) {
      ctx.addIssue({ code: 'custom', path: ['items', i, 'zoneId'], message: `no zone with id "${item.zoneId}"` });
    }
    const seenRefs = new Set<string>();
    item.ties?.forEach((tie, t) => {
      if (!refIndex.has(tie.referencePointId)) {
        ctx.addIssue({
          code: 'custom',
          path: ['items', i, 'ties', t, 'referencePointId'],
          message: `no reference point with id "${tie.referencePointId}"`,
        });
      }
      if (seenRefs.has(tie.referencePointId)) {
        ctx.addIssue({
          code: 'custom',
          path: ['items', i, 'ties', t, 'referencePointId'],
          message: 'two ties from the same reference point: tape from a different point',
        });
      }
      seenRefs.add(tie.referencePointId);
    });
    if (item.kind === 'amplifier') {
      reportDuplicateIds(item.channels, 'channels', {
        addIssue: (issue) => ctx.addIssue({ ...issue, path: ['items', i, ...issue.path] }),
      });
    }
  });
  ab.runs.forEach((run, r) => checkRun(run, r, ab, itemIndex, ctx));
  checkDirectedCycles(ab.runs, ctx);
  ab.checks.forEach((check, c) => checkChannelRef(check.channel, ['checks', c, 'channel'], ab.items, itemIndex, ctx));
}

/**
 * A job's as-built record as submitted by the crew. Validates every field and the cross-references:
 * duplicate ids, runs to missing items, pairs beyond the conductor count, channels that do not exist,
 * ties to missing reference points, and directed cycles in the wiring. Every issue carries the exact
 * path, e.g. `runs.3.toItemId`.
 */
export const AsBuiltSchema = AsBuiltObjectSchema.superRefine(checkCrossReferences);
export type AsBuilt = z.infer<typeof AsBuiltSchema>;
export type AsBuiltInput = z.input<typeof AsBuiltSchema>;
