import { z } from 'zod';

/** Lengths in the app: feet and inches, or metres and centimetres. Values are stored in metres either way. */
export const LENGTH_UNITS = ['imperial', 'metric'] as const;
export type LengthUnits = (typeof LENGTH_UNITS)[number];

/** Conductor sizes in the app: AWG numbers or mm² cross-sections. */
export const GAUGE_UNITS = ['awg', 'mm2'] as const;
export type GaugeUnits = (typeof GAUGE_UNITS)[number];

/** The paper the company's packets are printed on. */
export const PAPER_SIZES = ['letter', 'a4'] as const;
export type PaperSize = (typeof PAPER_SIZES)[number];

/** The units someone works in: theirs if they chose, else the company's. */
export interface EffectiveUnits {
  length: LengthUnits;
  gauge: GaugeUnits;
}

const nonEmpty = (value: object) => Object.keys(value).length > 0;

/** `PATCH /api/company/settings` (admin): any of the company's defaults. */
export const UpdateCompanySettingsSchema = z
  .object({ lengthUnits: z.enum(LENGTH_UNITS), gaugeUnits: z.enum(GAUGE_UNITS), paperSize: z.enum(PAPER_SIZES) })
  .partial()
  .strict()
  .refine(nonEmpty, { error: 'nothing to change' });
export type UpdateCompanySettingsInput = z.infer<typeof UpdateCompanySettingsSchema>;

export const CompanySettingsResponseSchema = z.object({
  lengthUnits: z.enum(LENGTH_UNITS),
  gaugeUnits: z.enum(GAUGE_UNITS),
  paperSize: z.enum(PAPER_SIZES),
  updatedAt: z.string(),
});
export type CompanySettingsResponse = z.infer<typeof CompanySettingsResponseSchema>;

/** `PATCH /api/me/preferences`: the caller's own choice; `null` follows the company's default again. */
export const UpdateMyPreferencesSchema = z
  .object({ lengthUnits: z.enum(LENGTH_UNITS).nullable(), gaugeUnits: z.enum(GAUGE_UNITS).nullable() })
  .partial()
  .strict()
  .refine(nonEmpty, { error: 'nothing to change' });
export type UpdateMyPreferencesInput = z.infer<typeof UpdateMyPreferencesSchema>;

/** `GET /api/me/preferences` (the web app checks the answer against this). */
export const MyPreferencesResponseSchema = z.object({
  /** The caller's own choice; `null` = the company's default. */
  lengthUnits: z.enum(LENGTH_UNITS).nullable(),
  gaugeUnits: z.enum(GAUGE_UNITS).nullable(),
  /**
   * The company's defaults, and its time zone (IANA; null until the admin chooses one) and locale (BCP 47),
   * in which every screen writes dates and times (issue 16).
   */
  company: z.object({ lengthUnits: z.enum(LENGTH_UNITS), gaugeUnits: z.enum(GAUGE_UNITS), timeZone: z.string().nullable(), locale: z.string() }),
  /** What the app shows: the caller's choice, else the company's. */
  effective: z.object({ length: z.enum(LENGTH_UNITS), gauge: z.enum(GAUGE_UNITS) }),
});
export type MyPreferencesResponse = z.infer<typeof MyPreferencesResponseSchema>;

/**
 * The units someone works in: each of their own choices where they made one, the company's default
 * where they did not (`null`).
 */
export function effectiveUnits(
  own: { lengthUnits: LengthUnits | null; gaugeUnits: GaugeUnits | null },
  company: { lengthUnits: LengthUnits; gaugeUnits: GaugeUnits },
): EffectiveUnits {
  return { length: own.lengthUnits ?? company.lengthUnits, gauge: own.gaugeUnits ?? company.gaugeUnits };
}
