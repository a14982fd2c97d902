import type { NestExpressApplication } from '@nestjs/platform-express';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { createCompany, type TestCompany, withDb } from '../support/fixtures.js';
import { type Api, apiAs } from '../support/records.js';
import { signIn } from '../support/session.js';
import { createTestApp } from '../support/test-app.js';

describe('company settings and personal preferences', () => {
  let app: NestExpressApplication;
  let a: TestCompany;
  const as: Record<'admin' | 'office' | 'lead' | 'tech' | 'homeowner' | 'otherAdmin', Api> = {} as never;

  const settingsRow = (companyId: string) =>
    withDb(async (db) => (await db.query('select units, gauge_units, paper_size from company_settings where company_id = $1', [companyId])).rows[0]);

  beforeAll(async () => {
    app = await createTestApp();
    a = await createCompany('Settings A');
    const b = await createCompany('Settings B');
    for (const role of ['admin', 'office', 'lead', 'tech', 'homeowner'] as const) as[role] = apiAs(app, await signIn(app, a.users[role]));
    as.otherAdmin = apiAs(app, await signIn(app, b.users.admin));
  });

  afterAll(async () => {
    await app.close();
  });

  describe('company settings', () => {
    it('should start from the defaults (feet and inches, AWG, letter) and let only the admin change them', async () => {
      expect(await as.tech.expectOk('get', '/api/company/settings')).toMatchObject({ lengthUnits: 'imperial', gaugeUnits: 'awg', paperSize: 'letter' });
      for (const role of ['office', 'lead', 'tech', 'homeowner'] as const) {
        expect((await as[role].send('patch', '/api/company/settings', { lengthUnits: 'metric' })).status).toBe(403);
      }
      const changed = await as.admin.expectOk('patch', '/api/company/settings', { lengthUnits: 'metric', gaugeUnits: 'mm2', paperSize: 'a4' });
      expect(changed).toMatchObject({ lengthUnits: 'metric', gaugeUnits: 'mm2', paperSize: 'a4' });
      expect(await settingsRow(a.id)).toEqual({ units: 'metric', gauge_units: 'mm2', paper_size: 'a4' });
      expect(await as.office.expectOk('get', '/api/company/settings')).toMatchObject({ lengthUnits: 'metric', gaugeUnits: 'mm2', paperSize: 'a4' });
      // Another company keeps its own.
      expect(await as.otherAdmin.expectOk('get', '/api/company/settings')).toMatchObject({ lengthUnits: 'imperial', paperSize: 'letter' });
      const audit = await withDb((db) => db.query(`select details from audit_log where company_id = $1 and action = 'company.settings.update'`, [a.id]));
      expect(audit.rows[0].details).toEqual({ lengthUnits: 'metric', gaugeUnits: 'mm2', paperSize: 'a4' });
    });

    it.each([
      [{ lengthUnits: 'cubits' }, 'lengthUnits'],
      [{ gaugeUnits: null }, 'gaugeUnits'],
      [{ paperSize: 'a3' }, 'paperSize'],
      [{}, ''],
      [{ logoKey: 'x' }, ''],
    ])('should answer 400 for %j, naming the field, and change nothing', async (body, field) => {
      const before = await settingsRow(a.id);
      const res = await as.admin.send('patch', '/api/company/settings', body);
      expect(res.status).toBe(400);
      expect(res.body.issues[0].path).toBe(field);
      if (field === '') expect(res.body.message).toMatch(/nothing to change|logoKey/);
      expect(await settingsRow(a.id)).toEqual(before);
    });
  });

  describe('my preferences', () => {
    it('should tell everyone of the company its time zone and locale, in which screens write dates (issue 16)', async () => {
      // The profile is the admin's and office's to read; a technician's screens still need its zone.
      await as.admin.expectOk('patch', '/api/company/profile', { timeZone: 'America/Denver', locale: 'en-CA' });
      expect((await as.tech.expectOk('get', '/api/me/preferences')).company).toMatchObject({ timeZone: 'America/Denver', locale: 'en-CA' });
      await as.admin.expectOk('patch', '/api/company/profile', { timeZone: null, locale: 'en-US' });
      expect((await as.tech.expectOk('get', '/api/me/preferences')).company).toMatchObject({ timeZone: null, locale: 'en-US' });
    });

    it('should follow the company until someone chooses, keep each person’s choice their own, and go back on null', async () => {
      await as.admin.expectOk('patch', '/api/company/settings', { lengthUnits: 'imperial', gaugeUnits: 'awg' });
      expect(await as.lead.expectOk('get', '/api/me/preferences')).toEqual({
        lengthUnits: null,
        gaugeUnits: null,
        company: { lengthUnits: 'imperial', gaugeUnits: 'awg', timeZone: null, locale: 'en-US' },
        effective: { length: 'imperial', gauge: 'awg' },
      });

      const chosen = await as.lead.expectOk('patch', '/api/me/preferences', { lengthUnits: 'metric' });
      expect(chosen).toMatchObject({ lengthUnits: 'metric', gaugeUnits: null, effective: { length: 'metric', gauge: 'awg' } });
      // Someone else of the company still follows the company.
      expect((await as.tech.expectOk('get', '/api/me/preferences')).effective).toEqual({ length: 'imperial', gauge: 'awg' });

      // A company change reaches the unit the lead did not choose, not the one they did.
      await as.admin.expectOk('patch', '/api/company/settings', { lengthUnits: 'imperial', gaugeUnits: 'mm2' });
      expect((await as.lead.expectOk('get', '/api/me/preferences')).effective).toEqual({ length: 'metric', gauge: 'mm2' });

      const back = await as.lead.expectOk('patch', '/api/me/preferences', { lengthUnits: null });
      expect(back).toMatchObject({ lengthUnits: null, effective: { length: 'imperial', gauge: 'mm2' } });
      const rows = await withDb((db) => db.query('select length_units, gauge_units from user_preferences where user_id = $1', [a.users.lead.id]));
      expect(rows.rows).toEqual([{ length_units: null, gauge_units: null }]);
    });

    it('should let a homeowner keep their own choice too', async () => {
      const res = await as.homeowner.expectOk('patch', '/api/me/preferences', { gaugeUnits: 'mm2' });
      expect(res.gaugeUnits).toBe('mm2');
    });

    it.each([
      [{ lengthUnits: 'furlongs' }, 'lengthUnits'],
      [{ gaugeUnits: 12 }, 'gaugeUnits'],
      [{}, ''],
      [{ userId: '00000000-0000-4000-8000-000000000000', lengthUnits: 'metric' }, ''],
    ])('should answer 400 for %j naming the field, and store nothing', async (body, field) => {
      const res = await as.office.send('patch', '/api/me/preferences', body);
      expect(res.status).toBe(400);
      expect(res.body.issues[0].path).toBe(field);
      const rows = await withDb((db) => db.query('select 1 from user_preferences where user_id = $1', [a.users.office.id]));
      expect(rows.rowCount).toBe(0);
    });
  });
});
