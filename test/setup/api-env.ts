import { inject } from 'vitest';

// ConfigModule validates the environment when AppModule is imported, so it must be in place first.
Object.assign(process.env, {
  NODE_ENV: 'test',
  DATABASE_URL: inject('databaseUrl'),
  LOG_LEVEL: 'error',
  LOG_FORMAT: 'text',
});
