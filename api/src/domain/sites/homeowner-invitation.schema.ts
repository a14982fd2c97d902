import { z } from 'zod';

import { EmailSchema } from '../auth/auth.schema.js';

/**
 * `POST /api/sites/:siteId/homeowner-invitations`: invites a homeowner to the portal by e-mail; the
 * site is linked to their account when they accept (the same invitation the packet delivery sends).
 */
export const InviteHomeownerSchema = z.object({
  email: EmailSchema,
  name: z.string().trim().min(1, { error: 'is required' }).max(120).optional(),
});
export type InviteHomeownerInput = z.infer<typeof InviteHomeownerSchema>;
