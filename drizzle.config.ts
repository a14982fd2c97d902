import { defineConfig } from 'drizzle-kit';

// Generating migrations needs no database; `npm run db:migrate` and `npm start` apply them.
export default defineConfig({
  dialect: 'postgresql',
  schema: './api/src/db/schema/*.ts',
  out: './drizzle',
  dbCredentials: { url: process.env.DATABASE_URL ?? 'postgres://localhost/loamline' },
});
