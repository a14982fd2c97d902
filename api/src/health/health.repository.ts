import { Inject, Injectable } from '@nestjs/common';
import { sql } from 'drizzle-orm';

import { DB, type Db } from '../db/db.module.js';

@Injectable()
export class HealthRepository {
  constructor(@Inject(DB) private readonly db: Db) {}

  /** Round-trips a trivial query; rejects when the database cannot be reached. */
  async ping(): Promise<void> {
    await this.db.execute(sql`select 1`);
  }
}
