import { createHash } from 'node:crypto';

import type { NestExpressApplication } from '@nestjs/platform-express';
import { JwtService } from '@nestjs/jwt';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { PasswordResetRequests } from '../../api/src/auth/password-reset-requests.js';
import { createCompany, createUser, TEST_PASSWORD, type TestCompany, withDb } from '../support/fixtures.js';
import { findToken, waitForMail } from '../support/mail.js';
import { bearer, refreshCookieOf, signIn } from '../support/session.js';
import { createTestApp } from '../support/test-app.js';

describe('auth', () => {
  let app: NestExpressApplication;
  let company: TestCompany;
  const http = () => request(app.getHttpServer());

  beforeAll(async () => {
    app = await createTestApp();
    company = await createCompany('Auth Test Co');
  });

  afterAll(async () => {
    await app.close();
  });

  describe('POST /api/auth/sign-in', () => {
    it('should return an access token and set an httpOnly, SameSite=Strict refresh cookie', async () => {
      const res = await http()
        .post('/api/auth/sign-in')
        .send({ email: company.users.office.email.toUpperCase(), password: TEST_PASSWORD })
        .expect(200);
      expect(res.body.user).toMatchObject({ email: company.users.office.email, role: 'office', companyId: company.id });
      expect(typeof res.body.accessToken).toBe('string');
      const cookie = ([] as string[]).concat(res.headers['set-cookie'] ?? []).find((c) => c.startsWith('loamline_refresh='));
      expect(cookie).toMatch(/HttpOnly/i);
      expect(cookie).toMatch(/SameSite=Strict/i);
      expect(cookie).toMatch(/Path=\/api\/auth/i);
    });

    it('should give the same answer for an unknown e-mail and a wrong password', async () => {
      const unknown = await http().post('/api/auth/sign-in').send({ email: 'nobody@nowhere.example', password: 'whatever-123' });
      const wrong = await http().post('/api/auth/sign-in').send({ email: company.users.tech.email, password: 'not-the-password' });
      expect(unknown.status).toBe(401);
      expect(wrong.status).toBe(401);
      expect(unknown.body).toEqual(wrong.body);
    });

    it('should answer 400 naming the field when the e-mail is missing', async () => {
      const res = await http().post('/api/auth/sign-in').send({ password: 'x' }).expect(400);
      expect(res.body.issues.map((i: { path: string }) => i.path)).toContain('email');
    });

    it('should refuse a disabled user with the same answer as a bad password', async () => {
      const user = await createUser(company.id, 'tech');
      await withDb((db) => db.query('update users set is_disabled = true where id = $1', [user.id]));
      const res = await http().post('/api/auth/sign-in').send({ email: user.email, password: TEST_PASSWORD }).expect(401);
      expect(res.body.code).toBe('SIGN_IN_FAILED');
    });

    it('should refuse the tenth rapid failed sign-in to one account with 429', async () => {
      const user = await createUser(company.id, 'lead');
      const statuses: number[] = [];
      for (let i = 0; i < 10; i++) {
        statuses.push((await http().post('/api/auth/sign-in').send({ email: user.email, password: `wrong-${i}` })).status);
      }
      expect(statuses.slice(0, 9)).toEqual(Array(9).fill(401));
      expect(statuses[9]).toBe(429);
    });
  });

  describe('access tokens', () => {
    it('should answer 401 to a request without a token', async () => {
      await http().get('/api/auth/me').expect(401);
    });

    it('should answer 401 to an expired access token', async () => {
      const jwt = app.get(JwtService);
      const expired = await jwt.signAsync(
        { sub: company.users.admin.id, cid: company.id, role: 'admin', exp: Math.floor(Date.now() / 1000) - 60 },
      );
      await http().get('/api/auth/me').set('Authorization', `Bearer ${expired}`).expect(401);
    });

    it('should answer 401 to a token signed with another secret', async () => {
      const forged = await new JwtService({ secret: 'x'.repeat(40) }).signAsync({ sub: company.users.admin.id, role: 'admin' });
      await http().get('/api/auth/me').set('Authorization', `Bearer ${forged}`).expect(401);
    });

    it('should stop accepting the token of a user who has been disabled', async () => {
      const user = await createUser(company.id, 'office');
      const session = await signIn(app, user);
      await http().get('/api/auth/me').set(bearer(session)).expect(200);
      await withDb((db) => db.query('update users set is_disabled = true where id = $1', [user.id]));
      await http().get('/api/auth/me').set(bearer(session)).expect(401);
    });
  });

  describe('POST /api/auth/refresh', () => {
    it('should rotate the refresh token and revoke the family when an old one is reused', async () => {
      const user = await createUser(company.id, 'lead');
      const first = await signIn(app, user);

      const rotated = await http().post('/api/auth/refresh').set('Cookie', first.refreshCookie).expect(200);
      const second = refreshCookieOf(rotated.headers['set-cookie']);
      expect(second).not.toBe(first.refreshCookie);
      expect(rotated.body.user.id).toBe(user.id);
      // Past the grace window in which a just-rotated token returns the same successor (session-races.int.spec.ts).
      await withDb((db) =>
        db.query(`update refresh_sessions set replaced_at = now() - interval '1 minute' where user_id = $1 and replaced_at is not null`, [user.id]),
      );

      const reused = await http().post('/api/auth/refresh').set('Cookie', first.refreshCookie).expect(401);
      expect(reused.body.code).toBe('REFRESH_TOKEN_REUSED');
      // The legitimate holder of the newer token is signed out too: the whole family is revoked.
      await http().post('/api/auth/refresh').set('Cookie', second).expect(401);

      const audit = await withDb((db) =>
        db.query(`select count(*)::int as n from audit_log where action = 'session.reuse_detected' and target_id = $1`, [user.id]),
      );
      expect(audit.rows[0].n).toBe(1);
    });

    it('should end the session on sign-out', async () => {
      const session = await signIn(app, company.users.tech);
      await http().post('/api/auth/sign-out').set('Cookie', session.refreshCookie).expect(204);
      await http().post('/api/auth/refresh').set('Cookie', session.refreshCookie).expect(401);
    });
  });

  describe('invitations', () => {
    it('should e-mail a single-use link that creates the account and signs in', async () => {
      const admin = await signIn(app, company.users.admin);
      const email = `new.lead.${Date.now()}@invited.example`;
      const created = await http().post('/api/invitations').set(bearer(admin)).send({ email, role: 'lead', name: 'Nova Lead' }).expect(201);
      // The e-mail is queued, not sent in the request.
      expect(created.body.mail).toMatchObject({ status: 'queued', attempts: 0 });

      const mail = await waitForMail(email);
      expect(mail.companyId).toBe(company.id);
      expect(mail.subject).toContain(company.name);
      expect(mail.html).toContain('Crew lead');
      const token = findToken(mail, '/accept-invitation');

      const preview = await http().get(`/api/auth/invitations/${token}`).expect(200);
      expect(preview.body).toMatchObject({ email, role: 'lead', companyName: company.name });

      const accepted = await http()
        .post('/api/auth/invitations/accept')
        .send({ token, name: 'Nova Lead', password: 'a-long-new-password' })
        .expect(200);
      expect(accepted.body.user).toMatchObject({ email, role: 'lead', companyId: company.id });
      refreshCookieOf(accepted.headers['set-cookie']);

      const again = await http()
        .post('/api/auth/invitations/accept')
        .send({ token, name: 'Someone Else', password: 'another-password' })
        .expect(404);
      expect(again.body.code).toBe('LINK_NOT_VALID');
      await signIn(app, { email }, 'a-long-new-password');
    });

    it('should refuse an expired invitation', async () => {
      const admin = await signIn(app, company.users.admin);
      const email = `late.${Date.now()}@invited.example`;
      await http().post('/api/invitations').set(bearer(admin)).send({ email, role: 'tech' }).expect(201);
      const token = findToken(await waitForMail(email), '/accept-invitation');
      await withDb((db) => db.query(`update invitations set expires_at = now() - interval '1 minute' where email = $1`, [email]));
      await http().get(`/api/auth/invitations/${token}`).expect(404);
      await http().post('/api/auth/invitations/accept').send({ token, name: 'Late', password: 'a-long-new-password' }).expect(404);
    });

    it('should not let office invite an admin', async () => {
      const office = await signIn(app, company.users.office);
      const res = await http().post('/api/invitations').set(bearer(office)).send({ email: 'boss@invited.example', role: 'admin' });
      expect(res.status).toBe(403);
    });

    it('should answer 400 naming the field for a bad e-mail or role', async () => {
      const admin = await signIn(app, company.users.admin);
      const res = await http().post('/api/invitations').set(bearer(admin)).send({ email: 'not-an-email', role: 'boss' }).expect(400);
      expect(res.body.issues.map((i: { path: string }) => i.path).sort()).toEqual(['email', 'role']);
    });
  });

  describe('password reset', () => {
    it('should e-mail a single-use link that sets a new password and ends other sessions', async () => {
      const user = await createUser(company.id, 'office');
      const before = await signIn(app, user);
      await http().post('/api/auth/password-reset').send({ email: user.email }).expect(202);
      const token = findToken(await waitForMail(user.email), '/reset-password');

      await http().post('/api/auth/password-reset/confirm').send({ token, password: 'brand-new-password' }).expect(204);
      await http().post('/api/auth/password-reset/confirm').send({ token, password: 'second-try-password' }).expect(404);
      await http().post('/api/auth/refresh').set('Cookie', before.refreshCookie).expect(401);
      await http().post('/api/auth/sign-in').send({ email: user.email, password: TEST_PASSWORD }).expect(401);
      await signIn(app, user, 'brand-new-password');
    });

    it('should give the same answer for an unknown address and send nothing', async () => {
      const email = 'nobody.here@nowhere.example';
      const known = await http().post('/api/auth/password-reset').send({ email: (await createUser(company.id, 'tech')).email });
      const res = await http().post('/api/auth/password-reset').send({ email }).expect(202);
      expect(res.body.message).toMatch(/if that address has an account/i);
      expect({ status: res.status, body: res.body }).toEqual({ status: known.status, body: known.body });
      // Once the requests are worked (in the background, for both alike), nothing was queued for it.
      await app.get(PasswordResetRequests).idle();
      const counts = await withDb(async (db) =>
        (
          await db.query(
            `select (select count(*)::int from outgoing_mail where to_address = $1) as queued,
                    (select count(*)::int from captured_mail where $1 = any(to_addresses)) as sent`,
            [email],
          )
        ).rows[0],
      );
      expect(counts).toEqual({ queued: 0, sent: 0 });
    });

    it('should keep only the hash of the mailed link token, and the token itself nowhere', async () => {
      const user = await createUser(company.id, 'lead');
      await http().post('/api/auth/password-reset').send({ email: user.email }).expect(202);
      const token = findToken(await waitForMail(user.email), '/reset-password');
      const rows = await withDb(async (db) =>
        (await db.query(`select token_hash from password_reset_tokens where user_id = $1`, [user.id])).rows,
      );
      // Only the hash of the mailed token is kept, and no table holds the token itself.
      expect(rows).toEqual([{ token_hash: createHash('sha256').update(token).digest('hex') }]);
      const leaked = await withDb(async (db) =>
        (await db.query(`select count(*)::int as n from outgoing_mail where data::text like '%' || $1 || '%'`, [token])).rows[0].n,
      );
      expect(leaked).toBe(0);
    });

    it('should refuse an expired reset link', async () => {
      const user = await createUser(company.id, 'tech');
      await http().post('/api/auth/password-reset').send({ email: user.email }).expect(202);
      const token = findToken(await waitForMail(user.email), '/reset-password');
      await withDb((db) => db.query(`update password_reset_tokens set expires_at = now() - interval '1 second' where user_id = $1`, [user.id]));
      await http().post('/api/auth/password-reset/confirm').send({ token, password: 'brand-new-password' }).expect(404);
    });
  });

  describe('users', () => {
    it('should let an admin change a role and disable an account, and audit both', async () => {
      const admin = await signIn(app, company.users.admin);
      const user = await createUser(company.id, 'tech');
      const res = await http().patch(`/api/users/${user.id}`).set(bearer(admin)).send({ role: 'lead', isDisabled: true }).expect(200);
      expect(res.body).toMatchObject({ id: user.id, role: 'lead', isDisabled: true });
      const audit = await withDb((db) =>
        db.query(`select actor_user_id from audit_log where action = 'user.update' and target_id = $1`, [user.id]),
      );
      expect(audit.rows).toEqual([{ actor_user_id: company.users.admin.id }]);
    });

    it('should not let an admin disable themselves', async () => {
      const admin = await signIn(app, company.users.admin);
      await http().patch(`/api/users/${company.users.admin.id}`).set(bearer(admin)).send({ isDisabled: true }).expect(403);
    });
  });
});
