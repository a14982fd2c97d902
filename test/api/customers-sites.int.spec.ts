import { randomUUID } from 'node:crypto';

import type { NestExpressApplication } from '@nestjs/platform-express';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { encodeCursor } from '../../api/src/domain/paging/page.schema.js';
import { createCompany, type TestCompany, withDb } from '../support/fixtures.js';
import { type Api, apiAs, createJob, createSite, siteWrite } from '../support/records.js';
import { signIn } from '../support/session.js';
import { createTestApp } from '../support/test-app.js';

describe('customers and sites', () => {
  let app: NestExpressApplication;
  let a: TestCompany;
  let b: TestCompany;
  let office: Api;
  let lead: Api;
  let otherAdmin: Api;

  beforeAll(async () => {
    app = await createTestApp();
    a = await createCompany('Sites A');
    b = await createCompany('Sites B');
    office = apiAs(app, await signIn(app, a.users.office));
    lead = apiAs(app, await signIn(app, a.users.lead));
    otherAdmin = apiAs(app, await signIn(app, b.users.admin));
  });

  afterAll(async () => {
    await app.close();
  });

  describe('customers', () => {
    it('should create, read, search, update and delete a customer', async () => {
      const created = await office.expectOk('post', '/api/customers', { name: 'Wrenna Moorcastle', email: 'Wrenna@Example.net', phone: '+1 (555) 010-0199' });
      expect(created).toMatchObject({ name: 'Wrenna Moorcastle', email: 'wrenna@example.net' });
      expect(await lead.expectOk('get', `/api/customers/${created.id}`)).toEqual(created);
      expect((await lead.expectOk('get', '/api/customers?q=moorcastle')).items.map((c: { id: string }) => c.id)).toEqual([created.id]);
      const updated = await office.expectOk('patch', `/api/customers/${created.id}`, { notes: 'Prefers texts' });
      expect(updated.notes).toBe('Prefers texts');
      expect((await office.send('delete', `/api/customers/${created.id}`)).status).toBe(204);
      expect((await office.send('get', `/api/customers/${created.id}`)).status).toBe(404);
    });

    it('should answer 400 naming the field, 404 across companies and 409 for a customer with sites', async () => {
      const bad = await office.send('post', '/api/customers', { name: 'X', email: 'not-an-address' });
      expect(bad.status).toBe(400);
      expect(bad.body.issues[0].path).toBe('email');
      const { customerId } = await createSite(office);
      expect((await otherAdmin.send('get', `/api/customers/${customerId}`)).status).toBe(404);
      expect((await otherAdmin.send('patch', `/api/customers/${customerId}`, { name: 'Mine' })).status).toBe(404);
      expect((await otherAdmin.send('delete', `/api/customers/${customerId}`)).status).toBe(404);
      expect((await otherAdmin.expectOk('get', '/api/customers')).items.some((c: { id: string }) => c.id === customerId)).toBe(false);
      const res = await office.send('delete', `/api/customers/${customerId}`);
      expect(res.status).toBe(409);
      expect(res.body.code).toBe('CUSTOMER_HAS_SITES');
    });
  });

  describe('sites', () => {
    it('should create a site with its frame and plan calibration, and read it back', async () => {
      const customer = await office.expectOk('post', '/api/customers', { name: 'Hollis Fernwake' });
      const site = await office.expectOk('post', '/api/sites', {
        customerId: customer.id,
        label: 'Fernwake back yard',
        addressLine1: '42 Lanternmoss Court',
        city: 'Briarholt',
        region: 'Westmarch',
        postalCode: '99999',
        country: 'Testland',
        northAzimuthDeg: 12,
        origin: { lat: 40, lon: -105 },
      });
      expect(site).toMatchObject({
        customer: { id: customer.id, name: 'Hollis Fernwake' },
        northAzimuthDeg: 12,
        origin: { lat: 40, lon: -105 },
        // The plan image and its calibration come later (test/api/site-plan-image.int.spec.ts).
        planImage: null,
        planCalibration: null,
        referencePoints: [],
        jobs: [],
        version: 1,
      });
      const updated = await office.expectOk('patch', `/api/sites/${site.id}`, { origin: null, planCalibration: null }, { 'If-Match': '"1"' });
      expect(updated).toMatchObject({ origin: null, planCalibration: null, version: 2, siteVersion: 2, jobVersions: {} });
      expect((await lead.expectOk('get', `/api/sites?customerId=${customer.id}`)).items.map((s: { id: string }) => s.id)).toEqual([site.id]);
    });

    it('should answer 400 naming the field', async () => {
      const { customerId } = await createSite(office);
      for (const [body, field] of [
        [{ customerId, label: 'X', addressLine1: '1 A St', city: 'B', country: 'C', northAzimuthDeg: 400 }, 'northAzimuthDeg'],
        [{ customerId, label: 'X', addressLine1: '1 A St', city: 'B', country: 'C', origin: { lat: 95, lon: 0 } }, 'origin.lat'],
        [{ customerId, label: 'X', addressLine1: '1 A St', country: 'C' }, 'city'],
        [{ customerId: '00000000-0000-4000-8000-000000000000', label: 'X', addressLine1: '1 A St', city: 'B', country: 'C' }, 'customerId'],
      ] as const) {
        const res = await office.send('post', '/api/sites', body);
        expect(res.status, JSON.stringify(res.body)).toBe(400);
        expect(res.body.issues[0].path).toBe(field);
      }
    });

    it('should keep reference points on the site, reused by jobs, and refuse deleting one that is tied to', async () => {
      const { siteId } = await createSite(office);
      // A crew lead records reference points on a site where they are on an open job's crew.
      const job = await createJob(office, siteId, { crewLeadUserId: a.users.lead.id });
      const point = await siteWrite(lead, 'post', siteId, '/reference-points', { label: 'Meter base', x: 2, y: -0.5 });
      const moved = await siteWrite(lead, 'patch', siteId, `/reference-points/${point.id}`, { x: 2.1 });
      expect(moved).toMatchObject({ label: 'Meter base', x: 2.1, y: -0.5, siteVersion: 3, jobVersions: { [job.id]: 3 } });
      await office.expectOk('post', `/api/jobs/${job.id}/items`, { kind: 'junction', label: 'Splice', ties: [{ referencePointId: point.id, distanceM: 3 }] }, { 'If-Match': '3' });
      const site = await lead.expectOk('get', `/api/sites/${siteId}`);
      expect(site.referencePoints.map((p: { id: string }) => p.id)).toEqual([point.id]);
      expect(site.jobs.map((j: { id: string }) => j.id)).toEqual([job.id]);
      const refused = await office.send('delete', `/api/sites/${siteId}/reference-points/${point.id}`, undefined, { 'If-Match': `"${site.version}"` });
      expect(refused.status).toBe(409);
      expect(refused.body.code).toBe('IN_USE');
      expect((await otherAdmin.send('patch', `/api/sites/${siteId}/reference-points/${point.id}`, { x: 0 }, { 'If-Match': '"3"' })).status).toBe(404);
      const other = await siteWrite(lead, 'post', siteId, '/reference-points', { label: 'Spare', x: 0, y: 0 });
      expect(await siteWrite(lead, 'delete', siteId, `/reference-points/${other.id}`)).toEqual({ siteVersion: 5, jobVersions: { [job.id]: 6 } });
      expect((await office.send('delete', `/api/sites/${siteId}`)).status).toBe(409);
    });

    it('should link and unlink homeowners of the company only', async () => {
      const { siteId } = await createSite(office);
      const linked = await office.expectOk('post', `/api/sites/${siteId}/homeowners`, { userId: a.users.homeowner.id });
      expect(linked).toEqual([{ id: a.users.homeowner.id, name: a.users.homeowner.name, email: a.users.homeowner.email }]);
      for (const userId of [a.users.tech.id, b.users.homeowner.id]) {
        const res = await office.send('post', `/api/sites/${siteId}/homeowners`, { userId });
        expect(res.status).toBe(400);
        expect(res.body.issues[0].path).toBe('userId');
      }
      expect((await otherAdmin.send('delete', `/api/sites/${siteId}/homeowners/${a.users.homeowner.id}`)).status).toBe(404);
      expect((await office.send('delete', `/api/sites/${siteId}/homeowners/${a.users.homeowner.id}`)).status).toBe(204);
      const rows = await withDb((db) => db.query('select * from site_homeowners where site_id = $1', [siteId]));
      expect(rows.rowCount).toBe(0);
    });

    it('should delete a site without jobs and 404 across companies', async () => {
      const { siteId } = await createSite(office);
      expect((await otherAdmin.send('get', `/api/sites/${siteId}`)).status).toBe(404);
      expect((await otherAdmin.send('delete', `/api/sites/${siteId}`)).status).toBe(404);
      expect((await office.send('delete', `/api/sites/${siteId}`)).status).toBe(204);
      expect((await office.send('get', `/api/sites/${siteId}`)).status).toBe(404);
    });
  });

  describe('pages (customers, sites and users share the jobs list shape, and page by cursor too)', () => {
    it('should page every match with its total, nothing cut off, in name order', async () => {
      // A company of its own: its lists hold exactly what this test makes (fixture users: 5 roles).
      const c = await createCompany('Paging C');
      const admin = apiAs(app, await signIn(app, c.users.admin));
      const sites: string[] = [];
      for (let i = 0; i < 3; i += 1) sites.push((await createSite(admin)).siteId);

      const customers1 = await admin.expectOk('get', '/api/customers?pageSize=2');
      expect(customers1).toMatchObject({ total: 3, page: 1, pageSize: 2 });
      expect(customers1.items).toHaveLength(2);
      const customers2 = await admin.expectOk('get', '/api/customers?pageSize=2&page=2');
      expect(customers2).toMatchObject({ total: 3, page: 2, pageSize: 2 });
      expect(customers2.items).toHaveLength(1);
      const names = [...customers1.items, ...customers2.items].map((x: { name: string }) => x.name);
      expect(names).toEqual([...names].sort((x, y) => x.localeCompare(y)));
      expect((await admin.expectOk('get', '/api/customers?pageSize=2&page=3')).items).toEqual([]);

      const sites1 = await admin.expectOk('get', '/api/sites?pageSize=2');
      const sites2 = await admin.expectOk('get', '/api/sites?pageSize=2&page=2');
      expect(sites1).toMatchObject({ total: 3, page: 1, pageSize: 2 });
      expect([...sites1.items, ...sites2.items].map((x: { id: string }) => x.id).sort()).toEqual([...sites].sort());

      const users = await admin.expectOk('get', '/api/users?pageSize=3');
      expect(users).toMatchObject({ total: 5, page: 1, pageSize: 3 });
      expect(users.items).toHaveLength(3);
      expect((await admin.expectOk('get', '/api/users')).pageSize).toBe(25);
      expect(users.nextCursor).toEqual(expect.any(String));
      const lastUsers = await admin.expectOk('get', `/api/users?pageSize=3&cursor=${users.nextCursor}`);
      expect(lastUsers).toMatchObject({ total: 5, page: 2, pageSize: 3, nextCursor: null });
      expect(lastUsers.items).toHaveLength(2);
      const everyone = [...users.items, ...lastUsers.items].map((x: { id: string }) => x.id);
      expect(new Set(everyone).size).toBe(5);
    });

    it('should walk customers and sites by cursor, not repeating a row when one is added before the cursor meanwhile', async () => {
      const c = await createCompany('Cursor C');
      const admin = apiAs(app, await signIn(app, c.users.admin));
      for (const name of ['Cursor Birch', 'Cursor Cedar', 'Cursor Elm', 'Cursor Fir']) await admin.expectOk('post', '/api/customers', { name });

      const first = await admin.expectOk('get', '/api/customers?pageSize=2');
      expect(first).toMatchObject({ total: 4, page: 1, pageSize: 2, nextCursor: expect.any(String) });
      expect(first.items.map((x: { name: string }) => x.name)).toEqual(['Cursor Birch', 'Cursor Cedar']);
      // A row added before the cursor does not move the page it asks for; an offset's page 2 now repeats Cedar.
      await admin.expectOk('post', '/api/customers', { name: 'Cursor Alder' });
      const second = await admin.expectOk('get', `/api/customers?pageSize=2&cursor=${first.nextCursor}`);
      expect(second).toMatchObject({ total: 5, page: 2, pageSize: 2, nextCursor: null });
      expect(second.items.map((x: { name: string }) => x.name)).toEqual(['Cursor Elm', 'Cursor Fir']);
      expect((await admin.expectOk('get', '/api/customers?pageSize=2&page=2')).items.map((x: { name: string }) => x.name)).toEqual([
        'Cursor Cedar',
        'Cursor Elm',
      ]);

      // A search keeps its filter across the cursor; an exact page holds no cursor to an empty one.
      const searched = await admin.expectOk('get', '/api/customers?q=cursor%20e&pageSize=1');
      expect(searched).toMatchObject({ total: 1, nextCursor: null });

      const sites: string[] = [];
      for (let i = 0; i < 3; i += 1) sites.push((await createSite(admin)).siteId);
      const walked: string[] = [];
      let cursor: string | null = null;
      let pages = 0;
      do {
        const page: { items: { id: string }[]; nextCursor: string | null; page: number } = await admin.expectOk(
          'get',
          `/api/sites?pageSize=1${cursor ? `&cursor=${cursor}` : ''}`,
        );
        pages += 1;
        expect(page.page).toBe(pages);
        walked.push(...page.items.map((x) => x.id));
        cursor = page.nextCursor;
      } while (cursor && pages < 10);
      expect(pages).toBe(3);
      expect([...walked].sort()).toEqual([...sites].sort());
    });

    it('should refuse a cursor it did not write, and a cursor sent with page, with 400 naming cursor', async () => {
      const valid = encodeCursor({ key: 'Any', id: randomUUID(), page: 2 });
      const forged = Buffer.from(JSON.stringify({ key: 'a', id: 'not-a-uuid', page: 2 })).toString('base64url');
      for (const path of ['/api/customers', '/api/sites', '/api/users']) {
        for (const query of ['cursor=nonsense!', `cursor=${forged}`, `cursor=${'A'.repeat(2001)}`, `page=2&cursor=${valid}`]) {
          const res = await office.send('get', `${path}?${query}`);
          expect(res.status, `${path}?${query}`).toBe(400);
          expect(res.body.issues.map((i: { path: string }) => i.path), `${path}?${query}`).toContain('cursor');
        }
      }
    });

    it('should refuse bad page parameters with 400 naming the field', async () => {
      for (const path of ['/api/customers', '/api/sites', '/api/users']) {
        for (const [query, field] of [
          ['page=0', 'page'],
          ['page=two', 'page'],
          ['pageSize=101', 'pageSize'],
          ['pageSize=0', 'pageSize'],
          ['pageSize=1.5', 'pageSize'],
        ] as const) {
          const res = await office.send('get', `${path}?${query}`);
          expect(res.status, `${path}?${query}`).toBe(400);
          expect(res.body.issues.map((i: { path: string }) => i.path), `${path}?${query}`).toContain(field);
          expect(res.body.message).toContain(field);
        }
      }
    });
  });
});
