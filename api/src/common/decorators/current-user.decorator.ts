import { createParamDecorator, type ExecutionContext } from '@nestjs/common';

import type { Role } from '../../domain/auth/roles.js';

/** The signed-in user, as validated by the JWT strategy on every request. */
export interface AuthUser {
  id: string;
  companyId: string;
  role: Role;
  email: string;
  name: string;
}

export const CurrentUser = createParamDecorator(
  (_data: unknown, ctx: ExecutionContext): AuthUser => ctx.switchToHttp().getRequest<{ user: AuthUser }>().user,
);
