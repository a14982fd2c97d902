import { createSecretKey } from 'node:crypto';

import { Injectable } from '@nestjs/common';
import { ConfigService } from '@nestjs/config';
import { PassportStrategy } from '@nestjs/passport';
import { ExtractJwt, Strategy } from 'passport-jwt';

import type { AuthUser } from '../common/decorators/current-user.decorator.js';
import type { Env } from '../config/env.schema.js';
import { type AccessTokenPayload, AuthService } from './auth.service.js';

/** Bearer access tokens (HS256, short-lived); the account is re-checked on every request. */
@Injectable()
export class JwtStrategy extends PassportStrategy(Strategy, 'jwt') {
  constructor(
    config: ConfigService<Env, true>,
    private readonly authService: AuthService,
  ) {
    super({
      jwtFromRequest: ExtractJwt.fromAuthHeaderAsBearerToken(),
      ignoreExpiration: false,
      // A KeyObject, made once: given the secret as a string, jsonwebtoken first tries it as a PEM public
      // key on every verify (createPublicKey throws, the error is built and caught) before making the
      // same secret key from its UTF-8 bytes — about a tenth of the API's CPU on a signed-in read under
      // load. The key is the one jsonwebtoken would make; the types only name string | Buffer.
      secretOrKey: createSecretKey(Buffer.from(config.get('JWT_ACCESS_SECRET', { infer: true }), 'utf8')) as unknown as Buffer,
      algorithms: ['HS256'],
    });
  }

  validate(payload: AccessTokenPayload): Promise<AuthUser> {
    return this.authService.validateAccessToken(payload);
  }
}
