import { z } from 'zod';

import { ChannelRefSchema, FiniteSchema, IdSchema, OptionalTextSchema } from '../as-built/common.schema.js';

/**
 * A commissioning check taken at the amplifier end of one channel with the amp disconnected.
 * `quantity`: 'dc_resistance' (multimeter, ohms) or 'impedance' (impedance meter, usually at 1 kHz).
 * A reading of 0 is allowed: it records a dead short.
 */
export const CommissioningCheckSchema = z.object({
  id: IdSchema,
  channel: ChannelRefSchema,
  quantity: z.enum(['dc_resistance', 'impedance']),
  measuredOhm: FiniteSchema.nonnegative().max(1_000_000),
  frequencyHz: FiniteSchema.positive().max(100_000).optional(),
  isPolarityOk: z.boolean().optional(),
  isInsulationOk: z.boolean().optional(),
  notes: OptionalTextSchema,
});
export type CommissioningCheck = z.infer<typeof CommissioningCheckSchema>;
