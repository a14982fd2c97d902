import { z } from 'zod';

import { ChannelRefSchema } from '../as-built/common.schema.js';
import { BurialLocationSchema, InstallMethodSchema } from '../as-built/run.schema.js';
import { CircuitClassSchema, DepthRuleSchema } from '../depth/depth-rules.schema.js';
import { FINDING_CODES } from './finding.js';

/**
 * The response contract of an as-built's analysis (`analyzeAsBuilt`), as `POST /api/analysis` and the
 * job's as-built GET send it. SI units throughout; `null` where a value is open or unknown (JSON has no
 * Infinity). The computation's own interfaces (analyze.ts and the loads, depth and checks modules) are
 * what it returns; this schema is what a client may rely on, and the contract tests hold the two together.
 */
const GaugeResultSchema = z.discriminatedUnion('system', [
  z.object({ system: z.literal('awg'), awg: z.number() }),
  z.object({ system: z.literal('mm2'), mm2: z.number() }),
]);
const ItemKindSchema = z.enum(['amplifier', 'speaker', 'subwoofer', 'junction', 'spare_end', 'wall_entry']);
const QuantitySchema = z.object({ kind: z.enum(['length', 'depth', 'rule_depth']), m: z.number() });

export const FindingSchema = z.object({
  code: z.enum(FINDING_CODES),
  severity: z.enum(['info', 'warning', 'critical']),
  message: z.string(),
  parts: z.array(z.union([z.string(), QuantitySchema])).optional(),
  path: z.array(z.union([z.string(), z.number()])),
  itemId: z.string().optional(),
  runId: z.string().optional(),
  channel: ChannelRefSchema.optional(),
  data: z.record(z.string(), z.union([z.number(), z.string(), z.boolean(), z.null()])).optional(),
});

const RunResultSchema = z.object({
  runId: z.string(),
  label: z.string(),
  cableType: z.string(),
  gauge: GaugeResultSchema,
  gaugeLabel: z.string(),
  areaMm2: z.number(),
  conductorOhmPerM: z.number(),
  measuredLengthM: z.number(),
  pairLoopOhm: z.number(),
  channels: z.array(ChannelRefSchema),
  isSpare: z.boolean(),
  isAbandoned: z.boolean(),
  routeLengthM: z.number().nullable(),
  lengthCheck: z
    .object({ routeLengthM: z.number(), measuredLengthM: z.number(), differenceM: z.number(), allowedM: z.number(), isMismatch: z.boolean() })
    .nullable(),
  gaugeSuggestion: z
    .object({
      runId: z.string(),
      installedGauge: GaugeResultSchema,
      worstLossDbInstalled: z.number(),
      installedMeetsLimit: z.boolean(),
      suggestedGauge: GaugeResultSchema.nullable(),
    })
    .nullable(),
});

const CableTotalSchema = z.object({
  cableType: z.string(),
  runCount: z.number(),
  lengthM: z.number(),
  spareLengthM: z.number(),
  abandonedLengthM: z.number(),
});

const ChannelLoadResultSchema = z.object({
  channel: ChannelRefSchema,
  channelName: z.string(),
  mode: z.enum(['low_impedance', 'constant_voltage']),
  isSolved: z.boolean(),
  outputVoltageV: z.number(),
  outputBasis: z.enum(['rated_8_ohm', 'rated_4_ohm', 'cv_line']),
  loadOhmNominal: z.number().nullable(),
  loadOhmWithCable: z.number().nullable(),
  minimumImpedanceOhm: z.number(),
  amplifierOutputW: z.number(),
  cableDissipationW: z.number(),
  cableDissipationPct: z.number(),
  cv: z
    .object({
      totalTapWatts: z.number(),
      ratedWatts: z.number(),
      loadFraction: z.number(),
      // V²/ΣP is Infinity without taps, which JSON writes as null.
      lineOhm: z.number().nullable(),
      lineCurrentA: z.number(),
      status: z.enum(['ok', 'over_headroom', 'overload']),
      lineVoltageV: z.number(),
    })
    .optional(),
  nodes: z.array(
    z.object({
      itemId: z.string(),
      kind: ItemKindSchema,
      parentItemId: z.string().nullable(),
      runIds: z.array(z.string()),
      runLoopOhm: z.number(),
      branchCurrentA: z.number(),
      terminalVoltageV: z.number(),
      impedanceBeyondOhm: z.number().nullable(),
    }),
  ),
  loads: z.array(
    z.object({
      itemId: z.string(),
      label: z.string(),
      kind: ItemKindSchema,
      loadOhm: z.number(),
      runIds: z.array(z.string()),
      voltageV: z.number(),
      currentA: z.number(),
      powerW: z.number(),
      idealPowerW: z.number(),
      cableLossDb: z.number(),
      powerLossPct: z.number(),
      tapWatts: z.number().optional(),
    }),
  ),
});

const DepthStationResultSchema = z.object({ readingIndex: z.number(), stationM: z.number(), depthM: z.number(), marginM: z.number().nullable() });

const RunDepthResultSchema = z.object({
  runId: z.string(),
  method: InstallMethodSchema,
  location: BurialLocationSchema,
  circuit: CircuitClassSchema,
  circuitVoltageV: z.number().nullable(),
  rule: DepthRuleSchema.nullable(),
  status: z.enum(['ok', 'shallow', 'not_recorded', 'not_buried', 'no_rule']),
  readingCount: z.number(),
  minDepthM: z.number().nullable(),
  maxDepthM: z.number().nullable(),
  worstMarginM: z.number().nullable(),
  stations: z.array(DepthStationResultSchema),
  shallowStations: z.array(DepthStationResultSchema),
});

const PositionResultSchema = z.object({
  itemId: z.string(),
  x: z.number(),
  y: z.number(),
  source: z.enum(['ties', 'manual', 'gps']),
  accuracyM: z.number().nullable(),
  method: z.enum(['two_ties', 'least_squares']).optional(),
  residualRmsM: z.number().optional(),
});

const CheckResultSchema = z.object({
  checkId: z.string(),
  channel: ChannelRefSchema,
  quantity: z.enum(['dc_resistance', 'impedance']),
  measuredOhm: z.number(),
  expectedOhm: z.number().nullable(),
  expectedLowOhm: z.number().nullable(),
  expectedHighOhm: z.number().nullable(),
  status: z.enum(['ok', 'low', 'high', 'short', 'open', 'not_comparable']),
  explanation: z.string(),
});

const PositionSchema = z.array(z.number());
export const GeoJsonFeatureCollectionSchema = z.object({
  type: z.literal('FeatureCollection'),
  features: z.array(
    z.object({
      type: z.literal('Feature'),
      id: z.string(),
      geometry: z
        .discriminatedUnion('type', [
          z.object({ type: z.literal('Point'), coordinates: PositionSchema }),
          z.object({ type: z.literal('LineString'), coordinates: z.array(PositionSchema) }),
        ])
        .nullable(),
      properties: z.record(z.string(), z.union([z.string(), z.number(), z.boolean(), z.null(), z.array(z.string())])),
    }),
  ),
});

export const AsBuiltAnalysisSchema = z.object({
  assumptions: z.object({
    conductorTemperatureC: z.number(),
    lossLimitDb: z.number(),
    shortThresholdOhm: z.number(),
    cvMaxLoadFraction: z.number(),
    tapeToleranceM: z.number(),
    routeLengthTolerance: z.object({ absoluteM: z.number(), relative: z.number() }),
    depthRuleTable: z.string(),
    notes: z.array(z.string()),
  }),
  summary: z.object({
    critical: z.number(),
    warning: z.number(),
    info: z.number(),
    itemCount: z.number(),
    runCount: z.number(),
    totalCableM: z.number(),
  }),
  runs: z.array(RunResultSchema),
  cableTotals: z.array(CableTotalSchema),
  channels: z.array(ChannelLoadResultSchema),
  depth: z.array(RunDepthResultSchema),
  positions: z.array(PositionResultSchema),
  checks: z.array(CheckResultSchema),
  geojson: GeoJsonFeatureCollectionSchema.nullable(),
  findings: z.array(FindingSchema),
});
export type AsBuiltAnalysisResponse = z.infer<typeof AsBuiltAnalysisSchema>;
