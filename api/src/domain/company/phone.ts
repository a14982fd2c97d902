/**
 * Phone helpers without a schema: the public locate page links the installer's number and loads no zod
 * (issue 17). Re-exported by company-profile.schema.ts, where the rest of the app finds them.
 */

/** A `tel:` link for a printed phone number: digits and a leading + only. */
export function telHref(phone: string): string {
  const digits = phone.replace(/[^\d+]/g, '');
  return `tel:${digits.startsWith('+') ? `+${digits.slice(1).replace(/\+/g, '')}` : digits.replace(/\+/g, '')}`;
}
