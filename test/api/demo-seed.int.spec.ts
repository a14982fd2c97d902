import type { NestExpressApplication } from '@nestjs/platform-express';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';

import { DEMO_PASSWORD } from '../../api/src/db/seed/demo-records.js';
import { seedDemo } from '../../api/src/db/seed/demo-seed.js';
import { AsBuiltSchema } from '../../api/src/domain/as-built/as-built.schema.js';
import { withDb } from '../support/fixtures.js';
import { apiAs } from '../support/records.js';
import { signIn } from '../support/session.js';
import { createTestApp } from '../support/test-app.js';

const TABLES = ['customers', 'sites', 'jobs', 'job_technicians', 'reference_points', 'zones', 'items', 'amplifier_channels', 'item_ties', 'runs', 'run_pairs', 'run_route_points', 'depth_readings', 'commissioning_checks', 'site_homeowners'];

async function counts(): Promise<Record<string, number>> {
  return withDb(async (db) => {
    const out: Record<string, number> = {};
    for (const table of TABLES) out[table] = (await db.query(`select count(*)::int as n from ${table}`)).rows[0].n;
    return out;
  });
}

describe('demo seed', () => {
  let app: NestExpressApplication;

  beforeAll(async () => {
    app = await createTestApp();
  });

  afterAll(async () => {
    await app.close();
  });

  it('should seed the company, its people, three sites and jobs once, and change nothing when run again', async () => {
    const before = await counts();
    const first = await seedDemo(inject('databaseUrl'));
    const after = await counts();
    expect(after.jobs - before.jobs).toBe(3);
    expect(after.sites - before.sites).toBe(3);
    expect(after.site_homeowners - before.site_homeowners).toBe(1);
    expect(first.lines.join('\n')).toContain('lead@quillmoss.example');
    const users = await withDb((db) => db.query(`select role from users where email like '%@quillmoss.example' order by role::text`));
    expect(users.rows.map((r: { role: string }) => r.role)).toEqual(['admin', 'lead', 'office', 'tech']);
    await seedDemo(inject('databaseUrl'));
    expect(await counts()).toEqual(after);
  });

  it('should serve the recorded job’s as-built with its shallow station to the demo crew lead', async () => {
    const lead = apiAs(app, await signIn(app, { email: 'lead@quillmoss.example' }, DEMO_PASSWORD));
    const list = await lead.expectOk('get', '/api/jobs?mine=true&sort=title');
    expect(list.items.map((j: { status: string }) => j.status).sort()).toEqual(['draft', 'in_progress', 'submitted']);
    for (const job of list.items as { id: string; status: string }[]) {
      const body = await lead.expectOk('get', `/api/jobs/${job.id}/as-built`);
      expect(AsBuiltSchema.safeParse(body.asBuilt).success).toBe(true);
      if (job.status === 'submitted') {
        expect(body.asBuilt.items).toHaveLength(13);
        expect(body.analysis.findings.some((f: { path: unknown[] }) => f.path.join('.') === 'runs.3.depthReadings.1')).toBe(true);
      }
    }
  });

  it('should link the demo homeowner to the recorded job’s site only', async () => {
    const rows = await withDb((db) =>
      db.query(
        `select s.label from site_homeowners h join sites s on s.id = h.site_id join users u on u.id = h.user_id where u.email = $1`,
        ['dara.penhallow@example.net'],
      ),
    );
    expect(rows.rows.map((r) => r.label)).toEqual(['Penhallow back yard']);
  });
});
