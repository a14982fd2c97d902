import { randomBytes } from 'node:crypto';

import { inject } from 'vitest';

// ConfigModule validates the environment when AppModule is imported, so it must be in place first.
Object.assign(process.env, {
  NODE_ENV: 'test',
  DATABASE_URL: inject('databaseUrl'),
  JWT_ACCESS_SECRET: randomBytes(32).toString('hex'),
  LOCAL_SMTP_PORT: '0',
  LOG_LEVEL: 'error',
  LOG_FORMAT: 'text',
});
