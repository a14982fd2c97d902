import { Injectable } from '@nestjs/common';
import { PassportStrategy } from '@nestjs/passport';
import { Strategy } from 'passport-local';

import type { UserWithCompany } from './auth.repository.js';
import { AuthService } from './auth.service.js';

/** E-mail and password from the sign-in form. */
@Injectable()
export class LocalStrategy extends PassportStrategy(Strategy, 'local') {
  constructor(private readonly authService: AuthService) {
    super({ usernameField: 'email', passwordField: 'password' });
  }

  validate(email: string, password: string): Promise<UserWithCompany> {
    return this.authService.validateCredentials(email, password);
  }
}
