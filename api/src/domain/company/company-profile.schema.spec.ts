import { describe, expect, it } from 'vitest';

import { isIanaTimeZone, isSupportedLocale, telHref, UpdateCompanyProfileSchema } from './company-profile.schema.js';

describe('company profile schema', () => {
  it('should accept IANA time zone names in their canonical spelling and refuse offsets and inventions', () => {
    // IANA tz database names (https://www.iana.org/time-zones), as Intl knows them.
    for (const zone of ['America/Denver', 'Europe/Berlin', 'Australia/Perth', 'UTC']) expect(isIanaTimeZone(zone), zone).toBe(true);
    for (const zone of ['Mars/Olympus_Mons', '+02:00', 'GMT+2 ', '', 'America/', '../etc/passwd']) expect(isIanaTimeZone(zone), zone).toBe(false);
    expect(UpdateCompanyProfileSchema.parse({ timeZone: 'america/denver' })).toEqual({ timeZone: 'America/Denver' });
    const refused = UpdateCompanyProfileSchema.safeParse({ timeZone: 'Mars/Olympus_Mons' });
    expect(refused.success).toBe(false);
    expect(refused.error?.issues[0]?.path).toEqual(['timeZone']);
  });

  it('should canonicalise locales and refuse malformed tags', () => {
    expect(isSupportedLocale('en-US')).toBe(true);
    expect(isSupportedLocale('fr-CA')).toBe(true);
    expect(isSupportedLocale('xx-invalid-tag-!!')).toBe(false);
    expect(UpdateCompanyProfileSchema.parse({ locale: 'en-ca' })).toEqual({ locale: 'en-CA' });
  });

  it('should read blank optional fields as null and refuse an empty patch', () => {
    expect(UpdateCompanyProfileSchema.parse({ phone: '', website: '  ', email: null })).toEqual({ phone: null, website: null, email: null });
    expect(UpdateCompanyProfileSchema.safeParse({}).success).toBe(false);
    expect(UpdateCompanyProfileSchema.safeParse({ website: 'javascript:alert(1)' }).success).toBe(false);
    expect(UpdateCompanyProfileSchema.safeParse({ phone: 'call me' }).success).toBe(false);
  });

  it('should make tel: links from printed numbers', () => {
    expect(telHref('(555) 010-0199')).toBe('tel:5550100199');
    expect(telHref('+1 555 010 0199')).toBe('tel:+15550100199');
  });
});
