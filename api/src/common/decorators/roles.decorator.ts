import { SetMetadata } from '@nestjs/common';

import type { Role } from '../../domain/auth/roles.js';

export const ROLES_KEY = 'roles';

/** Restricts a route (or a controller) to the listed roles. */
export const Roles = (...roles: Role[]) => SetMetadata(ROLES_KEY, roles);
