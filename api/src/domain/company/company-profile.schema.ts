import { z } from 'zod';

import { DepthRuleTableSchema } from '../depth/depth-rules.schema.js';

/** Largest logo upload accepted (bytes); it is stored as a PNG of at most {@link LOGO_MAX_SIDE_PX} px. */
export const LOGO_MAX_BYTES = 5 * 1024 * 1024;
/** Longest side of the stored logo (enough for a 2 in wide print at 300 dpi). */
export const LOGO_MAX_SIDE_PX = 600;

/**
 * An IANA time zone name that this runtime's `Intl` knows (e.g. `America/Denver`, `Europe/Berlin`,
 * `UTC`), as this runtime's `Intl` knows it. Offsets (`+02:00`) are refused: they do not follow daylight time.
 */
export function isIanaTimeZone(name: string): boolean {
  // Names only: Intl on newer runtimes also takes offsets such as "+02:00", which are no IANA names.
  if (!/^[A-Za-z][A-Za-z0-9_+-]*(\/[A-Za-z0-9_+-]+)*$/.test(name)) return false;
  try {
    new Intl.DateTimeFormat('en-US', { timeZone: name });
    return true;
  } catch {
    return false;
  }
}

/** The canonical spelling `Intl` uses for a valid time zone name (`america/denver` → `America/Denver`). */
export function canonicalTimeZone(name: string): string {
  return new Intl.DateTimeFormat('en-US', { timeZone: name }).resolvedOptions().timeZone;
}

/** A BCP 47 locale tag that `Intl` formats dates and numbers in (e.g. `en-US`, `en-CA`, `fr-CA`, `de-DE`). */
export function isSupportedLocale(tag: string): boolean {
  try {
    const [canonical] = Intl.getCanonicalLocales(tag);
    return canonical !== undefined && Intl.DateTimeFormat.supportedLocalesOf([canonical]).length === 1 && Intl.NumberFormat.supportedLocalesOf([canonical]).length === 1;
  } catch {
    return false;
  }
}

const TimeZoneSchema = z
  .string()
  .trim()
  .max(64)
  .refine(isIanaTimeZone, { error: 'must be an IANA time zone name such as America/Denver' })
  .transform(canonicalTimeZone);

const LocaleSchema = z
  .string()
  .trim()
  .max(35)
  .refine(isSupportedLocale, { error: 'must be a locale tag such as en-US or fr-CA' })
  .transform((tag) => Intl.getCanonicalLocales(tag)[0]!);

const PhoneSchema = z
  .string()
  .trim()
  .max(40)
  .regex(/^[0-9+()\-.\s]*[0-9][0-9+()\-.\s]*$/, { error: 'must contain digits, spaces and + ( ) - . only' });

const EmailSchema = z
  .string()
  .trim()
  .max(254)
  .pipe(z.email({ error: 'must be an e-mail address' }))
  .transform((email) => email.toLowerCase());

const WebsiteSchema = z
  .string()
  .trim()
  .max(200)
  .refine(
    (value) => {
      try {
        const url = new URL(value);
        return (url.protocol === 'https:' || url.protocol === 'http:') && url.hostname.includes('.') && url.username === '' && url.password === '';
      } catch {
        return false;
      }
    },
    { error: 'must be a web address starting with https:// or http://' },
  );

/** Blank text (empty or only spaces) is the same as no value: null. */
const blankToNull = <T extends z.ZodType<string, string>>(schema: T) =>
  z.union([z.string().trim().length(0).transform(() => null), z.null(), schema]);

/** `PATCH /api/company/profile` (admin): any of the profile's fields; `null` (or blank) clears an optional one. */
export const UpdateCompanyProfileSchema = z
  .object({
    /** The name the company trades under: packets, e-mails (sender name), the portal and the locate view. */
    tradeName: z.string().trim().min(1).max(120),
    phone: blankToNull(PhoneSchema),
    email: blankToNull(EmailSchema),
    website: blankToNull(WebsiteSchema),
    postalAddress: blankToNull(z.string().trim().max(500)),
    licenceNumbers: z.array(z.string().trim().min(1).max(120)).max(10),
    timeZone: z.union([z.null(), TimeZoneSchema]),
    locale: LocaleSchema,
  })
  .partial()
  .strict()
  .refine((value) => Object.keys(value).length > 0, { error: 'nothing to change' });
export type UpdateCompanyProfileInput = z.infer<typeof UpdateCompanyProfileSchema>;

export const CompanyProfileResponseSchema = z.object({
  tradeName: z.string(),
  phone: z.string().nullable(),
  email: z.string().nullable(),
  website: z.string().nullable(),
  postalAddress: z.string().nullable(),
  licenceNumbers: z.array(z.string()),
  timeZone: z.string().nullable(),
  locale: z.string(),
  /** The logo as the API serves it (a PNG), or null without a logo; the URL changes when the logo does. */
  logo: z.object({ url: z.string() }).nullable(),
  updatedAt: z.string(),
});
export type CompanyProfileResponse = z.infer<typeof CompanyProfileResponseSchema>;

/** `PUT /api/company/depth-rules` (admin): the whole table, replaced at once. */
export const UpdateDepthRulesSchema = DepthRuleTableSchema;
export type UpdateDepthRulesInput = z.infer<typeof UpdateDepthRulesSchema>;

/** `GET /api/company/depth-rules`: the table the findings cite, and the shipped defaults beside it. */
export const CompanyDepthRulesResponseSchema = z.object({
  table: DepthRuleTableSchema,
  /** True while the company follows the shipped defaults (never edited, or reset). */
  isDefault: z.boolean(),
  defaults: DepthRuleTableSchema,
});
export type CompanyDepthRulesResponse = z.infer<typeof CompanyDepthRulesResponseSchema>;

/** What the homeowner portal and the locate view show about the installer. */
export interface InstallerContact {
  companyName: string;
  phone: string | null;
  email: string | null;
  website: string | null;
  licenceNumbers: string[];
}

// A `tel:` link for a printed phone number (in a schema-free module: the public locate page uses it).
export { telHref } from './phone.js';
