import { randomUUID } from 'node:crypto';

import type { NestExpressApplication } from '@nestjs/platform-express';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import type { Role } from '../../api/src/domain/auth/roles.js';
import { apiAs, createJob, createSite } from '../support/records.js';
import { bearer, type Session } from '../support/session.js';
import { inviteAndAccept, type SignedUpCompany, signUpCompany } from '../support/signup.js';
import { createTestApp } from '../support/test-app.js';

// Tenant isolation through the real flow (issue 14): two companies made by public sign-up, every role
// joined by e-mail invitation, and no id of one company works in the other, for any role. An address
// with an account in one company is not revealed to the other by sign-up, invitation or reset.

const INVITED: Role[] = ['office', 'lead', 'tech', 'homeowner'];

interface Tenant {
  company: SignedUpCompany;
  sessions: Record<Role, Session>;
  emails: Record<Role, string>;
  ids: { customer: string; site: string; job: string; user: string; invitation: string };
}

describe('tenant isolation through sign-up and invitations', () => {
  let app: NestExpressApplication;
  const http = () => request(app.getHttpServer());
  const tenants: Tenant[] = [];

  async function makeTenant(label: string): Promise<Tenant> {
    const company = await signUpCompany(app, label);
    const sessions = { admin: company.admin.session } as Record<Role, Session>;
    const emails = { admin: company.admin.email } as Record<Role, string>;
    const people = await Promise.all(INVITED.map((role) => inviteAndAccept(app, company.admin.session, role)));
    for (const person of people) {
      sessions[person.role] = person.session;
      emails[person.role] = person.email;
    }
    const office = apiAs(app, sessions.office);
    const { customerId, siteId } = await createSite(office);
    const job = await createJob(office, siteId);
    const pending = await office.expectOk('post', '/api/invitations', { email: `pending.${randomUUID().slice(0, 8)}@tenant.example`, role: 'tech' });
    return {
      company,
      sessions,
      emails,
      ids: { customer: customerId, site: siteId, job: job.id, user: people.find((p) => p.role === 'tech')!.id, invitation: pending.id },
    };
  }

  // Each person arrives by an e-mailed link through the account-mail queue: allow for a loaded machine.
  beforeAll(async () => {
    app = await createTestApp();
    tenants.push(...(await Promise.all([makeTenant('Tenant North'), makeTenant('Tenant South')])));
  }, 240_000);

  afterAll(async () => {
    await app.close();
  });

  it('should give each company its own admin and every role, all signed in through e-mailed links', async () => {
    for (const tenant of tenants) {
      const users = await http().get('/api/users').set(bearer(tenant.sessions.admin)).expect(200);
      const roles = (users.body.items as { role: Role }[]).map((u) => u.role).sort();
      expect(roles).toEqual(['admin', 'homeowner', 'lead', 'office', 'tech']);
      for (const role of INVITED) {
        const me = await http().get('/api/auth/me').set(bearer(tenant.sessions[role])).expect(200);
        expect(me.body).toMatchObject({ role, companyId: tenant.company.id });
      }
    }
    expect(tenants[0]!.company.id).not.toBe(tenants[1]!.company.id);
  });

  it('should answer 404 to every role of one company that may use a route naming the other company’s ids (403 to the rest), and list none of them', async () => {
    const STAFF: Role[] = ['admin', 'office', 'lead', 'tech'];
    const OFFICE: Role[] = ['admin', 'office'];
    // [method, path, the roles that may use the route (they get 404; the others 403 before any lookup), body]
    const cases = (ids: Tenant['ids']) =>
      [
        ['get', `/api/customers/${ids.customer}`, STAFF],
        ['get', `/api/sites/${ids.site}`, STAFF],
        ['get', `/api/jobs/${ids.job}`, STAFF],
        ['patch', `/api/users/${ids.user}`, ['admin'], { name: 'Taken Over' }],
        ['delete', `/api/invitations/${ids.invitation}`, OFFICE],
        ['post', `/api/invitations/${ids.invitation}/resend`, OFFICE],
      ] as const;
    for (const [from, to] of [
      [tenants[0]!, tenants[1]!],
      [tenants[1]!, tenants[0]!],
    ] as const) {
      for (const role of ['admin', 'office', 'lead', 'tech', 'homeowner'] as const) {
        for (const [method, path, mayUse, body] of cases(to.ids)) {
          let req = http()[method](path).set(bearer(from.sessions[role]));
          if (body) req = req.send(body);
          const res = await req;
          expect(res.status, `${role} of ${from.company.name}: ${method.toUpperCase()} ${path}`).toBe((mayUse as readonly Role[]).includes(role) ? 404 : 403);
        }
      }
      // Lists carry none of the other company's ids.
      for (const path of ['/api/customers', '/api/users', '/api/invitations', '/api/jobs']) {
        const res = await http().get(path).set(bearer(from.sessions.admin)).expect(200);
        const text = JSON.stringify(res.body);
        for (const id of Object.values(to.ids)) expect(text, `${path} lists an id of ${to.company.name}`).not.toContain(id);
        expect(text).not.toContain(to.company.id);
      }
    }
    // Nothing was changed by the attempts.
    const other = await http().get(`/api/customers/${tenants[1]!.ids.customer}`).set(bearer(tenants[1]!.sessions.office)).expect(200);
    expect(other.body.id).toBe(tenants[1]!.ids.customer);
  });

  it('should not reveal, by sign-up, invitation or reset, that an address has an account in the other company', async () => {
    const [north, south] = tenants as [Tenant, Tenant];
    const known = north.emails.lead;
    const unknown = `nobody.${randomUUID().slice(0, 8)}@tenant.example`;

    const signUp = (email: string) =>
      http().post('/api/signup').send({ companyName: 'Probe Co', name: 'Probe', email, password: 'a-long-enough-password' });
    const [s1, s2] = [await signUp(known), await signUp(unknown)];
    expect([s1.status, s1.body.message]).toEqual([s2.status, s2.body.message]);

    const reset = (email: string) => http().post('/api/auth/password-reset').send({ email });
    const [r1, r2] = [await reset(known), await reset(unknown)];
    expect([r1.status, r1.body]).toEqual([r2.status, r2.body]);

    // South's office invites North's lead and a stranger: the answers have the same form.
    const invite = (email: string) => http().post('/api/invitations').set(bearer(south.sessions.office)).send({ email, role: 'tech' });
    const [i1, i2] = [await invite(known), await invite(`stranger.${randomUUID().slice(0, 8)}@tenant.example`)];
    expect(i1.status).toBe(i2.status);
    expect(Object.keys(i1.body).sort()).toEqual(Object.keys(i2.body).sort());
    expect(JSON.stringify(i1.body)).not.toContain(north.company.id);
    expect(JSON.stringify(i1.body)).not.toMatch(/already|taken|exists/i);
  });
});
