import type { CompanySettingsResponse, MyPreferencesResponse } from '@domain/settings/settings.schema';

/** An imperial company (feet and inches, AWG, Letter) in Denver, as the settings page reads it. */
export const IMPERIAL_SETTINGS: CompanySettingsResponse = { lengthUnits: 'imperial', gaugeUnits: 'awg', paperSize: 'letter', updatedAt: '2026-04-01T09:00:00.000Z' };

/** The signed-in person's preferences in that company: no own choice, the company's units. */
export const IMPERIAL_PREFERENCES: MyPreferencesResponse = {
  lengthUnits: null,
  gaugeUnits: null,
  company: { lengthUnits: 'imperial', gaugeUnits: 'awg', timeZone: 'America/Denver', locale: 'en-US' },
  effective: { length: 'imperial', gauge: 'awg' },
};
