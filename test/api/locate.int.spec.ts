import { createHash } from 'node:crypto';
import { mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

import type { NestExpressApplication } from '@nestjs/platform-express';
import sharp from 'sharp';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { DEMO_AS_BUILT } from '../../api/src/domain/as-built/demo-as-built.js';
import { fillCaution, SAFETY_CAUTIONS } from '../../api/src/domain/packet/packet-cautions.js';
import { LocateViewResponseSchema } from '../../api/src/domain/locate/locate-link.schema.js';
import { SiteMapSchema } from '../../api/src/domain/locate/site-map.schema.js';
import { PortalSiteDetailResponseSchema } from '../../api/src/domain/delivery/portal.schema.js';
import { makeFieldPhoto } from '../fixtures/photos/make-photos.js';
import { pdfPages } from '../print/packet-pdf.js';
import { createCompany, type TestCompany, withDb } from '../support/fixtures.js';
import { type Api, apiAs, createSite, createJob, moveJob, recordAsBuilt } from '../support/records.js';
import { bearer, signIn } from '../support/session.js';

const CUSTOMER_PHONE = '+1 555 0199';
const TRENCH_CAPTION = 'Open trench along the patio, tape at 30 cm';
const STAFF_NOTE = 'Gate code 4321 (staff only)';

// ConfigModule reads the environment when AppModule is imported: set this file's settings first.
Object.assign(process.env, {
  PACKET_WORKER_IN_API: 'true',
  QUEUE_POLL_INTERVAL_SECONDS: '0.5',
  UPLOADS_DIR: mkdtempSync(join(tmpdir(), 'loamline-locate-uploads-')),
  APP_URL: 'https://loamline.example',
  LOCATE_FAILED_LOOKUPS_PER_MINUTE: '20',
});

function binary(req: request.Test) {
  return req.buffer(true).parse((response, callback) => {
    const chunks: Buffer[] = [];
    response.on('data', (c: Buffer) => chunks.push(c));
    response.on('end', () => callback(null, Buffer.concat(chunks)));
  });
}

describe('locate links, the public locate view and the homeowner portal (a real issued packet)', () => {
  let app: NestExpressApplication;
  let company: TestCompany;
  let other: TestCompany;
  let office: Api;
  let homeowner: Api;
  let siteId: string;
  let revisionId: string;
  let qrUrl: string;
  let qrToken: string;
  let runId: string;

  const server = () => app.getHttpServer();
  const anonymous = (path: string, userAgent = 'LocateTest/1.0 (fence crew phone)') => request(server()).get(path).set('User-Agent', userAgent);

  beforeAll(async () => {
    const { createTestApp } = await import('../support/test-app.js');
    app = await createTestApp();
    company = await createCompany('Locate');
    other = await createCompany('Locate Other');
    await withDb((db) =>
      db.query(
        `insert into company_settings (company_id, units, licence_numbers, contact_phone, contact_email)
         values ($1, 'metric', array['Licence LV-0042 (invented)'], '+1 555 0142', 'office@locate.example')`,
        [company.id],
      ),
    );
    office = apiAs(app, await signIn(app, company.users.office));
    const lead = apiAs(app, await signIn(app, company.users.lead));
    homeowner = apiAs(app, await signIn(app, company.users.homeowner));
    ({ siteId } = await createSite(office, DEMO_AS_BUILT.site));
    await withDb((db) => db.query('update customers set phone = $1 where id = (select customer_id from sites where id = $2)', [CUSTOMER_PHONE, siteId]));
    await office.expectOk('post', `/api/sites/${siteId}/homeowners`, { userId: company.users.homeowner.id });
    const created = await createJob(office, siteId, { crewLeadUserId: company.users.lead.id });
    // A buried run with depth readings carries the staff note and the trench photo.
    const buried = DEMO_AS_BUILT.runs.find((r) => (r.depthReadings?.length ?? 0) > 0)!;
    const recorded = await recordAsBuilt(lead, created, {
      ...DEMO_AS_BUILT,
      runs: DEMO_AS_BUILT.runs.map((r) => (r.id === buried.id ? { ...r, notes: STAFF_NOTE } : r)),
    });
    runId = recorded.ids.get(buried.id)!;
    const upload = await request(server())
      .post(`/api/jobs/${created.id}/photos`)
      .set(bearer(await signIn(app, company.users.lead)))
      .set('If-Match', `"${recorded.version}"`)
      .field('caption', TRENCH_CAPTION)
      .field('target', JSON.stringify({ type: 'run', id: runId }))
      .attach('files', await makeFieldPhoto(), { filename: 'trench.jpg', contentType: 'image/jpeg' });
    expect(upload.status, JSON.stringify(upload.body)).toBe(201);
    const submitted = await moveJob(lead, { ...created, version: upload.body.jobVersion }, 'in_progress', 'submitted');
    const ready = await moveJob(office, submitted, 'ready_to_issue');
    const issued = await office.send('post', `/api/jobs/${ready.id}/packets`, undefined, { 'If-Match': `"${ready.version}"` });
    expect(issued.status, JSON.stringify(issued.body)).toBe(201);
    revisionId = issued.body.id;
    const deadline = Date.now() + 90_000;
    for (;;) {
      const body = await office.expectOk('get', `/api/packets/${revisionId}`);
      if (body.status === 'ready') break;
      if (body.status === 'failed' || Date.now() > deadline) throw new Error(`packet ${body.status}: ${body.failureReason}`);
      await new Promise((resolve) => setTimeout(resolve, 300));
    }
    qrUrl = await withDb(async (db) => (await db.query('select url from revision_locate_links where revision_id = $1', [revisionId])).rows[0].url);
    qrToken = qrUrl.split('/locate/')[1]!;
  }, 180_000);

  afterAll(async () => {
    await app?.close();
  });

  describe('the packet QR code', () => {
    it('should print a working locate URL (a long-lived link of the site) on the cover', async () => {
      expect(qrUrl).toMatch(/^https:\/\/loamline\.example\/locate\/[A-Za-z0-9_-]{43}$/);
      const pdf = await binary(request(server()).get(`/api/packets/${revisionId}/pdf`).set(bearer(await signIn(app, company.users.office))));
      const cover = (await pdfPages(pdf.body as Buffer))[0]!.replace(/\s+/g, '');
      expect(cover).toContain(qrUrl);
      const link = await withDb(async (db) => (await db.query('select * from locate_links where token_hash = $1', [createHash('sha256').update(qrToken).digest('hex')])).rows[0]);
      expect(link).toMatchObject({ site_id: siteId, is_long_lived: true, revoked_at: null });
      expect(new Date(link.expires_at).getTime()).toBeGreaterThan(Date.now() + 9 * 365 * 86_400_000);
      const res = await anonymous(`/api/locate/${qrToken}`);
      expect(res.status).toBe(200);
    });
  });

  describe('public locate view', () => {
    it('should answer the map, depths, cautions and installer contact without staff-only fields', async () => {
      const res = await anonymous(`/api/locate/${qrToken}`);
      expect(res.status).toBe(200);
      expect(res.headers['cache-control']).toBe('no-store');
      expect(res.headers['referrer-policy']).toBe('no-referrer');
      const body = LocateViewResponseSchema.parse(res.body);
      expect(body.installer).toEqual({ companyName: company.name, phone: '+1 555 0142', email: 'office@locate.example', licenceNumbers: ['Licence LV-0042 (invented)'] });
      // The packet's caution texts, spelled for the company's locale (en-US by default: "center").
      expect(body.cautions.map((c) => c.title)).toEqual(SAFETY_CAUTIONS.map((c) => fillCaution(c.title, { zone: '0.5 m', locale: 'en-US' })));
      expect(body.cautions[0]!.title).toBe('Contact the one-call center before any digging');
      expect(body.locale).toBe('en-US');
      expect(body.cautions.map((c) => c.body).join(' ')).toContain('0.5 m on either side');
      expect(body.map.runs).toHaveLength(DEMO_AS_BUILT.runs.length);
      expect(body.map.runs.every((r) => r.revisionId === revisionId && r.revision === 1)).toBe(true);
      expect(body.map.geojson?.features.length).toBe(DEMO_AS_BUILT.runs.length + DEMO_AS_BUILT.items.length);
      const run = body.runs.find((r) => r.id === runId)!;
      expect(run.minDepthM).not.toBeNull();
      expect(run.photos).toHaveLength(1);
      expect(run.photos[0]!.caption).toBe(TRENCH_CAPTION);
      expect(body.site.addressLine1).toMatch(/Imaginary Lane/);

      const text = JSON.stringify(res.body);
      for (const secret of [STAFF_NOTE, CUSTOMER_PHONE, 'Fixture Customer', company.users.lead.name, company.users.lead.email, company.users.office.id, 'gpsLat', 'gpsLon', '45.5', '-122.67', 'original', 'serial', 'warranty']) {
        expect(text, secret).not.toContain(secret);
      }
    });

    it('should serve the depth profile, metadata-free photos (thumb and screen only) and the GeoJSON download', async () => {
      const view = (await anonymous(`/api/locate/${qrToken}`)).body;
      const run = view.runs.find((r: { id: string }) => r.id === runId);
      const svg = await anonymous(run.depthProfileUrl);
      expect(svg.status).toBe(200);
      expect(svg.headers['content-type']).toMatch(/^image\/svg\+xml/);
      expect(String(svg.body)).toContain('data-drawing="depth-profile"');

      for (const url of [run.photos[0].thumbUrl, run.photos[0].screenUrl]) {
        const photo = await binary(anonymous(url));
        expect(photo.status).toBe(200);
        // Read the metadata blocks with sharp: a byte search for "GPS" also matches compressed pixels by chance.
        const metadata = await sharp(photo.body as Buffer).metadata();
        expect(metadata.exif).toBeUndefined();
        expect(metadata.xmp).toBeUndefined();
        expect(metadata.iptc).toBeUndefined();
      }
      const original = await anonymous(run.photos[0].thumbUrl.replace(/thumb$/, 'original'));
      expect(original.status).toBe(404);
      const print = await anonymous(run.photos[0].thumbUrl.replace(/thumb$/, 'print'));
      expect(print.status).toBe(404);

      const geojson = await anonymous(view.geojsonUrl);
      expect(geojson.status).toBe(200);
      expect(geojson.headers['content-disposition']).toMatch(/^attachment; filename=".+\.geojson"$/);
      const collection = JSON.parse(geojson.text);
      expect(collection.type).toBe('FeatureCollection');
      const feature = collection.features.find((f: { id: string }) => f.id === runId);
      expect(feature.geometry.type).toBe('LineString');
      expect(feature.properties).toMatchObject({ featureKind: 'run', revisionId, revision: 1 });
      expect(Array.isArray(feature.properties.planRoute)).toBe(true);
    });
    it('should print the one-page locate sheet: installer phone, every run, address and steps; no-store', async () => {
      const res = await binary(anonymous(`/api/locate/${qrToken}/sheet.pdf`));
      expect(res.status).toBe(200);
      expect(res.headers['content-type']).toBe('application/pdf');
      expect(res.headers['cache-control']).toBe('no-store');
      expect(res.headers['content-disposition']).toMatch(/^inline; filename=".+-locate-sheet\.pdf"$/);
      const pages = await pdfPages(res.body as Buffer);
      expect(pages).toHaveLength(1);
      const text = pages[0]!.replace(/\s+/g, '');
      for (const expected of ['+15550142', company.name, 'ImaginaryLane', 'Beforeyoudig', 'Outlinethedigareainwhite', ...DEMO_AS_BUILT.runs.map((r) => r.label)]) {
        expect(text, expected).toContain(expected.replace(/\s+/g, ''));
      }
      for (const secret of [STAFF_NOTE, CUSTOMER_PHONE, company.users.lead.name]) expect(text, secret).not.toContain(secret.replace(/\s+/g, ''));
      // The same sheet again is served from memory, not printed again (Chromium would stamp a new creation date).
      const again = await binary(anonymous(`/api/locate/${qrToken}/sheet.pdf`));
      expect(Buffer.compare(again.body as Buffer, res.body as Buffer)).toBe(0);
    }, 60_000);
  });

  describe('locate links', () => {
    it('should work for a homeowner-made link until it expires, logging each open with address and user agent', async () => {
      const created = await homeowner.send('post', `/api/sites/${siteId}/locate-links`, { expiresInDays: 7, note: 'Fence crew, week 32' });
      expect(created.status).toBe(201);
      expect(created.headers['cache-control']).toBe('no-store');
      expect(created.body.url).toMatch(/^https:\/\/loamline\.example\/locate\//);
      const token = created.body.token as string;
      expect(Buffer.from(token, 'base64url').length).toBeGreaterThanOrEqual(16);

      expect((await anonymous(`/api/locate/${token}`, 'FenceCrew/2.0').set('X-Test', 'a')).status).toBe(200);
      expect((await anonymous(`/api/locate/${token}`, 'FenceCrew/2.0')).status).toBe(200);
      const accesses = await withDb(async (db) => (await db.query('select ip, user_agent from locate_link_accesses where link_id = $1', [created.body.id])).rows);
      expect(accesses).toHaveLength(2);
      for (const access of accesses) {
        expect(access.user_agent).toBe('FenceCrew/2.0');
        expect(access.ip).toMatch(/127\.0\.0\.1|::1/);
      }
      const list = await homeowner.expectOk('get', `/api/sites/${siteId}/locate-links`);
      const listed = list.find((l: { id: string }) => l.id === created.body.id);
      expect(listed).toMatchObject({ note: 'Fence crew, week 32', accessCount: 2, isActive: true, isLongLived: false });
      expect(listed.lastAccessedAt).not.toBeNull();
      expect(JSON.stringify(list)).not.toContain(token);
      expect(list.some((l: { isLongLived: boolean }) => l.isLongLived)).toBe(true);

      await withDb((db) => db.query(`update locate_links set expires_at = now() - interval '1 minute' where id = $1`, [created.body.id]));
      const expired = await anonymous(`/api/locate/${token}`);
      expect(expired.status).toBe(404);
      expect(expired.body.code).toBe('LOCATE_LINK_NOT_VALID');
      expect(Object.keys(expired.body).sort()).toEqual(['code', 'error', 'message', 'statusCode']);
      // The printable sheet answers as the view does.
      const sheet = await anonymous(`/api/locate/${token}/sheet.pdf`);
      expect(sheet.status).toBe(404);
      expect(sheet.body.code).toBe('LOCATE_LINK_NOT_VALID');
    });

    it('should stop working once revoked (by the office too), and refuse revoking another company’s link', async () => {
      const created = await office.expectOk('post', `/api/sites/${siteId}/locate-links`, { expiresInDays: 30 });
      expect((await anonymous(`/api/locate/${created.token}`)).status).toBe(200);
      const otherAdmin = apiAs(app, await signIn(app, other.users.admin));
      expect((await otherAdmin.send('delete', `/api/locate-links/${created.id}`)).status).toBe(404);
      expect((await otherAdmin.send('get', `/api/sites/${siteId}/locate-links`)).status).toBe(404);
      expect((await homeowner.send('delete', `/api/locate-links/${created.id}`)).status).toBe(204);
      const revoked = await anonymous(`/api/locate/${created.token}`);
      expect(revoked.status).toBe(404);
      expect(revoked.body.code).toBe('LOCATE_LINK_NOT_VALID');
      expect((await anonymous(`/api/locate/${created.token}/map.geojson`)).status).toBe(404);
      expect((await anonymous(`/api/locate/${created.token}/sheet.pdf`)).status).toBe(404);
      // Not even shaped like a token: the same 404, no query.
      expect((await anonymous('/api/locate/not%20a%20token/sheet.pdf')).body.code).toBe('LOCATE_LINK_NOT_VALID');
    });

    it('should validate expiry days and keep a homeowner to their own sites', async () => {
      expect((await homeowner.send('post', `/api/sites/${siteId}/locate-links`, { expiresInDays: 0 })).status).toBe(400);
      expect((await homeowner.send('post', `/api/sites/${siteId}/locate-links`, { expiresInDays: 366 })).status).toBe(400);
      const { siteId: notTheirs } = await createSite(office);
      expect((await homeowner.send('post', `/api/sites/${notTheirs}/locate-links`, { expiresInDays: 3 })).status).toBe(404);
      expect((await homeowner.send('get', `/api/sites/${notTheirs}/locate-links`)).status).toBe(404);
    });
  });

  describe('homeowner portal', () => {
    it('should list only the homeowner’s own sites and revisions, with verified downloads', async () => {
      const sites = await homeowner.expectOk('get', '/api/portal/sites');
      expect(sites.map((s: { id: string }) => s.id)).toEqual([siteId]);
      expect(sites[0]).toMatchObject({ packetCount: 1, installer: { companyName: company.name } });
      const detail = PortalSiteDetailResponseSchema.parse(await homeowner.expectOk('get', `/api/portal/sites/${siteId}`));
      expect(detail.packets).toHaveLength(1);
      expect(detail.packets[0]).toMatchObject({ id: revisionId, revision: 1, isLatest: true });
      const pdf = await binary(request(server()).get(detail.packets[0]!.pdf.url).set(bearer(await signIn(app, company.users.homeowner))));
      expect(pdf.status).toBe(200);
      const sha = createHash('sha256').update(pdf.body as Buffer).digest('hex');
      expect(sha).toBe(detail.packets[0]!.pdf.sha256);
      expect(pdf.headers.etag).toBe(`"${sha}"`);
      expect(pdf.headers['repr-digest']).toBe(`sha-256=:${Buffer.from(sha, 'hex').toString('base64')}:`);
      const zip = await binary(request(server()).get(detail.packets[0]!.archive.url).set(bearer(await signIn(app, company.users.homeowner))));
      expect(createHash('sha256').update(zip.body as Buffer).digest('hex')).toBe(detail.packets[0]!.archive.sha256);

      const map = SiteMapSchema.parse(await homeowner.expectOk('get', `/api/portal/sites/${siteId}/map`));
      expect(map.runs).toHaveLength(DEMO_AS_BUILT.runs.length);
      expect(map.frame.origin).toEqual({ lat: 40, lon: -105 });
      expect(map.geojson?.type).toBe('FeatureCollection');
    });

    it('should answer 404 for a site or packet that is not theirs, and 403 to staff', async () => {
      const { siteId: notTheirs } = await createSite(office);
      expect((await homeowner.send('get', `/api/portal/sites/${notTheirs}`)).status).toBe(404);
      expect((await homeowner.send('get', `/api/portal/sites/${notTheirs}/map`)).status).toBe(404);
      const stranger = apiAs(app, await signIn(app, other.users.homeowner));
      expect(await stranger.expectOk('get', '/api/portal/sites')).toEqual([]);
      expect((await stranger.send('get', `/api/portal/sites/${siteId}`)).status).toBe(404);
      expect((await stranger.send('get', `/api/portal/packets/${revisionId}/pdf`)).status).toBe(404);
      expect((await office.send('get', '/api/portal/sites')).status).toBe(403);
      expect((await homeowner.send('get', `/api/packets/${revisionId}/pdf`)).status).toBe(403);
      expect((await homeowner.send('get', `/api/packets/${revisionId}/deliveries`)).status).toBe(403);
    });
  });

  describe('a site with no GPS origin, no landmarks and no ties', () => {
    it('should answer plan positions only (no GeoJSON, with the reason) and still print the sheet', async () => {
      // The issued record as an older job without an origin, features or ties would have frozen it.
      await withDb((db) =>
        db.query(
          `update packet_revisions
              set snapshot = jsonb_set(snapshot #- '{asBuilt,site,origin}' #- '{asBuilt,site,features}', '{asBuilt,items}',
                                       (select jsonb_agg(i - 'ties') from jsonb_array_elements(snapshot->'asBuilt'->'items') i))
            where id = $1`,
          [revisionId],
        ),
      );
      const view = LocateViewResponseSchema.parse((await anonymous(`/api/locate/${qrToken}`)).body);
      expect(view.geojsonUrl).toBeNull();
      expect(view.map).toMatchObject({ geojson: null, siteFeatures: [], frame: { origin: null } });
      expect(view.map.items.every((i) => i.ties.length === 0)).toBe(true);
      const geojson = await anonymous(`/api/locate/${qrToken}/map.geojson`);
      expect(geojson.status).toBe(404);
      expect(geojson.body).toMatchObject({ code: 'SITE_NOT_GEOREFERENCED', message: expect.stringMatching(/no GPS origin/) });
      const sheet = await binary(anonymous(view.sheetUrl));
      expect(sheet.status).toBe(200);
      const pages = await pdfPages(sheet.body as Buffer);
      expect(pages).toHaveLength(1);
      expect(pages[0]!.replace(/\s+/g, '')).toContain(DEMO_AS_BUILT.runs[0]!.label.replace(/\s+/g, ''));
    }, 60_000);
  });

  describe('guessing tokens', () => {
    it('should answer 404 to unknown tokens, then 429 to the address (even with a valid token)', async () => {
      const statuses: number[] = [];
      for (let i = 0; i < 25; i += 1) {
        const res = await anonymous(`/api/locate/${createHash('sha256').update(String(i)).digest('base64url')}`);
        statuses.push(res.status);
        if (res.status === 429) break;
      }
      expect(statuses.at(-1)).toBe(429);
      expect(statuses.slice(0, -1).every((s) => s === 404)).toBe(true);
      expect((await anonymous(`/api/locate/${qrToken}`)).status).toBe(429);
    });
  });
});
