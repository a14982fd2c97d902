import { z } from 'zod';

import { LabelSchema } from '../as-built/common.schema.js';
import { BurialLocationSchema, InstallMethodSchema } from '../as-built/run.schema.js';

/**
 * The circuit a run carries, for the depth rules: NEC Table 300.5 column 5 covers only circuits limited
 * to 30 V. A low-impedance speaker output of up to 30 V (√(P·Z) of its rating) or a 25 V constant-voltage
 * line is `up_to_30v`; a 70 V or 100 V constant-voltage line, or a low-impedance output above 30 V, is
 * `over_30v`. A run with no channel on its pairs (a spare) is checked as `up_to_30v`.
 */
export const CircuitClassSchema = z.enum(['up_to_30v', 'over_30v']);
export type CircuitClass = z.infer<typeof CircuitClassSchema>;

/**
 * One rule: minimum cover (top of cable or raceway to finished grade, metres) for an installation
 * method in a location. `minCoverM: null` means "not buried, no depth check" (indoor runs).
 * `basis` says where the number comes from: a code table, common practice, or the company's own choice.
 */
export const DepthRuleSchema = z.object({
  method: InstallMethodSchema,
  location: BurialLocationSchema,
  minCoverM: z.number().finite().nonnegative().max(3).nullable(),
  basis: z.enum(['code', 'common_practice', 'company']),
  source: z.string().trim().min(1).max(500),
  /** The circuit class the rule is for; absent = every circuit (a company's own table may not say). */
  circuit: CircuitClassSchema.optional(),
});
export type DepthRule = z.infer<typeof DepthRuleSchema>;

/** A company's depth rule table (editable); at most one rule per method × location × circuit class. */
export const DepthRuleTableSchema = z
  .object({
    name: LabelSchema,
    rules: z.array(DepthRuleSchema).max(200),
  })
  .superRefine((table, ctx) => {
    const seen = new Set<string>();
    table.rules.forEach((rule, i) => {
      const key = `${rule.method}/${rule.location}/${rule.circuit ?? 'any'}`;
      if (seen.has(key)) {
        ctx.addIssue({
          code: 'custom',
          path: ['rules', i, 'location'],
          message: `a second rule for ${rule.method} in ${rule.location}${rule.circuit === undefined ? '' : ` (${rule.circuit})`}`,
        });
      }
      seen.add(key);
    });
  });
export type DepthRuleTable = z.infer<typeof DepthRuleTableSchema>;
