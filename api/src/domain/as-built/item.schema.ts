import { z } from 'zod';

import {
  AS_BUILT_LIMITS,
  CvLineVoltageSchema,
  FiniteSchema,
  IdSchema,
  ImpedanceOhmSchema,
  IsoDateSchema,
  LabelSchema,
  OptionalShortTextSchema,
  OptionalTextSchema,
  PlanCoordinateSchema,
  PositiveLengthMSchema,
  WattsSchema,
} from './common.schema.js';

/** A fixed point on the site (house corner, gate post, meter base) that ties are taped from. */
export const ReferencePointSchema = z.object({
  id: IdSchema,
  label: LabelSchema,
  x: PlanCoordinateSchema,
  y: PlanCoordinateSchema,
});
export type ReferencePoint = z.infer<typeof ReferencePointSchema>;

/** A taped distance (metres, horizontal) from a reference point to the item. */
export const TieSchema = z.object({ referencePointId: IdSchema, distanceM: PositiveLengthMSchema });
export type Tie = z.infer<typeof TieSchema>;

/**
 * A known plan position. `source`: 'ties' (solved from ties and stored), 'manual' (placed on the plan),
 * 'gps' (a phone fix already converted to plan metres). `accuracyM` is the estimated horizontal error.
 */
export const PositionSchema = z.object({
  x: PlanCoordinateSchema,
  y: PlanCoordinateSchema,
  source: z.enum(['ties', 'manual', 'gps']),
  accuracyM: FiniteSchema.nonnegative().max(10_000).optional(),
});
export type Position = z.infer<typeof PositionSchema>;

/**
 * How the onward runs leaving a speaker or subwoofer are wired relative to its own load:
 * - 'parallel' (default, "loop-through"): the onward runs are connected to the same terminals, so the
 *   item and everything beyond it are in parallel;
 * - 'series': the item's negative terminal feeds the onward run(s); the return conductor is spliced
 *   through to the incoming run. The item is then in series with everything beyond it — this is how a
 *   series string amp → A → B is recorded: A has onwardWiring 'series', B (the last one) is left at the
 *   default. An item marked 'series' with no onward run closes the string itself.
 */
export const OnwardWiringSchema = z.enum(['parallel', 'series']);
export type OnwardWiring = z.infer<typeof OnwardWiringSchema>;

const itemBase = {
  id: IdSchema,
  label: LabelSchema,
  model: OptionalShortTextSchema,
  serial: OptionalShortTextSchema,
  zoneId: IdSchema.optional(),
  installDate: IsoDateSchema.optional(),
  warrantyEnd: IsoDateSchema.optional(),
  position: PositionSchema.optional(),
  ties: z.array(TieSchema).max(AS_BUILT_LIMITS.maxTiesPerItem).optional(),
  /**
   * Which side of the directed line from the first tie's reference point to the second tie's reference
   * point the item lies on (looking from the first towards the second). Chooses between the two
   * mirror solutions of a two-tie fix.
   */
  sideHint: z.enum(['left', 'right']).optional(),
  notes: OptionalTextSchema,
};

/** An amplifier output channel. With `constantVoltage` the channel drives a 25/70/100 V line. */
export const AmplifierChannelSchema = z.object({
  id: IdSchema,
  name: LabelSchema,
  constantVoltage: z.object({ lineVoltage: CvLineVoltageSchema, ratedWatts: WattsSchema }).optional(),
});
export type AmplifierChannel = z.infer<typeof AmplifierChannelSchema>;

export const AmplifierItemSchema = z.object({
  ...itemBase,
  kind: z.literal('amplifier'),
  channels: z.array(AmplifierChannelSchema).min(1).max(AS_BUILT_LIMITS.maxChannelsPerAmplifier),
  /** Rated continuous power per channel into 8 Ω, watts. */
  ratedWatts8Ohm: WattsSchema,
  /** Rated continuous power per channel into 4 Ω, watts (omit if the amp is not rated at 4 Ω). */
  ratedWatts4Ohm: WattsSchema.optional(),
  /** Lowest load the maker states the amp is stable into, ohms. */
  minimumImpedanceOhm: ImpedanceOhmSchema,
});
export type AmplifierItem = z.infer<typeof AmplifierItemSchema>;

/** A speaker is either low-impedance (`nominalImpedanceOhm`) or constant-voltage (`constantVoltage` tap). */
export const SpeakerItemSchema = z
  .object({
    ...itemBase,
    kind: z.literal('speaker'),
    nominalImpedanceOhm: ImpedanceOhmSchema.optional(),
    constantVoltage: z.object({ lineVoltage: CvLineVoltageSchema, tapWatts: WattsSchema }).optional(),
    /** Measured or published DC resistance of the voice coil, ohms (used by commissioning checks). */
    dcResistanceOhm: ImpedanceOhmSchema.optional(),
    onwardWiring: OnwardWiringSchema.optional(),
  })
  .superRefine((s, ctx) => {
    const hasLowZ = s.nominalImpedanceOhm !== undefined;
    const hasCv = s.constantVoltage !== undefined;
    if (hasLowZ === hasCv) {
      ctx.addIssue({
        code: 'custom',
        path: ['nominalImpedanceOhm'],
        message: 'give either nominalImpedanceOhm or constantVoltage (tap watts), exactly one',
      });
    }
  });
export type SpeakerItem = z.infer<typeof SpeakerItemSchema>;

export const SubwooferItemSchema = z
  .object({
    ...itemBase,
    kind: z.literal('subwoofer'),
    voiceCoils: z.enum(['single', 'dual']),
    /** Nominal impedance of one voice coil, ohms. */
    coilImpedanceOhm: ImpedanceOhmSchema,
    /**
     * Dual voice coil only: 'series' (Z = 2·Zcoil), 'parallel' (Z = Zcoil/2), or 'separate_channels'
     * (each coil on its own channel; each channel sees one coil).
     */
    coilWiring: z.enum(['series', 'parallel', 'separate_channels']).optional(),
    dcResistanceOhmPerCoil: ImpedanceOhmSchema.optional(),
    onwardWiring: OnwardWiringSchema.optional(),
  })
  .superRefine((s, ctx) => {
    if (s.voiceCoils === 'dual' && s.coilWiring === undefined) {
      ctx.addIssue({
        code: 'custom',
        path: ['coilWiring'],
        message: 'a dual voice coil subwoofer needs coilWiring: series, parallel or separate_channels',
      });
    }
    if (s.voiceCoils === 'single' && s.coilWiring !== undefined) {
      ctx.addIssue({ code: 'custom', path: ['coilWiring'], message: 'coilWiring applies to dual voice coils only' });
    }
  });
export type SubwooferItem = z.infer<typeof SubwooferItemSchema>;

/** A splice or junction box where a trunk branches. */
export const JunctionItemSchema = z.object({
  ...itemBase,
  kind: z.literal('junction'),
  spliceType: OptionalShortTextSchema,
  isAccessible: z.boolean().optional(),
});
export type JunctionItem = z.infer<typeof JunctionItemSchema>;

/** The end of a spare run or spare pair, usually capped and buried or coiled in a box. */
export const SpareEndItemSchema = z.object({
  ...itemBase,
  kind: z.literal('spare_end'),
  isCapped: z.boolean(),
  marker: OptionalShortTextSchema,
});
export type SpareEndItem = z.infer<typeof SpareEndItemSchema>;

/** A penetration through a wall or foundation; runs pass through it (it carries no load). */
export const WallEntryItemSchema = z.object({
  ...itemBase,
  kind: z.literal('wall_entry'),
  wallMaterial: OptionalShortTextSchema,
  holeDiameterM: PositiveLengthMSchema.max(1).optional(),
  sleeve: OptionalShortTextSchema,
  sealant: OptionalShortTextSchema,
  insideLocation: OptionalShortTextSchema,
  outsideLocation: OptionalShortTextSchema,
});
export type WallEntryItem = z.infer<typeof WallEntryItemSchema>;

export const ItemSchema = z.discriminatedUnion('kind', [
  AmplifierItemSchema,
  SpeakerItemSchema,
  SubwooferItemSchema,
  JunctionItemSchema,
  SpareEndItemSchema,
  WallEntryItemSchema,
]);
export type Item = z.infer<typeof ItemSchema>;
export type ItemKind = Item['kind'];
