import { describe, expect, it } from 'vitest';

import { effectiveUnits, UpdateCompanySettingsSchema, UpdateMyPreferencesSchema } from './settings.schema.js';

// No computation from a published source here: these are the app's own rules for whose choice wins.
describe('effectiveUnits', () => {
  const company = { lengthUnits: 'imperial', gaugeUnits: 'awg' } as const;

  it.each([
    [{ lengthUnits: null, gaugeUnits: null }, { length: 'imperial', gauge: 'awg' }],
    [{ lengthUnits: 'metric', gaugeUnits: null }, { length: 'metric', gauge: 'awg' }],
    [{ lengthUnits: null, gaugeUnits: 'mm2' }, { length: 'imperial', gauge: 'mm2' }],
    [{ lengthUnits: 'metric', gaugeUnits: 'mm2' }, { length: 'metric', gauge: 'mm2' }],
  ] as const)('should take %j over the company default, each unit on its own', (own, expected) => {
    expect(effectiveUnits(own, company)).toEqual(expected);
  });
});

describe('UpdateMyPreferencesSchema', () => {
  it('should accept null (follow the company) and a choice, and refuse unknown units and fields', () => {
    expect(UpdateMyPreferencesSchema.parse({ lengthUnits: null })).toEqual({ lengthUnits: null });
    expect(UpdateMyPreferencesSchema.parse({ gaugeUnits: 'mm2' })).toEqual({ gaugeUnits: 'mm2' });
    const unknown = UpdateMyPreferencesSchema.safeParse({ lengthUnits: 'cubits' });
    expect(unknown.success ? [] : unknown.error.issues.map((i) => i.path.join('.'))).toEqual(['lengthUnits']);
    expect(UpdateMyPreferencesSchema.safeParse({}).success).toBe(false);
    expect(UpdateMyPreferencesSchema.safeParse({ paperSize: 'a4' }).success).toBe(false);
  });
});

describe('UpdateCompanySettingsSchema', () => {
  it('should refuse null for a company default, which always has a value', () => {
    const res = UpdateCompanySettingsSchema.safeParse({ gaugeUnits: null });
    expect(res.success ? [] : res.error.issues.map((i) => i.path.join('.'))).toEqual(['gaugeUnits']);
    expect(UpdateCompanySettingsSchema.parse({ paperSize: 'a4', lengthUnits: 'metric' })).toEqual({ paperSize: 'a4', lengthUnits: 'metric' });
  });
});
