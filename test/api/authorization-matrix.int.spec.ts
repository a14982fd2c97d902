import { randomBytes, randomUUID } from 'node:crypto';

import type { NestExpressApplication } from '@nestjs/platform-express';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { DEMO_AS_BUILT } from '../../api/src/domain/as-built/demo-as-built.js';
import { ROLES, type Role } from '../../api/src/domain/auth/roles.js';
import { createCompany, createUser, TEST_PASSWORD, type TestCompany, withDb } from '../support/fixtures.js';
import { bearer, type Session, signIn } from '../support/session.js';
import { createTestApp } from '../support/test-app.js';

/**
 * Every API route, called as a signed-out visitor, as each role of company A, and as the admin of
 * company B aimed at company A's records. Each cell is the exact status expected. A route that exists
 * but is missing here (or listed here but gone) fails the first test: add new routes to this table.
 */
type Caller = 'anonymous' | Role | 'otherCompany';
type Expectation = Record<Caller, number>;

interface Call {
  path: string;
  body?: object;
}

interface RouteCase {
  expect: Expectation;
  /** Builds the request; may arrange fresh records so that each call stands alone. */
  call: () => Promise<Call> | Call;
  /** For lists: company A's ids must not appear in what company B's admin receives. */
  isList?: boolean;
}

const CALLERS: Caller[] = ['anonymous', ...ROLES, 'otherCompany'];

const everyone = (status: number): Expectation =>
  Object.fromEntries(CALLERS.map((c) => [c, status])) as Expectation;

const signedIn = (status: number): Expectation => ({ ...everyone(status), anonymous: 401 });

const only = (roles: Role[], ok: number, otherCompany: number): Expectation => ({
  ...(Object.fromEntries(CALLERS.map((c) => [c, 403])) as Expectation),
  anonymous: 401,
  ...Object.fromEntries(roles.map((r) => [r, ok])),
  otherCompany,
});

describe('authorization matrix', () => {
  let app: NestExpressApplication;
  let a: TestCompany;
  let b: TestCompany;
  const sessions = new Map<Caller, Session>();

  async function capturedMailWithAttachment(companyId: string) {
    return withDb(async (db) => {
      const mail = await db.query(
        `insert into captured_mail (company_id, from_address, to_addresses, subject, headers, size_bytes)
         values ($1, 'sender@loamline.example', array['someone@example.net'], 'fixture', '{}'::jsonb, 1) returning id`,
        [companyId],
      );
      const attachment = await db.query(
        `insert into captured_mail_attachments (mail_id, filename, content_type, size_bytes, content)
         values ($1, 'note.txt', 'text/plain', 5, $2) returning id`,
        [mail.rows[0].id, Buffer.from('hello')],
      );
      return { mailId: mail.rows[0].id as string, attachmentId: attachment.rows[0].id as string };
    });
  }

  async function invitationIn(companyId: string) {
    return withDb(async (db) => {
      const { rows } = await db.query(
        `insert into invitations (company_id, email, role, token_hash, expires_at)
         values ($1, $2, 'tech', $3, now() + interval '1 day') returning id`,
        [companyId, `invitee.${randomUUID()}@matrix.example`, randomBytes(16).toString('hex')],
      );
      return rows[0].id as string;
    });
  }

  const routes: Record<string, RouteCase> = {
    'GET /api/health': { expect: everyone(200), call: () => ({ path: '/api/health' }) },
    'POST /api/auth/sign-in': {
      expect: everyone(200),
      call: () => ({ path: '/api/auth/sign-in', body: { email: a.users.tech.email, password: TEST_PASSWORD } }),
    },
    'POST /api/auth/refresh': { expect: everyone(401), call: () => ({ path: '/api/auth/refresh' }) },
    'POST /api/auth/sign-out': { expect: everyone(204), call: () => ({ path: '/api/auth/sign-out' }) },
    'GET /api/auth/me': { expect: signedIn(200), call: () => ({ path: '/api/auth/me' }) },
    'GET /api/auth/invitations/:token': {
      expect: everyone(404),
      call: () => ({ path: `/api/auth/invitations/${randomBytes(32).toString('base64url')}` }),
    },
    'POST /api/auth/invitations/accept': {
      expect: everyone(404),
      call: () => ({
        path: '/api/auth/invitations/accept',
        body: { token: randomBytes(32).toString('base64url'), name: 'Someone', password: 'long-enough-password' },
      }),
    },
    'POST /api/auth/password-reset': {
      expect: everyone(202),
      call: () => ({ path: '/api/auth/password-reset', body: { email: `nobody.${randomUUID()}@matrix.example` } }),
    },
    'POST /api/auth/password-reset/confirm': {
      expect: everyone(404),
      call: () => ({
        path: '/api/auth/password-reset/confirm',
        body: { token: randomBytes(32).toString('base64url'), password: 'long-enough-password' },
      }),
    },
    'GET /api/users': { expect: only(['admin', 'office'], 200, 200), isList: true, call: () => ({ path: '/api/users' }) },
    'PATCH /api/users/:id': {
      expect: only(['admin'], 200, 404),
      call: async () => ({ path: `/api/users/${(await createUser(a.id, 'tech')).id}`, body: { name: 'Renamed Person' } }),
    },
    'GET /api/invitations': {
      expect: only(['admin', 'office'], 200, 200),
      isList: true,
      call: () => ({ path: '/api/invitations' }),
    },
    'POST /api/invitations': {
      expect: only(['admin', 'office'], 201, 201),
      call: () => ({ path: '/api/invitations', body: { email: `new.${randomUUID()}@matrix.example`, role: 'tech' } }),
    },
    'DELETE /api/invitations/:id': {
      expect: only(['admin', 'office'], 204, 404),
      call: async () => ({ path: `/api/invitations/${await invitationIn(a.id)}` }),
    },
    'POST /api/analysis': {
      expect: only(['admin', 'office', 'lead', 'tech'], 200, 200),
      call: () => ({ path: '/api/analysis', body: { asBuilt: DEMO_AS_BUILT } }),
    },
    'GET /api/outbox': { expect: only(['admin'], 200, 200), isList: true, call: () => ({ path: '/api/outbox' }) },
    'GET /api/outbox/:id': {
      expect: only(['admin'], 200, 404),
      call: async () => ({ path: `/api/outbox/${(await capturedMailWithAttachment(a.id)).mailId}` }),
    },
    'GET /api/outbox/:id/attachments/:attachmentId': {
      expect: only(['admin'], 200, 404),
      call: async () => {
        const { mailId, attachmentId } = await capturedMailWithAttachment(a.id);
        return { path: `/api/outbox/${mailId}/attachments/${attachmentId}` };
      },
    },
  };

  beforeAll(async () => {
    app = await createTestApp();
    a = await createCompany('Matrix A');
    b = await createCompany('Matrix B');
    for (const role of ROLES) sessions.set(role, await signIn(app, a.users[role]));
    sessions.set('otherCompany', await signIn(app, b.users.admin));
    await invitationIn(a.id);
    await capturedMailWithAttachment(a.id);
  });

  afterAll(async () => {
    await app.close();
  });

  it('should cover exactly the routes the API serves', () => {
    const express = app.getHttpAdapter().getInstance() as { router: { stack: { route?: { path: string; methods: Record<string, boolean> } }[] } };
    const served = express.router.stack
      .flatMap((layer) => (layer.route ? Object.keys(layer.route.methods).map((m) => `${m.toUpperCase()} ${layer.route!.path}`) : []))
      .filter((route) => !/ \/api\/docs/.test(route));
    expect(new Set(served)).toEqual(new Set(Object.keys(routes)));
  });

  describe.each(Object.entries(routes))('%s', (route, spec) => {
    const method = route.split(' ')[0]!.toLowerCase() as 'get' | 'post' | 'patch' | 'delete' | 'put';

    it.each(CALLERS)('as %s', async (caller) => {
      const { path, body } = await spec.call();
      let req = request(app.getHttpServer())[method](path);
      const session = sessions.get(caller);
      if (session) req = req.set(bearer(session));
      const res = body ? await req.send(body) : await req;
      expect(res.status, JSON.stringify(res.body)).toBe(spec.expect[caller]);
      if (caller === 'otherCompany' && spec.isList) {
        const text = JSON.stringify(res.body);
        for (const user of Object.values(a.users)) {
          expect(text).not.toContain(user.id);
          expect(text).not.toContain(user.email);
        }
        expect(text).not.toContain(a.id);
      }
    });
  });
});
