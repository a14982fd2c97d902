import { mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

import type { NestExpressApplication } from '@nestjs/platform-express';
import sharp from 'sharp';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { CompanyProfileResponseSchema } from '../../api/src/domain/company/company-profile.schema.js';
import { DEMO_AS_BUILT } from '../../api/src/domain/as-built/demo-as-built.js';
import { DEFAULT_DEPTH_RULES } from '../../api/src/domain/depth/depth-rules.js';
import { pdfLayoutText, pdfPages } from '../print/packet-pdf.js';
import { createCompany, type TestCompany, withDb } from '../support/fixtures.js';
import { type Api, apiAs, createSite, insertRecordedJob } from '../support/records.js';
import { bearer, signIn } from '../support/session.js';

// ConfigModule reads the environment when AppModule is imported (dynamically, in beforeAll).
Object.assign(process.env, {
  PACKET_WORKER_IN_API: 'true',
  QUEUE_POLL_INTERVAL_SECONDS: '0.5',
  UPLOADS_DIR: mkdtempSync(join(tmpdir(), 'loamline-profile-uploads-')),
});

/** An invented logo: an orange rounded square with a white wave, drawn here (no real brand). */
async function inventedLogo(size = 800): Promise<Buffer> {
  const svg = `<svg xmlns="http://www.w3.org/2000/svg" width="${size}" height="${size / 2}" viewBox="0 0 200 100">
    <rect x="4" y="4" width="92" height="92" rx="18" fill="#d9661f"/>
    <path d="M14 60 C 30 30, 50 90, 86 40" stroke="#fff" stroke-width="8" fill="none"/>
  </svg>`;
  return sharp(Buffer.from(svg)).png().toBuffer();
}

async function profileRow(companyId: string) {
  return withDb(async (db) => (await db.query('select * from company_settings where company_id = $1', [companyId])).rows[0]);
}

async function companyName(companyId: string): Promise<string> {
  return withDb(async (db) => (await db.query('select name from companies where id = $1', [companyId])).rows[0].name);
}

describe('company profile', () => {
  let app: NestExpressApplication;
  let company: TestCompany;
  let admin: Api;
  let office: Api;

  const upload = async (content: Buffer, name = 'logo.png', contentType = 'image/png') =>
    request(app.getHttpServer())
      .put('/api/company/profile/logo')
      .set(bearer(await signIn(app, company.users.admin)))
      .attach('file', content, { filename: name, contentType });

  beforeAll(async () => {
    const { createTestApp } = await import('../support/test-app.js');
    app = await createTestApp();
    company = await createCompany('Profile');
    admin = apiAs(app, await signIn(app, company.users.admin));
    office = apiAs(app, await signIn(app, company.users.office));
  }, 60_000);

  afterAll(async () => {
    await app?.close();
  });

  it('should round-trip every field, canonicalise time zone and locale, and let the office read but not write', async () => {
    const saved = await admin.expectOk('patch', '/api/company/profile', {
      tradeName: 'Tallowbrook Yard Audio',
      phone: '(555) 010-0177',
      email: 'Office@Tallowbrook.example',
      website: 'https://tallowbrook.example',
      postalAddress: '12 Quarry Lane\nMarrowfield, ZZ 00000',
      licenceNumbers: ['LV-TB-0001 (invented)', 'Registration 000-000 (invented)'],
      timeZone: 'america/denver',
      locale: 'en-ca',
    });
    expect(CompanyProfileResponseSchema.parse(saved)).toMatchObject({
      tradeName: 'Tallowbrook Yard Audio',
      phone: '(555) 010-0177',
      email: 'office@tallowbrook.example',
      website: 'https://tallowbrook.example',
      postalAddress: '12 Quarry Lane\nMarrowfield, ZZ 00000',
      licenceNumbers: ['LV-TB-0001 (invented)', 'Registration 000-000 (invented)'],
      timeZone: 'America/Denver',
      locale: 'en-CA',
      logo: null,
    });
    expect(await office.expectOk('get', '/api/company/profile')).toEqual(saved);
    expect(await companyName(company.id)).toBe('Tallowbrook Yard Audio');
    expect((await office.send('patch', '/api/company/profile', { phone: null })).status).toBe(403);

    // Blank clears an optional field; a missing phone is allowed.
    const cleared = await admin.expectOk('patch', '/api/company/profile', { phone: '', website: null });
    expect(cleared).toMatchObject({ phone: null, website: null, email: 'office@tallowbrook.example' });
  });

  it('should refuse an invalid time zone with 400 naming timeZone and change nothing', async () => {
    const before = await profileRow(company.id);
    for (const timeZone of ['Mars/Olympus_Mons', '+02:00', 'not a zone', '']) {
      const res = await admin.send('patch', '/api/company/profile', { timeZone, phone: '555 0100' });
      expect(res.status, `${timeZone} → ${JSON.stringify(res.body)}`).toBe(400);
      expect(res.body.issues.map((i: { path: string }) => i.path)).toEqual(['timeZone']);
    }
    const badLocale = await admin.send('patch', '/api/company/profile', { locale: 'xx-invalid-tag-!!' });
    expect(badLocale.status).toBe(400);
    expect(badLocale.body.issues[0].path).toBe('locale');
    expect(await profileRow(company.id)).toEqual(before);
  });

  it('should store an uploaded logo as a bounded PNG, refuse non-images (415) and huge files (413) naming file, and keep the old logo', async () => {
    const saved = await upload(await inventedLogo(), 'logo.png');
    expect(saved.status, JSON.stringify(saved.body)).toBe(200);
    expect(saved.body.logo.url).toMatch(/^\/api\/company\/profile\/logo\?v=[0-9a-f]{16}$/);
    const row = await profileRow(company.id);
    expect(row.logo_key).toMatch(new RegExp(`^companies/${company.id}/logo/[0-9a-f]{64}\\.png$`));

    const served = await request(app.getHttpServer())
      .get('/api/company/profile/logo')
      .set(bearer(await signIn(app, company.users.office)))
      .buffer(true)
      .parse((response, callback) => {
        const chunks: Buffer[] = [];
        response.on('data', (c: Buffer) => chunks.push(c));
        response.on('end', () => callback(null, Buffer.concat(chunks)));
      });
    expect(served.status).toBe(200);
    expect(served.headers['content-type']).toBe('image/png');
    const meta = await sharp(served.body as Buffer).metadata();
    expect(meta.format).toBe('png');
    expect(Math.max(meta.width!, meta.height!)).toBeLessThanOrEqual(600);

    const notImage = await upload(Buffer.from('%PDF-1.4 this is not a logo'), 'logo.png');
    expect(notImage.status).toBe(415);
    expect(notImage.body.issues[0].path).toBe('file');
    const svg = await upload(Buffer.from('<svg xmlns="http://www.w3.org/2000/svg"><script>alert(1)</script></svg>'), 'logo.svg', 'image/svg+xml');
    expect(svg.status).toBe(415);
    expect(svg.body.issues[0].path).toBe('file');
    const huge = await upload(Buffer.concat([await inventedLogo(), Buffer.alloc(6 * 1024 * 1024)]), 'huge.png');
    expect(huge.status).toBe(413);
    expect(huge.body.issues[0].path).toBe('file');
    expect((await profileRow(company.id)).logo_key).toBe(row.logo_key);

    const officeUpload = await request(app.getHttpServer())
      .put('/api/company/profile/logo')
      .set(bearer(await signIn(app, company.users.office)))
      .attach('file', await inventedLogo(), 'logo.png');
    expect(officeUpload.status).toBe(403);
  });

  it('should edit, apply and reset the depth rules', async () => {
    const initial = await office.expectOk('get', '/api/company/depth-rules');
    expect(initial).toEqual({ table: DEFAULT_DEPTH_RULES, isDefault: true, defaults: DEFAULT_DEPTH_RULES });
    const rules = DEFAULT_DEPTH_RULES.rules.map((rule) =>
      rule.method === 'direct_burial' && rule.location === 'general'
        ? { ...rule, minCoverM: 0.3, basis: 'company' as const, source: 'Company standard: 12 in in all yards (invented for this test).' }
        : rule,
    );
    const table = { name: 'Profile test company rules', rules };
    const saved = await admin.expectOk('put', '/api/company/depth-rules', table);
    expect(saved).toMatchObject({ table, isDefault: false });

    const duplicate = await admin.send('put', '/api/company/depth-rules', { ...table, rules: [...rules, rules[0]] });
    expect(duplicate.status).toBe(400);
    expect(duplicate.body.issues[0].path).toMatch(/^rules\.\d+\.location$/);
    expect((await admin.expectOk('get', '/api/company/depth-rules')).table).toEqual(table);

    // The analysis of a job cites the company's table.
    const { siteId } = await createSite(office, DEMO_AS_BUILT.site);
    const job = await insertRecordedJob(company, siteId, { crewLeadUserId: company.users.lead.id, technicianUserIds: [] }, DEMO_AS_BUILT);
    const asBuilt = await office.expectOk('get', `/api/jobs/${job.id}/as-built`);
    expect(JSON.stringify(asBuilt.analysis)).toContain('Profile test company rules');

    expect((await office.send('delete', '/api/company/depth-rules')).status).toBe(403);
    const reset = await admin.expectOk('delete', '/api/company/depth-rules');
    expect(reset).toEqual({ table: DEFAULT_DEPTH_RULES, isDefault: true, defaults: DEFAULT_DEPTH_RULES });
    expect((await profileRow(company.id)).depth_rules).toBeNull();
  });
});

describe('the company profile where the homeowner and the digger see it', () => {
  let app: NestExpressApplication;
  let company: TestCompany;
  let admin: Api;
  let office: Api;

  async function issue(): Promise<{ id: string; warnings: { code: string }[] }> {
    const { siteId } = await createSite(office, DEMO_AS_BUILT.site);
    await office.expectOk('post', `/api/sites/${siteId}/homeowners`, { userId: company.users.homeowner.id });
    const job = await insertRecordedJob(company, siteId, { crewLeadUserId: company.users.lead.id, technicianUserIds: [] }, DEMO_AS_BUILT);
    await withDb((db) => db.query(`update jobs set status = 'ready_to_issue' where id = $1`, [job.id]));
    const res = await office.send('post', `/api/jobs/${job.id}/packets`, undefined, { 'If-Match': `"${job.version}"` });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    return res.body;
  }

  async function waitReady(id: string) {
    const deadline = Date.now() + 120_000;
    for (;;) {
      const body = await office.expectOk('get', `/api/packets/${id}`);
      if (body.status === 'ready') return body;
      if (body.status === 'failed' || Date.now() > deadline) throw new Error(`packet ${body.status}: ${body.failureReason}`);
      await new Promise((resolve) => setTimeout(resolve, 300));
    }
  }

  async function pdfOf(id: string): Promise<Buffer> {
    const res = await request(app.getHttpServer())
      .get(`/api/packets/${id}/pdf`)
      .set(bearer(await signIn(app, company.users.office)))
      .buffer(true)
      .parse((response, callback) => {
        const chunks: Buffer[] = [];
        response.on('data', (c: Buffer) => chunks.push(c));
        response.on('end', () => callback(null, Buffer.concat(chunks)));
      });
    expect(res.status).toBe(200);
    return res.body as Buffer;
  }

  beforeAll(async () => {
    const { createTestApp } = await import('../support/test-app.js');
    app = await createTestApp();
    company = await createCompany('Profile Reach');
    admin = apiAs(app, await signIn(app, company.users.admin));
    office = apiAs(app, await signIn(app, company.users.office));
  }, 60_000);

  afterAll(async () => {
    await app?.close();
  });

  it('should warn when a packet is issued without a phone, and issue it all the same', async () => {
    await admin.expectOk('patch', '/api/company/profile', { tradeName: 'Brindlecove Outdoor Sound', phone: null });
    const packet = await issue();
    expect(packet.warnings).toEqual([expect.objectContaining({ code: 'PACKET_WITHOUT_PHONE' })]);
    const ready = await waitReady(packet.id);
    expect(ready.status).toBe('ready');
  }, 180_000);

  it('should print name, phone, licence and logo on the packet, freeze them in the revision, and show the contact in the portal and locate view', async () => {
    await admin.expectOk('patch', '/api/company/profile', {
      tradeName: 'Brindlecove Outdoor Sound',
      phone: '(555) 010-0163',
      email: 'hello@brindlecove.example',
      licenceNumbers: ['LV-BC-4410 (invented)'],
    });
    const logo = await request(app.getHttpServer())
      .put('/api/company/profile/logo')
      .set(bearer(await signIn(app, company.users.admin)))
      .attach('file', await inventedLogo(), 'logo.png');
    expect(logo.status).toBe(200);
    const packet = await issue();
    expect(packet.warnings).toEqual([]);
    await waitReady(packet.id);

    const pdf = await pdfOf(packet.id);
    const pages = await pdfPages(pdf);
    expect(pages[0]).toContain('Brindlecove Outdoor Sound');
    expect(pages[0]).toContain('(555) 010-0163');
    expect(pages[0]).toContain('LV-BC-4410 (invented)');
    // The footer of every page after the cover carries the name and the phone.
    for (const page of pages.slice(1)) expect(page).toMatch(/Brindlecove Outdoor Sound · \(555\) 010-0163/);
    // The locate page tells whoever digs to call the installer, with the number.
    expect(pdfLayoutText(pdf)).toContain('Call the installer: (555) 010-0163');

    const { snapshot, logoKey } = await withDb(async (db) => {
      const rev = (await db.query('select snapshot from packet_revisions where id = $1', [packet.id])).rows[0];
      const settings = (await db.query('select logo_key from company_settings where company_id = $1', [company.id])).rows[0];
      return { snapshot: rev.snapshot, logoKey: settings.logo_key as string };
    });
    // Frozen at issue time: the logo key (never overwritten) and the contact.
    expect(snapshot.company).toMatchObject({ name: 'Brindlecove Outdoor Sound', logoKey });
    expect(snapshot.settings).toMatchObject({ contactPhone: '(555) 010-0163', contactEmail: 'hello@brindlecove.example' });
    // The logo is drawn on the cover: an image on page 1.
    expect(pdf.includes(Buffer.from('/Subtype /Image')) || pdf.includes(Buffer.from('/Subtype/Image'))).toBe(true);

    const homeowner = apiAs(app, await signIn(app, company.users.homeowner));
    const sites = await homeowner.expectOk('get', '/api/portal/sites');
    expect(sites[0].installer).toMatchObject({ companyName: 'Brindlecove Outdoor Sound', phone: '(555) 010-0163', email: 'hello@brindlecove.example' });

    const url = await withDb(async (db) => (await db.query('select url from revision_locate_links where revision_id = $1', [packet.id])).rows[0].url as string);
    const view = await request(app.getHttpServer()).get(`/api/locate/${url.split('/locate/')[1]}`);
    expect(view.status).toBe(200);
    expect(view.body.installer).toMatchObject({ companyName: 'Brindlecove Outdoor Sound', phone: '(555) 010-0163' });
  }, 240_000);

  it('should send the packet e-mail with the company as From name and its e-mail as Reply-To', async () => {
    await admin.expectOk('patch', '/api/company/profile', { tradeName: 'Brindlecove Outdoor Sound', email: 'hello@brindlecove.example', phone: '(555) 010-0163' });
    const packet = await issue();
    await waitReady(packet.id);
    const res = await office.send('post', `/api/packets/${packet.id}/send`, { to: [company.users.homeowner.email] });
    expect(res.status, JSON.stringify(res.body)).toBe(202);
    const deadline = Date.now() + 60_000;
    let mail: { from_address: string; headers: Record<string, string> } | undefined;
    while (!mail && Date.now() < deadline) {
      mail = await withDb(
        async (db) =>
          (
            await db.query(
              `select from_address, headers from captured_mail where company_id = $1 and $2 = any(to_addresses) and subject like 'Your handover packet%' order by received_at desc limit 1`,
              [company.id, company.users.homeowner.email],
            )
          ).rows[0],
      );
      if (!mail) await new Promise((resolve) => setTimeout(resolve, 300));
    }
    expect(mail, 'the packet e-mail was not captured').toBeDefined();
    expect(mail!.from_address).toMatch(/^"?Brindlecove Outdoor Sound"? <.+@.+>$/);
    expect(mail!.headers['reply-to']).toBe('hello@brindlecove.example');
  }, 240_000);
});
