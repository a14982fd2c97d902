import { Inject, Injectable } from '@nestjs/common';

import { DB, type Db, type Tx } from '../db/db.module.js';
import { auditLog, type NewAuditEntry } from '../db/schema/index.js';

@Injectable()
export class AuditRepository {
  constructor(@Inject(DB) private readonly db: Db) {}

  async insert(entry: NewAuditEntry, tx?: Tx): Promise<void> {
    await (tx ?? this.db).insert(auditLog).values(entry);
  }
}
