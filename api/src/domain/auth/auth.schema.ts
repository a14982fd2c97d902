import { z } from 'zod';

import { CursorPageQuerySchema, cursorPageSchemaOf } from '../paging/page.schema.js';
import { ROLES } from './roles.js';

export const RoleSchema = z.enum(ROLES);

/** Lower-cased and trimmed so that sign-in and uniqueness ignore case. */
export const EmailSchema = z
  .string()
  .trim()
  .max(254)
  .pipe(z.email({ error: 'must be an e-mail address' }))
  .transform((email) => email.toLowerCase());

/** A passphrase of at least 10 characters (NIST SP 800-63B §5.1.1.2 asks for ≥ 8 and allows long ones). */
export const NewPasswordSchema = z
  .string()
  .min(10, { error: 'must be at least 10 characters' })
  .max(200, { error: 'must be at most 200 characters' });

const TokenSchema = z.string().min(20).max(200);
const PersonNameSchema = z.string().trim().min(1, { error: 'is required' }).max(120);

export const SignInSchema = z.object({ email: EmailSchema, password: z.string().min(1).max(200) });
export type SignInInput = z.infer<typeof SignInSchema>;

export const AcceptInvitationSchema = z.object({ token: TokenSchema, name: PersonNameSchema, password: NewPasswordSchema });
export type AcceptInvitationInput = z.infer<typeof AcceptInvitationSchema>;

export const RequestPasswordResetSchema = z.object({ email: EmailSchema });
export type RequestPasswordResetInput = z.infer<typeof RequestPasswordResetSchema>;

export const ResetPasswordSchema = z.object({ token: TokenSchema, password: NewPasswordSchema });
export type ResetPasswordInput = z.infer<typeof ResetPasswordSchema>;

export const CreateInvitationSchema = z.object({
  email: EmailSchema,
  role: RoleSchema,
  name: PersonNameSchema.optional(),
});
export type CreateInvitationInput = z.infer<typeof CreateInvitationSchema>;

export const UpdateUserSchema = z
  .object({ role: RoleSchema.optional(), isDisabled: z.boolean().optional(), name: PersonNameSchema.optional() })
  .strict()
  .refine((v) => Object.keys(v).length > 0, { error: 'nothing to change' });
export type UpdateUserInput = z.infer<typeof UpdateUserSchema>;

export const MeResponseSchema = z.object({
  id: z.uuid(),
  email: z.string(),
  name: z.string(),
  role: RoleSchema,
  companyId: z.uuid(),
  companyName: z.string(),
});
export type MeResponse = z.infer<typeof MeResponseSchema>;

export const SessionResponseSchema = z.object({
  accessToken: z.string(),
  expiresInSeconds: z.number().int(),
  user: MeResponseSchema,
});
export type SessionResponse = z.infer<typeof SessionResponseSchema>;

export const UserResponseSchema = z.object({
  id: z.uuid(),
  email: z.string(),
  name: z.string(),
  role: RoleSchema,
  isDisabled: z.boolean(),
  lastSignInAt: z.string().nullable(),
  createdAt: z.string(),
});
export type UserResponse = z.infer<typeof UserResponseSchema>;

/** `GET /api/users`: the company's people by name, a page at a time (`page` or `cursor`, `pageSize`). */
export const UserListQuerySchema = CursorPageQuerySchema;
export type UserListQuery = z.infer<typeof UserListQuerySchema>;
export const UserListResponseSchema = cursorPageSchemaOf(UserResponseSchema);
export type UserListResponse = z.infer<typeof UserListResponseSchema>;

/** Where the invitation's newest e-mail is: waiting in the send queue, sent, or given up after retries. */
export const InvitationMailSchema = z.object({
  status: z.enum(['queued', 'sending', 'sent', 'failed', 'cancelled']),
  attempts: z.number().int(),
  lastError: z.string().nullable(),
  sentAt: z.string().nullable(),
});
export type InvitationMail = z.infer<typeof InvitationMailSchema>;

export const InvitationResponseSchema = z.object({
  id: z.uuid(),
  email: z.string(),
  name: z.string().nullable(),
  role: RoleSchema,
  expiresAt: z.string(),
  createdAt: z.string(),
  // The API always sends it; optional so callers that only create invitations need not mock it.
  mail: InvitationMailSchema.nullable().optional(),
});
export type InvitationResponse = z.infer<typeof InvitationResponseSchema>;

/** What the accept-invitation page shows before the invitee sets a password. */
export const InvitationPreviewResponseSchema = z.object({
  email: z.string(),
  name: z.string().nullable(),
  role: RoleSchema,
  companyName: z.string(),
});
export type InvitationPreviewResponse = z.infer<typeof InvitationPreviewResponseSchema>;

/** `POST /api/auth/password-reset` (202): the same words whether or not the address has an account. */
export const PasswordResetAcceptedResponseSchema = z.object({ message: z.string() });
export type PasswordResetAcceptedResponse = z.infer<typeof PasswordResetAcceptedResponseSchema>;
