import { Injectable } from '@nestjs/common';

import type { AuthUser } from '../common/decorators/current-user.decorator.js';
import type { InvitationResponse } from '../domain/auth/auth.schema.js';
import type { InviteHomeownerInput } from '../domain/sites/homeowner-invitation.schema.js';
import { UsersService } from '../users/users.service.js';
import { SitesService } from './sites.service.js';

/** Homeowners of a site who have no account yet: invited through the users' invitation flow. */
@Injectable()
export class SiteHomeownersService {
  constructor(
    private readonly sites: SitesService,
    private readonly users: UsersService,
  ) {}

  /** 404 for a site of another company; the invitation links the site when it is accepted. */
  async invite(actor: AuthUser, siteId: string, input: InviteHomeownerInput): Promise<InvitationResponse> {
    await this.sites.get(actor, siteId);
    return this.users.invite(actor, { email: input.email, name: input.name, role: 'homeowner' }, { siteIds: [siteId] });
  }
}
