import { randomUUID } from 'node:crypto';

import type { NestExpressApplication } from '@nestjs/platform-express';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { createCompany, type TestCompany, withDb } from '../support/fixtures.js';
import { findLink, waitForMail } from '../support/mail.js';
import { type Api, apiAs, createSite } from '../support/records.js';
import { signIn } from '../support/session.js';
import { createTestApp } from '../support/test-app.js';

describe('site homeowners', () => {
  let app: NestExpressApplication;
  let a: TestCompany;
  let office: Api;
  let lead: Api;
  let otherAdmin: Api;
  let siteId: string;

  beforeAll(async () => {
    app = await createTestApp();
    a = await createCompany('Homeowners A');
    const b = await createCompany('Homeowners B');
    office = apiAs(app, await signIn(app, a.users.office));
    lead = apiAs(app, await signIn(app, a.users.lead));
    otherAdmin = apiAs(app, await signIn(app, b.users.admin));
    ({ siteId } = await createSite(office));
  });

  afterAll(async () => {
    await app.close();
  });

  it('should link and unlink an existing homeowner of the company', async () => {
    const linked = await office.expectOk('post', `/api/sites/${siteId}/homeowners`, { userId: a.users.homeowner.id });
    expect(linked.map((h: { id: string }) => h.id)).toContain(a.users.homeowner.id);
    expect((await office.expectOk('get', `/api/sites/${siteId}`)).homeowners).toEqual([expect.objectContaining({ id: a.users.homeowner.id })]);
    expect((await office.send('delete', `/api/sites/${siteId}/homeowners/${a.users.homeowner.id}`)).status).toBe(204);
    expect((await office.expectOk('get', `/api/sites/${siteId}`)).homeowners).toEqual([]);
    const notHomeowner = await office.send('post', `/api/sites/${siteId}/homeowners`, { userId: a.users.tech.id });
    expect(notHomeowner.status).toBe(400);
    expect(notHomeowner.body.issues[0].path).toBe('userId');
  });

  it('should invite a homeowner by e-mail and link the site to their account when they accept', async () => {
    const email = `owner.${randomUUID()}@homeowners.example`;
    const invitation = await office.expectOk('post', `/api/sites/${siteId}/homeowner-invitations`, { email: `  ${email.toUpperCase()} `, name: 'Lorne Pebbleton' });
    expect(invitation).toMatchObject({ email, role: 'homeowner', name: 'Lorne Pebbleton' });
    const linkedSites = await withDb(async (db) => (await db.query('select site_id from invitation_sites where invitation_id = $1', [invitation.id])).rows);
    expect(linkedSites).toEqual([{ site_id: siteId }]);

    const mail = await waitForMail(email);
    const token = new URL(findLink(mail, '/accept-invitation')).searchParams.get('token')!;
    const accepted = await request(app.getHttpServer()).post('/api/auth/invitations/accept').send({ token, name: 'Lorne Pebbleton', password: 'a-long-enough-password' });
    expect(accepted.status, JSON.stringify(accepted.body)).toBe(200);
    const site = await office.expectOk('get', `/api/sites/${siteId}`);
    expect(site.homeowners).toEqual([expect.objectContaining({ email, name: 'Lorne Pebbleton' })]);
  });

  it.each([
    [{ email: 'not-an-address' }, 'email'],
    [{}, 'email'],
    [{ email: 'fine@homeowners.example', name: '' }, 'name'],
  ])('should answer 400 naming the field for %j and invite nobody', async (body, field) => {
    const before = await withDb(async (db) => (await db.query('select count(*)::int as n from invitations where company_id = $1', [a.id])).rows[0].n);
    const res = await office.send('post', `/api/sites/${siteId}/homeowner-invitations`, body);
    expect(res.status).toBe(400);
    expect(res.body.issues.map((i: { path: string }) => i.path)).toContain(field);
    const after = await withDb(async (db) => (await db.query('select count(*)::int as n from invitations where company_id = $1', [a.id])).rows[0].n);
    expect(after).toBe(before);
  });

  it('should refuse an e-mail that already has an account, crew leads, and another company’s site', async () => {
    const taken = await office.send('post', `/api/sites/${siteId}/homeowner-invitations`, { email: a.users.homeowner.email });
    expect(taken.status).toBe(409);
    expect(taken.body.code).toBe('EMAIL_TAKEN');
    expect((await lead.send('post', `/api/sites/${siteId}/homeowner-invitations`, { email: 'x@homeowners.example' })).status).toBe(403);
    const poach = await otherAdmin.send('post', `/api/sites/${siteId}/homeowner-invitations`, { email: `poach.${randomUUID()}@homeowners.example` });
    expect(poach.status).toBe(404);
    const invited = await withDb(async (db) => (await db.query(`select count(*)::int as n from invitations where email like 'poach.%'`)).rows[0].n);
    expect(invited).toBe(0);
  });
});
