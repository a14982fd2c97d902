import { Injectable } from '@nestjs/common';

import type { Tx } from '../db/db.module.js';
import { AuditRepository } from './audit.repository.js';

export interface AuditEvent {
  companyId: string;
  actorUserId: string | null;
  /** Dotted verb, e.g. `user.sign_in`, `invitation.create`. */
  action: string;
  targetType: string;
  targetId?: string | null;
  details?: Record<string, unknown>;
}

/** Writes the audit log; pass the transaction of the change so both commit or neither does. */
@Injectable()
export class AuditService {
  constructor(private readonly repository: AuditRepository) {}

  async record(event: AuditEvent, tx?: Tx): Promise<void> {
    await this.repository.insert(
      {
        companyId: event.companyId,
        actorUserId: event.actorUserId,
        action: event.action,
        targetType: event.targetType,
        targetId: event.targetId ?? null,
        details: event.details ?? null,
      },
      tx,
    );
  }
}
