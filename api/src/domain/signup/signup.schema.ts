import { z } from 'zod';

import { EmailSchema, NewPasswordSchema } from '../auth/auth.schema.js';

/** Who may create a company: anyone, holders of an operator's one-time code, or nobody (operators only). */
export const SIGNUP_MODES = ['open', 'invite', 'closed'] as const;
export const SignupModeSchema = z.enum(SIGNUP_MODES);
export type SignupMode = z.infer<typeof SignupModeSchema>;

const CompanyNameSchema = z.string().trim().min(1, { error: 'is required' }).max(120, { error: 'must be at most 120 characters' });
const PersonNameSchema = z.string().trim().min(1, { error: 'is required' }).max(120, { error: 'must be at most 120 characters' });
/** Codes printed by `npm run company:invite`: letters, digits and dashes. */
export const InviteCodeSchema = z
  .string()
  .trim()
  .min(8, { error: 'is not a valid invitation code' })
  .max(64, { error: 'is not a valid invitation code' })
  .regex(/^[A-Za-z0-9-]+$/, { error: 'is not a valid invitation code' });

export const CreateSignupSchema = z.object({
  companyName: CompanyNameSchema,
  name: PersonNameSchema,
  email: EmailSchema,
  password: NewPasswordSchema,
  /** Required when sign-up is by invitation (SIGNUP_MODE=invite); ignored otherwise. */
  inviteCode: InviteCodeSchema.optional(),
});
export type CreateSignupInput = z.infer<typeof CreateSignupSchema>;

export const VerifySignupSchema = z.object({ token: z.string().min(20).max(200) });
export type VerifySignupInput = z.infer<typeof VerifySignupSchema>;

/** The answer to every accepted sign-up request, whether or not the address already has an account. */
export const SignupAcceptedResponseSchema = z.object({
  message: z.string(),
  /**
   * Opaque; with mail captured locally, `GET /api/signup/mail/:receipt` shows the message sent for
   * this request (nobody is signed in yet to read the Outbox).
   */
  receipt: z.string(),
});
export type SignupAcceptedResponse = z.infer<typeof SignupAcceptedResponseSchema>;

export const SignupStatusResponseSchema = z.object({
  mode: SignupModeSchema,
  /** Whether any company exists yet (a fresh installation points to sign-up). */
  hasCompanies: z.boolean(),
  /** Mail is captured by the built-in server (no SMTP_URL), so sign-up mail is shown in the app. */
  mailCaptured: z.boolean(),
  /** Whom to ask for an account while sign-up is closed or by invitation (SIGNUP_CONTACT), if set. */
  contact: z.string().nullable(),
});
export type SignupStatusResponse = z.infer<typeof SignupStatusResponseSchema>;

/** The locally captured message for a sign-up request, once it has gone. */
export const SignupMailResponseSchema = z.object({
  status: z.enum(['queued', 'sent', 'failed']),
  message: z
    .object({
      to: z.array(z.string()),
      subject: z.string(),
      receivedAt: z.string(),
      text: z.string().nullable(),
      html: z.string().nullable(),
    })
    .nullable(),
});
export type SignupMailResponse = z.infer<typeof SignupMailResponseSchema>;

/** Where mail goes, for admins and office staff (the Outbox page). */
export const MailStatusResponseSchema = z.object({
  /** True when the built-in server captures mail (no SMTP_URL): the Outbox has it. */
  captured: z.boolean(),
  /** smtp://host:port of the mail service (no credentials) when mail is not captured. */
  destination: z.string().nullable(),
});
export type MailStatusResponse = z.infer<typeof MailStatusResponseSchema>;
