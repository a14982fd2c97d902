// Demo data of our own invention, seeded into an empty database by `npm start`.
import { importProjectPackage } from './setup.mjs';

export const DEMO_COMPANY_NAME = 'Fernbrook Sound & Light (demo)';

/** Seeds the demo company once; returns lines to print (the demo sign-ins once users exist). */
export async function seedDemo(databaseUrl) {
  const { Client } = await importProjectPackage('pg');
  const client = new Client({ connectionString: databaseUrl });
  await client.connect();
  try {
    const existing = await client.query('select id from companies where name = $1', [DEMO_COMPANY_NAME]);
    if (existing.rowCount === 0) {
      await client.query('insert into companies (name) values ($1)', [DEMO_COMPANY_NAME]);
    }
    return { lines: [`demo company: ${DEMO_COMPANY_NAME}`] };
  } finally {
    await client.end();
  }
}
