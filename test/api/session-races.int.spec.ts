import type { NestExpressApplication } from '@nestjs/platform-express';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { createCompany, createUser, type TestCompany, withDb } from '../support/fixtures.js';
import { refreshCookieOf, signIn } from '../support/session.js';
import { createTestApp } from '../support/test-app.js';

/**
 * Issue 18 §4: several tabs refreshing with the same cookie at once (a browser restoring its session)
 * must all stay signed in on one successor; a token presented again after the grace window is still
 * treated as stolen and ends the family.
 */
describe('refresh token grace window', () => {
  let app: NestExpressApplication;
  let company: TestCompany;
  const http = () => request(app.getHttpServer());

  beforeAll(async () => {
    app = await createTestApp();
    company = await createCompany('Session Race Co');
  });

  afterAll(async () => {
    await app.close();
  });

  async function familyRows(userId: string) {
    return withDb(async (db) => (await db.query('select family_id, replaced_at, revoked_at from refresh_sessions where user_id = $1', [userId])).rows);
  }

  it('should answer five parallel refreshes with one cookie all with 200 and the same successor', async () => {
    const user = await createUser(company.id, 'lead');
    const first = await signIn(app, user);

    const answers = await Promise.all(
      Array.from({ length: 5 }, () => http().post('/api/auth/refresh').set('Cookie', first.refreshCookie)),
    );

    expect(answers.map((a) => a.status)).toEqual([200, 200, 200, 200, 200]);
    const cookies = answers.map((a) => refreshCookieOf(a.headers['set-cookie']));
    expect(new Set(cookies).size).toBe(1);
    expect(cookies[0]).not.toBe(first.refreshCookie);
    for (const answer of answers) expect(answer.body.user.id).toBe(user.id);

    // One successor, not five family members; nothing revoked.
    const rows = await familyRows(user.id);
    expect(rows).toHaveLength(2);
    expect(new Set(rows.map((r) => r.family_id)).size).toBe(1);
    expect(rows.every((r) => r.revoked_at === null)).toBe(true);

    // The shared successor works and rotates normally.
    const next = await http().post('/api/auth/refresh').set('Cookie', cookies[0]!).expect(200);
    expect(refreshCookieOf(next.headers['set-cookie'])).not.toBe(cookies[0]);
    await http().get('/api/auth/me').set('Authorization', `Bearer ${next.body.accessToken}`).expect(200);
  });

  it('should lead a late tab along a chain of quick rotations to the live token', async () => {
    const user = await createUser(company.id, 'tech');
    const first = await signIn(app, user);
    const second = refreshCookieOf((await http().post('/api/auth/refresh').set('Cookie', first.refreshCookie).expect(200)).headers['set-cookie']);
    const third = refreshCookieOf((await http().post('/api/auth/refresh').set('Cookie', second).expect(200)).headers['set-cookie']);

    const late = await http().post('/api/auth/refresh').set('Cookie', first.refreshCookie).expect(200);
    expect(refreshCookieOf(late.headers['set-cookie'])).toBe(third);
  });

  it('should still revoke the whole family when a rotated token comes back after the window', async () => {
    const user = await createUser(company.id, 'office');
    const first = await signIn(app, user);
    const rotated = await http().post('/api/auth/refresh').set('Cookie', first.refreshCookie).expect(200);
    const second = refreshCookieOf(rotated.headers['set-cookie']);
    // The rotation happened longer ago than REFRESH_REUSE_GRACE_SECONDS (30 s by default).
    await withDb((db) =>
      db.query(`update refresh_sessions set replaced_at = now() - interval '31 seconds' where user_id = $1 and replaced_at is not null`, [user.id]),
    );

    const reused = await http().post('/api/auth/refresh').set('Cookie', first.refreshCookie).expect(401);
    expect(reused.body.code).toBe('REFRESH_TOKEN_REUSED');
    await http().post('/api/auth/refresh').set('Cookie', second).expect(401);
    expect((await familyRows(user.id)).every((r) => r.revoked_at !== null)).toBe(true);
  });

  it('should not hand out the successor of a token whose family has been signed out', async () => {
    const user = await createUser(company.id, 'lead');
    const first = await signIn(app, user);
    const second = refreshCookieOf((await http().post('/api/auth/refresh').set('Cookie', first.refreshCookie).expect(200)).headers['set-cookie']);
    await http().post('/api/auth/sign-out').set('Cookie', second).expect(204);

    const late = await http().post('/api/auth/refresh').set('Cookie', first.refreshCookie).expect(401);
    expect(late.body.code).toBe('SESSION_ENDED');
  });

  it('should keep only hashes: the successor cookie appears nowhere in the table in plain text', async () => {
    const user = await createUser(company.id, 'tech');
    const first = await signIn(app, user);
    const successor = refreshCookieOf((await http().post('/api/auth/refresh').set('Cookie', first.refreshCookie).expect(200)).headers['set-cookie']);
    const token = successor.slice('loamline_refresh='.length);
    const rows = await withDb(async (db) => (await db.query('select * from refresh_sessions where user_id = $1', [user.id])).rows);
    expect(JSON.stringify(rows)).not.toContain(token);
  });

  it('should sign the company user out of every session when disabled, and re-enabling revives none', async () => {
    const user = await createUser(company.id, 'tech');
    const phone = await signIn(app, user);
    const laptop = await signIn(app, user);
    const admin = await signIn(app, company.users.admin);

    await http().patch(`/api/users/${user.id}`).set('Authorization', `Bearer ${admin.accessToken}`).send({ isDisabled: true }).expect(200);
    await http().patch(`/api/users/${user.id}`).set('Authorization', `Bearer ${admin.accessToken}`).send({ isDisabled: false }).expect(200);

    await http().post('/api/auth/refresh').set('Cookie', phone.refreshCookie).expect(401);
    await http().post('/api/auth/refresh').set('Cookie', laptop.refreshCookie).expect(401);
    // Signing in again works once enabled.
    await signIn(app, user);
  });
});
