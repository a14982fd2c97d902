import { z } from 'zod';

import { LabelSchema } from '../as-built/common.schema.js';
import { BurialLocationSchema, InstallMethodSchema } from '../as-built/run.schema.js';

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
});
export type DepthRule = z.infer<typeof DepthRuleSchema>;

/** A company's depth rule table (editable); at most one rule per method × location. */
export const DepthRuleTableSchema = z
  .object({
    name: LabelSchema,
    rules: z.array(DepthRuleSchema).max(200),
  })
  .superRefine((table, ctx) => {
    const seen = new Set<string>();
    table.rules.forEach((rule, i) => {
      const key = `${rule.method}/${rule.location}`;
      if (seen.has(key)) {
        ctx.addIssue({ code: 'custom', path: ['rules', i, 'location'], message: `a second rule for ${rule.method} in ${rule.location}` });
      }
      seen.add(key);
    });
  });
export type DepthRuleTable = z.infer<typeof DepthRuleTableSchema>;
