import { randomUUID } from 'node:crypto';

import type { NestExpressApplication } from '@nestjs/platform-express';
import request from 'supertest';

import type { Role } from '../../api/src/domain/auth/roles.js';
import { TEST_PASSWORD } from './fixtures.js';
import { findToken, waitForMail } from './mail.js';
import { bearer, refreshCookieOf, type Session } from './session.js';

export interface SignedUpCompany {
  id: string;
  name: string;
  admin: { id: string; email: string; session: Session };
}

/** Creates a company through the public sign-up: request, the verification e-mail, its link. */
export async function signUpCompany(app: NestExpressApplication, label: string): Promise<SignedUpCompany> {
  const suffix = randomUUID().slice(0, 8);
  const email = `founder.${suffix}@${label.toLowerCase().replace(/\W+/g, '-')}.example`;
  const name = `${label} ${suffix}`;
  const http = () => request(app.getHttpServer());
  const asked = await http().post('/api/signup').send({ companyName: name, name: `Founder ${suffix}`, email, password: TEST_PASSWORD });
  if (asked.status !== 202) throw new Error(`sign-up of ${name} → ${asked.status} ${JSON.stringify(asked.body)}`);
  const token = findToken(await waitForMail(email, { subject: 'Confirm your address', timeoutMs: 30_000 }), '/sign-up/verify');
  const verified = await http().post('/api/signup/verify').send({ token });
  if (verified.status !== 200) throw new Error(`verifying ${name} → ${verified.status} ${JSON.stringify(verified.body)}`);
  return {
    id: verified.body.user.companyId as string,
    name,
    admin: {
      id: verified.body.user.id as string,
      email,
      session: { accessToken: verified.body.accessToken as string, refreshCookie: refreshCookieOf(verified.headers['set-cookie']) },
    },
  };
}

/** Invites `role` into the admin's company and accepts the invitation from its e-mail; returns the new person's session. */
export async function inviteAndAccept(
  app: NestExpressApplication,
  admin: Session,
  role: Role,
  email = `${role}.${randomUUID().slice(0, 8)}@invited.example`,
): Promise<{ id: string; email: string; role: Role; session: Session }> {
  const http = () => request(app.getHttpServer());
  const invited = await http().post('/api/invitations').set(bearer(admin)).send({ email, role });
  if (invited.status !== 201) throw new Error(`inviting ${role} → ${invited.status} ${JSON.stringify(invited.body)}`);
  const token = findToken(await waitForMail(email, { timeoutMs: 30_000 }), '/accept-invitation');
  const accepted = await http().post('/api/auth/invitations/accept').send({ token, name: `Invited ${role}`, password: TEST_PASSWORD });
  if (accepted.status !== 200) throw new Error(`accepting ${role} → ${accepted.status} ${JSON.stringify(accepted.body)}`);
  return {
    id: accepted.body.user.id as string,
    email,
    role,
    session: { accessToken: accepted.body.accessToken as string, refreshCookie: refreshCookieOf(accepted.headers['set-cookie']) },
  };
}
