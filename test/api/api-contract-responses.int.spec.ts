import { randomBytes, randomUUID } from 'node:crypto';

import type { NestExpressApplication } from '@nestjs/platform-express';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import type { ApiContractSpec } from '../../api/src/common/api-contract.decorator.js';
import { DEMO_AS_BUILT } from '../../api/src/domain/as-built/demo-as-built.js';
import { contractRoutes, expectAnswerMatchesContract } from '../support/contract.js';
import { createCompany, TEST_PASSWORD, type TestCompany } from '../support/fixtures.js';
import { type Api, apiAs, createJob, createSite, insertRecordedJob, siteVersion } from '../support/records.js';
import { bearer, type Session, signIn } from '../support/session.js';
import { createTestApp } from '../support/test-app.js';
import { ROUTES_WITHOUT_CONTRACT_YET } from './api-contract-document.int.spec.js';

/**
 * Issue 20: real answers against their contracts. A sample of every GET route (on arranged records and
 * the demo as-built) and the main writes are called as the office, and each body is parsed with the
 * route's zod schema: a field the API sends that the schema lacks, a missing one or a wrong type fails.
 */
type Method = 'get' | 'post' | 'put' | 'patch' | 'delete';

interface Sample {
  path: string;
  body?: object;
  headers?: Record<string, string>;
  /** Who calls: the office unless said otherwise. */
  as?: 'office' | 'admin' | 'homeowner' | 'anonymous';
}

describe('API answers match their contracts', () => {
  let app: NestExpressApplication;
  let company: TestCompany;
  let office: Api;
  const sessions = new Map<string, Session>();
  let contracts: Map<string, ApiContractSpec | undefined>;
  let siteId: string;
  let customerId: string;
  let jobId: string;

  beforeAll(async () => {
    app = await createTestApp();
    contracts = contractRoutes(app);
    company = await createCompany('Contract Co');
    for (const role of ['office', 'admin', 'homeowner'] as const) sessions.set(role, await signIn(app, company.users[role]));
    office = apiAs(app, sessions.get('office')!);
    ({ siteId, customerId } = await createSite(office, DEMO_AS_BUILT.site));
    await office.expectOk('post', `/api/sites/${siteId}/reference-points`, { label: 'Gate post', x: 1, y: 2 }, { 'If-Match': `"${await siteVersion(office, siteId)}"` });
    await office.expectOk('post', `/api/sites/${siteId}/homeowners`, { userId: company.users.homeowner.id });
    jobId = (await insertRecordedJob(company, siteId, { crewLeadUserId: company.users.lead.id, technicianUserIds: [company.users.tech.id] }, DEMO_AS_BUILT)).id;
    await createJob(office, siteId);
  });

  afterAll(async () => {
    await app?.close();
  });

  /** One sample per GET route, in the matrix's notation; arranged in beforeAll. */
  const gets: Record<string, () => Sample> = {
    'GET /api/health': () => ({ path: '/api/health', as: 'anonymous' }),
    'GET /api/auth/me': () => ({ path: '/api/auth/me' }),
    // Only the e-mailed link knows a live token: an unknown one answers the error shape.
    'GET /api/auth/invitations/:token': () => ({ path: `/api/auth/invitations/${randomBytes(32).toString('base64url')}`, as: 'anonymous' }),
    'GET /api/users': () => ({ path: '/api/users?pageSize=5' }),
    'GET /api/invitations': () => ({ path: '/api/invitations' }),
    'GET /api/customers': () => ({ path: '/api/customers?q=Fixture' }),
    'GET /api/customers/:id': () => ({ path: `/api/customers/${customerId}` }),
    'GET /api/sites': () => ({ path: '/api/sites' }),
    'GET /api/sites/:id': () => ({ path: `/api/sites/${siteId}` }),
    'GET /api/sites/:siteId/features': () => ({ path: `/api/sites/${siteId}/features` }),
    // No plan image was uploaded: the error shape (the upload and its answer are in site-plan-image).
    'GET /api/sites/:siteId/plan-image': () => ({ path: `/api/sites/${siteId}/plan-image` }),
  };

  async function call(method: Method, route: string, sample: Sample) {
    let req = request(app.getHttpServer())[method](sample.path);
    const session = sessions.get(sample.as ?? 'office');
    if (session && sample.as !== 'anonymous') req = req.set(bearer(session));
    for (const [name, value] of Object.entries(sample.headers ?? {})) req = req.set(name, value);
    const res = sample.body === undefined ? await req : await req.send(sample.body);
    expectAnswerMatchesContract(contracts.get(route), route, res);
    return res;
  }

  it('has a sample for every GET route with a contract', () => {
    const pending = new Set(ROUTES_WITHOUT_CONTRACT_YET);
    const missing = [...contracts.keys()].filter((route) => route.startsWith('GET ') && !pending.has(route) && !(route in gets));
    expect(missing).toEqual([]);
  });

  it.each(Object.keys(gets))('%s', async (route) => {
    await call('get', route, gets[route]!());
  });

  it('customer writes answer their contracts', async () => {
    const created = await call('post', 'POST /api/customers', { path: '/api/customers', body: { name: 'Contract Customer', email: 'Owner@Contract.Example' } });
    expect(created.status).toBe(201);
    const id = created.body.id as string;
    expect((await call('patch', 'PATCH /api/customers/:id', { path: `/api/customers/${id}`, body: { phone: '555 0100' } })).status).toBe(200);
    expect((await call('patch', 'PATCH /api/customers/:id', { path: `/api/customers/${id}`, body: { email: 'not an address' } })).status).toBe(400);
    expect((await call('delete', 'DELETE /api/customers/:id', { path: `/api/customers/${id}` })).status).toBe(204);
  });

  it('site writes answer their contracts', async () => {
    const { siteId: site } = await createSite(office);
    const ifMatch = async () => ({ 'If-Match': `"${await siteVersion(office, site)}"` });
    expect((await call('patch', 'PATCH /api/sites/:id', { path: `/api/sites/${site}`, body: { notes: 'Dog in the yard' }, headers: await ifMatch() })).status).toBe(200);
    const point = await call('post', 'POST /api/sites/:siteId/reference-points', { path: `/api/sites/${site}/reference-points`, body: { label: 'Corner', x: 0, y: 0 }, headers: await ifMatch() });
    expect(point.status).toBe(201);
    expect(
      (await call('patch', 'PATCH /api/sites/:siteId/reference-points/:pointId', { path: `/api/sites/${site}/reference-points/${point.body.id}`, body: { x: 2 }, headers: await ifMatch() })).status,
    ).toBe(200);
    expect((await call('delete', 'DELETE /api/sites/:siteId/reference-points/:pointId', { path: `/api/sites/${site}/reference-points/${point.body.id}`, headers: await ifMatch() })).status).toBe(200);
    const feature = await call('post', 'POST /api/sites/:siteId/features', {
      path: `/api/sites/${site}/features`,
      body: { kind: 'fence', name: 'Fence', shape: 'line', points: [{ x: 0, y: 0 }, { x: 5, y: 0 }] },
      headers: await ifMatch(),
    });
    expect(feature.status).toBe(201);
    expect((await call('patch', 'PATCH /api/sites/:siteId/features/:featureId', { path: `/api/sites/${site}/features/${feature.body.id}`, body: { name: 'North fence' }, headers: await ifMatch() })).status).toBe(200);
    expect((await call('delete', 'DELETE /api/sites/:siteId/features/:featureId', { path: `/api/sites/${site}/features/${feature.body.id}`, headers: await ifMatch() })).status).toBe(200);
    expect((await call('post', 'POST /api/sites/:siteId/homeowners', { path: `/api/sites/${site}/homeowners`, body: { userId: company.users.homeowner.id } })).status).toBe(201);
    expect((await call('delete', 'DELETE /api/sites/:siteId/homeowners/:userId', { path: `/api/sites/${site}/homeowners/${company.users.homeowner.id}` })).status).toBe(204);
    expect((await call('delete', 'DELETE /api/sites/:id', { path: `/api/sites/${site}` })).status).toBe(204);
  });

  it('account writes answer their contracts', async () => {
    const invitation = await call('post', 'POST /api/invitations', { path: '/api/invitations', body: { email: `new.${randomUUID()}@contract.example`, role: 'tech' } });
    expect(invitation.status).toBe(201);
    expect((await call('post', 'POST /api/invitations/:id/resend', { path: `/api/invitations/${invitation.body.id}/resend` })).status).toBe(202);
    expect((await call('delete', 'DELETE /api/invitations/:id', { path: `/api/invitations/${invitation.body.id}` })).status).toBe(204);
    expect((await call('patch', 'PATCH /api/users/:id', { path: `/api/users/${company.users.tech.id}`, body: { name: 'Renamed Tech' }, as: 'admin' })).status).toBe(200);
    const signedIn = await call('post', 'POST /api/auth/sign-in', { path: '/api/auth/sign-in', body: { email: company.users.tech.email, password: TEST_PASSWORD }, as: 'anonymous' });
    expect(signedIn.status).toBe(200);
    expect((await call('post', 'POST /api/auth/password-reset', { path: '/api/auth/password-reset', body: { email: `nobody.${randomUUID()}@contract.example` }, as: 'anonymous' })).status).toBe(202);
    expect((await call('post', 'POST /api/auth/sign-out', { path: '/api/auth/sign-out', as: 'anonymous' })).status).toBe(204);
  });

  it('a job on the demo as-built exists for the job routes', () => {
    expect(jobId).toBeTruthy();
  });
});
