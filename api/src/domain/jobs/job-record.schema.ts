import { z } from 'zod';

import { CommissioningCheckSchema } from '../checks/commissioning-check.schema.js';
import { LabelSchema, OptionalShortTextSchema, OptionalTextSchema } from '../as-built/common.schema.js';
import { ZoneSchema } from '../as-built/as-built.schema.js';
import { ItemSchema } from '../as-built/item.schema.js';
import { DepthReadingSchema, RunSchema } from '../as-built/run.schema.js';

/*
 * Request bodies for the parts of a job's as-built. Items, runs and checks reuse the as-built schemas
 * unchanged, so a form validates exactly what the analysis accepts. Their `id` is assigned by the server
 * (a uuid), so a body needs none: a placeholder is filled in before validation and replaced afterwards.
 * References inside a body (zoneId, ties' referencePointId, fromItemId/toItemId, channels) are the
 * uuids returned by earlier calls; the service checks them against the job.
 */

/** Placeholder id of the record being created; never stored. */
export const NEW_RECORD_ID = 'new';

function isRecord(value: unknown): value is Record<string, unknown> {
  return typeof value === 'object' && value !== null && !Array.isArray(value);
}

function withPlaceholderId(value: unknown): unknown {
  return isRecord(value) ? { ...value, id: NEW_RECORD_ID } : value;
}

/**
 * Amplifier channels keep their id across updates (runs and checks point at them): a channel sent with
 * an `id` is the existing channel, one without is new and gets a placeholder `new:<index>`.
 */
function withItemPlaceholders(value: unknown): unknown {
  if (!isRecord(value)) return value;
  const channels = Array.isArray(value.channels)
    ? value.channels.map((channel, i) =>
        isRecord(channel) && (channel.id === undefined || channel.id === null) ? { ...channel, id: `${NEW_RECORD_ID}:${i}` } : channel,
      )
    : value.channels;
  return { ...value, id: NEW_RECORD_ID, ...(channels === undefined ? {} : { channels }) };
}

export const ZoneInputSchema = z.object({ name: LabelSchema });
export type ZoneInput = z.infer<typeof ZoneInputSchema>;

/** An item as in the as-built (any kind), without its id. */
export const ItemInputSchema = z.preprocess(withItemPlaceholders, ItemSchema);
export type ItemInput = z.infer<typeof ItemInputSchema>;

/** A run as in the as-built, without its id. On update, `depthReadings` replaces the readings if present. */
export const RunInputSchema = z.preprocess(withPlaceholderId, RunSchema);
export type RunInput = z.infer<typeof RunInputSchema>;

export const DepthReadingInputSchema = DepthReadingSchema;
export type DepthReadingInput = z.infer<typeof DepthReadingInputSchema>;

export const UpdateDepthReadingSchema = DepthReadingSchema.partial().refine((v) => Object.keys(v).length > 0, {
  error: 'nothing to change',
});
export type UpdateDepthReadingInput = z.infer<typeof UpdateDepthReadingSchema>;

/** A commissioning check as in the as-built, without its id. */
export const CheckInputSchema = z.preprocess(withPlaceholderId, CommissioningCheckSchema);
export type CheckInput = z.infer<typeof CheckInputSchema>;

/**
 * How the crew left one amplifier channel. Free text in the maker's own terms (e.g. gain "−6 dB",
 * crossover "HPF 80 Hz 24 dB/oct"). Never put a Wi-Fi or account password here: only the network name.
 */
export const ChannelSetupSchema = z.object({
  source: OptionalShortTextSchema.nullable(),
  gain: OptionalShortTextSchema.nullable(),
  volumeLimit: OptionalShortTextSchema.nullable(),
  eq: OptionalShortTextSchema.nullable(),
  crossover: OptionalShortTextSchema.nullable(),
  polarity: z.enum(['normal', 'inverted']).nullable().optional(),
  firmware: OptionalShortTextSchema.nullable(),
  networkName: OptionalShortTextSchema.nullable(),
  notes: OptionalTextSchema.nullable(),
});
export type ChannelSetup = z.infer<typeof ChannelSetupSchema>;

/** What each write to a job's records answers: the record as stored (ids are database uuids) and the job's new version. */
const withJobVersion = <T extends z.ZodRawShape>(shape: T) => z.object({ ...shape, jobVersion: z.number().int() });
export const ZoneWriteResponseSchema = withJobVersion({ zone: ZoneSchema });
export const ItemWriteResponseSchema = withJobVersion({ item: ItemSchema });
export const RunWriteResponseSchema = withJobVersion({ run: RunSchema });
export const ChannelSetupWriteResponseSchema = withJobVersion({ channelSetup: ChannelSetupSchema });
export const DepthReadingWriteResponseSchema = withJobVersion({ depthReading: DepthReadingSchema.extend({ id: z.string() }) });
export const CheckWriteResponseSchema = withJobVersion({ check: CommissioningCheckSchema });
export type ZoneWriteResponse = z.infer<typeof ZoneWriteResponseSchema>;
export type ItemWriteResponse = z.infer<typeof ItemWriteResponseSchema>;
export type RunWriteResponse = z.infer<typeof RunWriteResponseSchema>;
export type ChannelSetupWriteResponse = z.infer<typeof ChannelSetupWriteResponseSchema>;
export type DepthReadingWriteResponse = z.infer<typeof DepthReadingWriteResponseSchema>;
export type CheckWriteResponse = z.infer<typeof CheckWriteResponseSchema>;
