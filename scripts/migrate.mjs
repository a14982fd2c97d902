// `npm run db:migrate`: apply drizzle/ migrations to DATABASE_URL, or to the local cluster's database.
import { ensureDatabase, ensurePostgres, log, migrate, redact, stopPostgres } from './lib/setup.mjs';

const pg = ensurePostgres();
const url = await ensureDatabase(pg, pg.external ? undefined : 'loamline');
await migrate(url);
log(`migrations applied to ${redact(url)}`);
stopPostgres(pg);
