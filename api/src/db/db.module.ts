import { Global, Inject, Logger, Module, type OnApplicationShutdown } from '@nestjs/common';
import { ConfigService } from '@nestjs/config';
import { drizzle, type NodePgDatabase } from 'drizzle-orm/node-postgres';
import pg from 'pg';

import { noteDatabaseAnswered } from '../common/db-errors.js';
import type { Env } from '../config/env.schema.js';
import * as schema from './schema/index.js';

export const DB = Symbol('DB');
export const PG_POOL = Symbol('PG_POOL');

export type Db = NodePgDatabase<typeof schema>;
export type Tx = Parameters<Parameters<Db['transaction']>[0]>[0];

@Global()
@Module({
  providers: [
    {
      provide: PG_POOL,
      inject: [ConfigService],
      useFactory: (config: ConfigService<Env, true>) => {
        const pool = new pg.Pool({
          connectionString: config.get('DATABASE_URL', { infer: true }),
          max: 10,
          // A refused connection (database down) fails at once and answers 503. This bounds the rest: a
          // host that does not answer, and the wait for a free client of the pool under load, where 3 s
          // proved too short on a busy 2-core machine (packet renders failed and were retried).
          connectionTimeoutMillis: 10_000,
          statement_timeout: 15_000,
        });
        // An idle client's connection dropping (database restart) must not crash the process.
        pool.on('error', (error) => new Logger('Database').warn(`idle client error: ${error.message}`));
        // Proof that the database answers: a pool wait that then times out is load (503 DATABASE_BUSY),
        // not an outage (503 DATABASE_UNAVAILABLE); see db-errors.ts.
        pool.on('connect', () => noteDatabaseAnswered());
        pool.on('release', (error: Error | undefined) => {
          if (!error) noteDatabaseAnswered();
        });
        return pool;
      },
    },
    {
      provide: DB,
      inject: [PG_POOL],
      useFactory: (pool: pg.Pool): Db => drizzle(pool, { schema }),
    },
  ],
  exports: [DB, PG_POOL],
})
export class DbModule implements OnApplicationShutdown {
  constructor(@Inject(PG_POOL) private readonly pool: pg.Pool) {}

  async onApplicationShutdown(): Promise<void> {
    await this.pool.end();
  }
}
