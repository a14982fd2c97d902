import { createHash, randomUUID } from 'node:crypto';

import { hash } from '@node-rs/argon2';
import { and, eq, inArray } from 'drizzle-orm';
import { drizzle } from 'drizzle-orm/node-postgres';
import pg from 'pg';
import sharp from 'sharp';

import { DEMO_AS_BUILT } from '../../domain/as-built/demo-as-built.js';
import type { AsBuilt } from '../../domain/as-built/as-built.schema.js';
import { DEMO_SITE_FEATURES } from '../../domain/sites/demo-site-features.js';
import { jobWorkDate, toRecordRows } from '../../jobs/as-built-rows.js';
import type { ObjectStorage } from '../../storage/object-storage.js';
import * as schema from '../schema/index.js';
import {
  DEMO_COMPANY_NAME,
  DEMO_EMAILS,
  DEMO_PASSWORD,
  DEMO_SITES,
  DEMO_USERS,
  type DemoSite,
  IN_PROGRESS_AS_BUILT,
} from './demo-records.js';

type SeedDb = ReturnType<typeof drizzle<typeof schema>>;
export type SeedTx = Parameters<Parameters<SeedDb['transaction']>[0]>[0];

export const DEMO_JOB_TITLES = {
  recorded: 'Back-yard sound: patio and spa',
  inProgress: 'Pool deck satellites',
  draft: 'Garden terrace sound (quote accepted)',
} as const;

async function insertSite(tx: SeedTx, companyId: string, demo: DemoSite): Promise<string> {
  const [customer] = await tx
    .insert(schema.customers)
    .values({ companyId, ...demo.customer })
    .returning({ id: schema.customers.id });
  const [site] = await tx
    .insert(schema.sites)
    .values({ companyId, customerId: customer!.id, ...demo.site })
    .returning({ id: schema.sites.id });
  return site!.id;
}

/**
 * The demo company's invented logo: a rounded orange square with a white sound wave and a small
 * ground line, drawn here (no real brand), rasterised to the PNG the profile stores.
 */
export const DEMO_LOGO_SVG = `<svg xmlns="http://www.w3.org/2000/svg" width="480" height="480" viewBox="0 0 120 120">
  <rect x="6" y="6" width="108" height="108" rx="24" fill="#c8581c"/>
  <path d="M22 64 C 34 34, 46 94, 60 60 S 86 30, 98 58" stroke="#ffffff" stroke-width="9" fill="none" stroke-linecap="round"/>
  <line x1="24" y1="92" x2="96" y2="92" stroke="#ffe3cf" stroke-width="5" stroke-linecap="round"/>
</svg>`;

/** The demo company's profile (invented contact details; 555-01xx numbers are reserved for fiction). */
export const DEMO_PROFILE = {
  contactPhone: '(555) 010-0199',
  contactEmail: 'service@quillmoss.example',
  website: 'https://quillmoss.example',
  postalAddress: '400 Fernwhistle Road, Suite 2\nBramblecote, ZZ 00000',
  licenceNumbers: ['Low-voltage contractor licence LV-000000 (invented)'],
  timeZone: 'America/Denver',
  locale: 'en-US',
} as const;

/** Stores the demo logo (a PNG under its SHA-256, as uploads are) and returns its key. */
async function storeDemoLogo(storage: ObjectStorage, companyId: string): Promise<string> {
  const png = await sharp(Buffer.from(DEMO_LOGO_SVG)).png({ compressionLevel: 9 }).toBuffer();
  const key = `companies/${companyId}/logo/${createHash('sha256').update(png).digest('hex')}.png`;
  if (!(await storage.exists(key))) await storage.put(key, png, 'image/png');
  return key;
}

/**
 * Inserts a whole as-built on a job (site reference points included) without going through the API;
 * ids are fresh uuids, arrays keep their order through the sequences. Returns the map from the
 * as-built's ids to the uuids, and each run's depth reading ids (as-built readings have none).
 */
export async function insertRecord(
  tx: SeedTx,
  asBuilt: AsBuilt,
  jobId: string,
  siteId: string,
): Promise<{ ids: Map<string, string>; depthReadingIds: Map<string, string[]> }> {
  const ids = new Map<string, string>();
  // Records are installed by their job on its work date (see jobWorkDate).
  const [job] = await tx
    .select({ startDate: schema.jobs.startDate, endDate: schema.jobs.endDate, createdAt: schema.jobs.createdAt })
    .from(schema.jobs)
    .where(eq(schema.jobs.id, jobId));
  const rows = toRecordRows(asBuilt, {
    jobId,
    siteId,
    installedOn: jobWorkDate(job!),
    idFor: (id) => ids.get(id) ?? (ids.set(id, randomUUID()), ids.get(id)!),
    newId: randomUUID,
  });
  const insert = async <T extends object>(table: Parameters<SeedTx['insert']>[0], values: T[]) => {
    // Guard against an empty VALUES list.
    if (values.length > 0) await tx.insert(table).values(values as never);
  };
  await insert(schema.referencePoints, rows.referencePoints);
  await insert(schema.zones, rows.zones);
  await insert(schema.items, rows.items);
  await insert(schema.amplifierChannels, rows.channels);
  await insert(schema.itemTies, rows.ties);
  await insert(schema.runs, rows.runs);
  await insert(schema.runPairs, rows.pairs);
  await insert(schema.runRoutePoints, rows.routePoints);
  await insert(schema.depthReadings, rows.depthReadings);
  await insert(schema.commissioningChecks, rows.checks);
  const depthReadingIds = new Map<string, string[]>();
  for (const reading of rows.depthReadings) depthReadingIds.set(reading.runId, [...(depthReadingIds.get(reading.runId) ?? []), reading.id]);
  return { ids, depthReadingIds };
}

/** The demo company and one user per role; existing rows are left as they are. Returns the company id. */
async function seedCompanyAndUsers(tx: SeedTx): Promise<string> {
  let [company] = await tx.select({ id: schema.companies.id }).from(schema.companies).where(eq(schema.companies.name, DEMO_COMPANY_NAME));
  company ??= (await tx.insert(schema.companies).values({ name: DEMO_COMPANY_NAME }).returning({ id: schema.companies.id }))[0]!;
  const passwordHash = await hash(DEMO_PASSWORD);
  await tx
    .insert(schema.users)
    .values(DEMO_USERS.map((u) => ({ companyId: company.id, email: u.email, name: u.name, role: u.role, passwordHash })))
    .onConflictDoNothing({ target: schema.users.email });
  return company.id;
}

/**
 * Seeds the demo: the invented company with one user per role, then its customers, sites and jobs —
 * a fully recorded, submitted job from DEMO_AS_BUILT (with its shallow station), one in progress and
 * one draft; the demo homeowner is linked to the recorded job's site. Idempotent: when the company
 * already has its demo customers, no records are written. Returns lines to print (the sign-ins).
 */
export async function seedDemo(database: string | pg.Pool, options: { storage?: ObjectStorage } = {}): Promise<{ lines: string[] }> {
  const pool = typeof database === 'string' ? new pg.Pool({ connectionString: database, max: 1 }) : database;
  const db = drizzle(pool, { schema });
  try {
    return await db.transaction(async (tx) => {
      const company = { id: await seedCompanyAndUsers(tx) };
      // Serialise concurrent seeds (two `npm start`s on one database) so both cannot insert.
      await tx.select().from(schema.companies).where(eq(schema.companies.id, company.id)).for('update');
      const [existing] = await tx
        .select({ id: schema.customers.id })
        .from(schema.customers)
        .where(and(eq(schema.customers.companyId, company.id), eq(schema.customers.name, DEMO_SITES.recorded.customer.name)));
      const lines = [
        `demo company: ${DEMO_COMPANY_NAME}; every demo sign-in uses the password ${DEMO_PASSWORD}`,
        ...DEMO_USERS.map((u) => `  ${u.role.padEnd(9)} ${u.email}  (${u.name})`),
        `demo jobs: "${DEMO_JOB_TITLES.recorded}" (submitted, fully recorded), "${DEMO_JOB_TITLES.inProgress}" (in progress), "${DEMO_JOB_TITLES.draft}" (draft)`,
      ];
      if (existing) return { lines };

      // The company profile: contact, licence, time zone and (when a storage driver is given) the logo.
      const logoKey = options.storage ? await storeDemoLogo(options.storage, company.id) : null;
      await tx
        .insert(schema.companySettings)
        .values({ companyId: company.id, ...DEMO_PROFILE, licenceNumbers: [...DEMO_PROFILE.licenceNumbers], logoKey })
        .onConflictDoUpdate({ target: schema.companySettings.companyId, set: { ...DEMO_PROFILE, licenceNumbers: [...DEMO_PROFILE.licenceNumbers], logoKey } });

      const people = await tx
        .select({ id: schema.users.id, email: schema.users.email })
        .from(schema.users)
        .where(and(eq(schema.users.companyId, company.id), inArray(schema.users.email, Object.values(DEMO_EMAILS))));
      const userId = (email: string) => people.find((p) => p.email === email)?.id ?? null;
      const lead = userId(DEMO_EMAILS.lead);
      const tech = userId(DEMO_EMAILS.tech);

      const recordedSite = await insertSite(tx, company.id, DEMO_SITES.recorded);
      const inProgressSite = await insertSite(tx, company.id, DEMO_SITES.inProgress);
      const draftSite = await insertSite(tx, company.id, DEMO_SITES.draft);

      const job = async (siteId: string, title: string, status: schema.JobStatus, dates: [string, string]) => {
        const [row] = await tx
          .insert(schema.jobs)
          .values({
            companyId: company.id,
            siteId,
            title,
            status,
            crewLeadUserId: lead,
            startDate: dates[0],
            endDate: dates[1],
            createdByUserId: userId(DEMO_EMAILS.office),
          })
          .returning({ id: schema.jobs.id });
        if (tech) await tx.insert(schema.jobTechnicians).values({ jobId: row!.id, userId: tech });
        return row!.id;
      };
      const recordedJob = await job(recordedSite, DEMO_JOB_TITLES.recorded, 'submitted', ['2026-05-11', '2026-05-14']);
      await insertRecord(tx, DEMO_AS_BUILT, recordedJob, recordedSite);
      const inProgressJob = await job(inProgressSite, DEMO_JOB_TITLES.inProgress, 'in_progress', ['2026-06-01', '2026-06-03']);
      await insertRecord(tx, IN_PROGRESS_AS_BUILT, inProgressJob, inProgressSite);
      await job(draftSite, DEMO_JOB_TITLES.draft, 'draft', ['2026-07-06', '2026-07-08']);

      // Landmarks of the recorded site (house, fences, patio …): the locate map and drawings orient by them.
      await tx.insert(schema.siteFeatures).values(DEMO_SITE_FEATURES.map((f) => ({ siteId: recordedSite, kind: f.kind, name: f.name, shape: f.shape, points: f.points })));

      const homeowner = userId(DEMO_EMAILS.homeowner);
      if (homeowner) await tx.insert(schema.siteHomeowners).values({ siteId: recordedSite, userId: homeowner });
      return { lines };
    });
  } finally {
    if (typeof database === 'string') await pool.end();
  }
}
