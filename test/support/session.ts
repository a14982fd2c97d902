import type { NestExpressApplication } from '@nestjs/platform-express';
import request from 'supertest';

import { TEST_PASSWORD, type TestUser } from './fixtures.js';

export interface Session {
  accessToken: string;
  /** The `Cookie` header value carrying the refresh token. */
  refreshCookie: string;
}

/** Signs in through the real endpoint and returns the access token and refresh cookie. */
export async function signIn(app: NestExpressApplication, user: Pick<TestUser, 'email'>, password = TEST_PASSWORD): Promise<Session> {
  const res = await request(app.getHttpServer()).post('/api/auth/sign-in').send({ email: user.email, password });
  if (res.status !== 200) throw new Error(`sign-in as ${user.email} failed: ${res.status} ${JSON.stringify(res.body)}`);
  return { accessToken: res.body.accessToken as string, refreshCookie: refreshCookieOf(res.headers['set-cookie']) };
}

export function refreshCookieOf(setCookie: string | string[] | undefined): string {
  const cookies = Array.isArray(setCookie) ? setCookie : setCookie ? [setCookie] : [];
  const cookie = cookies.find((c) => c.startsWith('loamline_refresh='));
  if (!cookie) throw new Error('no refresh cookie was set');
  return cookie.split(';')[0]!;
}

export function bearer(session: Session): { Authorization: string } {
  return { Authorization: `Bearer ${session.accessToken}` };
}
