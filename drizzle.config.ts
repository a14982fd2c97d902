import { defineConfig } from 'drizzle-kit';

// Generating migrations needs no database; `npm run db:migrate` and `npm start` apply them.
export default defineConfig({
  dialect: 'postgresql',
  // Only tables exported from index.ts take part, so a table drafted in a new file stays out of migrations
  // until it is exported.
  schema: './api/src/db/schema/index.ts',
  out: './drizzle',
  dbCredentials: { url: process.env.DATABASE_URL ?? 'postgres://localhost/loamline' },
});
