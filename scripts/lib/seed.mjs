// Demo data of our own invention (company, people, addresses), seeded into an empty database by
// `npm start` and `npm run dev`. Running it again changes nothing.
import { join } from 'node:path';
import { pathToFileURL } from 'node:url';

import { importProjectPackage, root } from './setup.mjs';

export const DEMO_COMPANY_NAME = 'Quillmoss Outdoor Audio';
export const DEMO_PASSWORD = 'quillmoss-demo-2026';

/** One invented person per role; e-mail domains are reserved example domains (RFC 2606). */
export const DEMO_USERS = [
  { role: 'admin', name: 'Maren Vell', email: 'admin@quillmoss.example' },
  { role: 'office', name: 'Tobin Ashgrove', email: 'office@quillmoss.example' },
  { role: 'lead', name: 'Rafe Linwood', email: 'lead@quillmoss.example' },
  { role: 'tech', name: 'Ines Carrow', email: 'tech@quillmoss.example' },
  { role: 'homeowner', name: 'Dara Penhallow', email: 'dara.penhallow@example.net' },
];

/** Seeds the demo company once; returns lines to print (the demo sign-ins). */
export async function seedDemo(databaseUrl) {
  const { Client } = await importProjectPackage('pg');
  const { hash } = await importProjectPackage('@node-rs/argon2');
  const client = new Client({ connectionString: databaseUrl });
  await client.connect();
  try {
    await client.query('begin');
    let company = (await client.query('select id from companies where name = $1', [DEMO_COMPANY_NAME])).rows[0];
    if (!company) {
      company = (await client.query('insert into companies (name) values ($1) returning id', [DEMO_COMPANY_NAME])).rows[0];
    }
    const passwordHash = await hash(DEMO_PASSWORD);
    for (const user of DEMO_USERS) {
      await client.query(
        `insert into users (company_id, email, name, role, password_hash) values ($1, $2, $3, $4, $5)
         on conflict (email) do nothing`,
        [company.id, user.email, user.name, user.role, passwordHash],
      );
    }
    await client.query('commit');
  } catch (error) {
    await client.query('rollback');
    throw error;
  } finally {
    await client.end();
  }
  return {
    lines: [
      `demo company: ${DEMO_COMPANY_NAME}; every demo sign-in uses the password ${DEMO_PASSWORD}`,
      ...DEMO_USERS.map((u) => `  ${u.role.padEnd(9)} ${u.email}  (${u.name})`),
    ],
  };
}

/**
 * Seeds the demo company's customers, sites and jobs (after `seedDemo` and `ensureApiBuilt()`: the
 * seeding is TypeScript, compiled with the API, so it reuses the API's schema and as-built mapping).
 * Returns lines to print.
 */
export async function seedDemoRecords(databaseUrl) {
  const { seedDemoRecords: seed } = await import(pathToFileURL(join(root, 'api/dist/db/seed/demo-seed.js')).href);
  return seed(databaseUrl);
}
