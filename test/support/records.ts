import type { NestExpressApplication } from '@nestjs/platform-express';
import request from 'supertest';

import type { AsBuilt } from '../../api/src/domain/as-built/as-built.schema.js';
import type { Item } from '../../api/src/domain/as-built/item.schema.js';
import { withDb } from './fixtures.js';
import { bearer, type Session } from './session.js';

/** A thin client for the API as one signed-in user; throws with the body on an unexpected status. */
export function apiAs(app: NestExpressApplication, session: Session) {
  const send = async (method: 'get' | 'post' | 'patch' | 'put' | 'delete', path: string, body?: object, headers: Record<string, string> = {}) => {
    let req = request(app.getHttpServer())[method](path).set(bearer(session));
    for (const [name, value] of Object.entries(headers)) req = req.set(name, value);
    return body === undefined ? req : req.send(body);
  };
  const expectOk = async (method: Parameters<typeof send>[0], path: string, body?: object, headers?: Record<string, string>) => {
    const res = await send(method, path, body, headers);
    if (res.status >= 300) throw new Error(`${method.toUpperCase()} ${path} → ${res.status} ${JSON.stringify(res.body)}`);
    return res.body;
  };
  return { send, expectOk };
}

export type Api = ReturnType<typeof apiAs>;

let counter = 0;

/** An invented customer and site (fictional street and town) with the site frame of `frame`. */
export async function createSite(api: Api, frame?: AsBuilt['site']): Promise<{ customerId: string; siteId: string }> {
  counter += 1;
  const customer = await api.expectOk('post', '/api/customers', { name: `Fixture Customer ${counter}`, email: `customer${counter}@fixture.example` });
  const site = await api.expectOk('post', '/api/sites', {
    customerId: customer.id,
    label: `Fixture yard ${counter}`,
    addressLine1: `${counter} Imaginary Lane`,
    city: 'Nowhereton',
    postalCode: '00000',
    country: 'Testland',
    ...(frame?.northAzimuthDeg !== undefined ? { northAzimuthDeg: frame.northAzimuthDeg } : {}),
    ...(frame?.origin ? { origin: { lat: frame.origin.lat, lon: frame.origin.lon } } : {}),
  });
  return { customerId: customer.id, siteId: site.id };
}

/** The site's current version, for If-Match on a site write. */
export async function siteVersion(api: Api, siteId: string): Promise<number> {
  return (await api.expectOk('get', `/api/sites/${siteId}`)).version as number;
}

/**
 * A write to a site (`path` below `/api/sites/:siteId`) as `api`'s user on top of the site's current
 * version (read first); throws on a non-2xx answer. A geometry write answers with `siteVersion` and
 * the new versions of the site's open jobs (`jobVersions`).
 */
export async function siteWrite(
  api: Api,
  method: 'post' | 'patch' | 'put' | 'delete',
  siteId: string,
  path: string,
  body?: object,
) {
  const version = await siteVersion(api, siteId);
  return api.expectOk(method, `/api/sites/${siteId}${path}`, body, { 'If-Match': `"${version}"` });
}

export interface JobFixture {
  id: string;
  siteId: string;
  version: number;
}

export async function createJob(
  api: Api,
  siteId: string,
  crew: { crewLeadUserId?: string; technicianUserIds?: string[] } = {},
): Promise<JobFixture> {
  counter += 1;
  const job = await api.expectOk('post', '/api/jobs', { siteId, title: `Fixture job ${counter}`, ...crew });
  return { id: job.id, siteId, version: job.version };
}

/** Moves a job along the status machine as `api`'s user; returns the new version. */
export async function moveJob(api: Api, job: JobFixture, ...statuses: string[]): Promise<JobFixture> {
  let version = job.version;
  for (const to of statuses) {
    version = (await api.expectOk('post', `/api/jobs/${job.id}/status`, { to, expectedVersion: version, comment: 'fixture' })).version;
  }
  return { ...job, version };
}

/**
 * Issues a job that is ready to issue and waits (up to 100 s) until its packet is rendered: the
 * revision's id. Throws with the API's answer when issuing is refused or the render fails.
 */
export async function issueAndWaitForPacket(api: Api, job: JobFixture): Promise<string> {
  const issued = await api.send('post', `/api/jobs/${job.id}/packets`, undefined, { 'If-Match': `"${job.version}"` });
  if (issued.status !== 201) throw new Error(`issue → ${issued.status} ${JSON.stringify(issued.body)}`);
  const deadline = Date.now() + 100_000;
  for (;;) {
    const body = await api.expectOk('get', `/api/packets/${issued.body.id}`);
    if (body.status === 'ready') return issued.body.id as string;
    if (body.status === 'failed' || Date.now() > deadline) throw new Error(`packet ${body.status}: ${body.failureReason}`);
    await new Promise((resolve) => setTimeout(resolve, 300));
  }
}

function strip<T extends { id: string }>(entry: T): Omit<T, 'id'> {
  const { id: _id, ...rest } = entry;
  return rest;
}

/**
 * Records a whole as-built on a job through the API, the way a crew would: reference points on the
 * site, then zones, items, runs and checks. Returns the map from the as-built's ids to the uuids the
 * API gave, and the job's final version.
 */
export async function recordAsBuilt(api: Api, job: JobFixture, asBuilt: AsBuilt): Promise<{ ids: Map<string, string>; version: number }> {
  const ids = new Map<string, string>();
  let version = job.version;
  const map = (id: string) => {
    const mapped = ids.get(id);
    if (!mapped) throw new Error(`no uuid yet for ${id}`);
    return mapped;
  };
  const write = async (method: 'post', path: string, body: object) => {
    const res = await api.expectOk(method, `/api/jobs/${job.id}${path}`, body, { 'If-Match': `"${version}"` });
    version = res.jobVersion;
    return res;
  };
  for (const point of asBuilt.referencePoints) {
    // A new reference point is a change to the site's geometry: it bumps the job's version too.
    const created = await siteWrite(api, 'post', job.siteId, '/reference-points', strip(point));
    ids.set(point.id, created.id);
    version = created.jobVersions[job.id] ?? version;
  }
  for (const zone of asBuilt.zones) ids.set(zone.id, (await write('post', '/zones', strip(zone))).zone.id);
  for (const item of asBuilt.items) {
    const body: Record<string, unknown> = {
      ...strip(item),
      ...(item.zoneId ? { zoneId: map(item.zoneId) } : {}),
      ...(item.ties ? { ties: item.ties.map((t) => ({ ...t, referencePointId: map(t.referencePointId) })) } : {}),
      ...(item.kind === 'amplifier' ? { channels: item.channels.map(strip) } : {}),
    };
    const created = (await write('post', '/items', body)).item as Item;
    ids.set(item.id, created.id);
    if (item.kind === 'amplifier' && created.kind === 'amplifier') {
      item.channels.forEach((channel, i) => ids.set(channel.id, created.channels[i]!.id));
    }
  }
  const mapChannel = (c: { amplifierItemId: string; channelId: string }) => ({ amplifierItemId: map(c.amplifierItemId), channelId: map(c.channelId) });
  for (const run of asBuilt.runs) {
    const body = {
      ...strip(run),
      fromItemId: map(run.fromItemId),
      toItemId: map(run.toItemId),
      pairs: run.pairs.map((p) => ({ ...p, channel: p.channel ? mapChannel(p.channel) : null })),
    };
    ids.set(run.id, (await write('post', '/runs', body)).run.id);
  }
  for (const check of asBuilt.checks) {
    ids.set(check.id, (await write('post', '/checks', { ...strip(check), channel: mapChannel(check.channel) })).check.id);
  }
  return { ids, version };
}

/** Rewrites every id in `value` (any string equal to a mapped id) through `ids`. */
export function translateIds<T>(value: T, ids: ReadonlyMap<string, string>): T {
  return JSON.parse(JSON.stringify(value), (_key, v: unknown) => (typeof v === 'string' && ids.has(v) ? ids.get(v) : v)) as T;
}

/**
 * Arranges a job with a recorded as-built straight in the database (no API calls, so the authorization
 * matrix stays fast): the job row in `status` at version 1, its crew, and every row of `asBuilt`.
 */
export async function insertRecordedJob(
  company: { id: string },
  siteId: string,
  crew: { crewLeadUserId: string; technicianUserIds: string[] },
  asBuilt: AsBuilt,
  status: 'draft' | 'in_progress' = 'in_progress',
): Promise<{ id: string; version: number; ids: Map<string, string>; depthReadingIds: Map<string, string[]> }> {
  const { drizzle } = await import('drizzle-orm/node-postgres');
  const schema = await import('../../api/src/db/schema/index.js');
  const { insertRecord } = await import('../../api/src/db/seed/demo-seed.js');
  return withDb(async (client) =>
    drizzle(client, { schema }).transaction(async (tx) => {
      const [job] = await tx
        .insert(schema.jobs)
        .values({ companyId: company.id, siteId, title: 'Arranged job', status, crewLeadUserId: crew.crewLeadUserId })
        .returning({ id: schema.jobs.id, version: schema.jobs.version });
      if (crew.technicianUserIds.length > 0) {
        await tx.insert(schema.jobTechnicians).values(crew.technicianUserIds.map((userId) => ({ jobId: job!.id, userId })));
      }
      return { ...job!, ...(await insertRecord(tx, asBuilt, job!.id, siteId)) };
    }),
  );
}

/**
 * A job in progress on `siteId`, led by the company's lead with its tech on the crew: a zone, an
 * amplifier with one channel, a speaker, a spare junction, a run amp → speaker with one depth reading,
 * and a DC-resistance check. Returns the stored ids and the run and check bodies with those ids.
 */
export async function insertSmallRecordedJob(company: { id: string; users: { lead: { id: string }; tech: { id: string } } }, siteId: string) {
  const channelRef = { amplifierItemId: 'amp', channelId: 'ch' };
  const runBody = {
    label: 'Amp to satellite',
    fromItemId: 'amp',
    toItemId: 'speaker',
    cableType: '14/2 direct burial',
    gauge: { system: 'awg' as const, awg: 14 },
    conductors: 2,
    pairs: [{ pairIndex: 1, channel: channelRef }],
    measuredLengthM: 10,
    method: 'direct_burial' as const,
  };
  const checkBody = { channel: channelRef, quantity: 'dc_resistance' as const, measuredOhm: 6.8 };
  const job = await insertRecordedJob(
    company,
    siteId,
    { crewLeadUserId: company.users.lead.id, technicianUserIds: [company.users.tech.id] },
    {
      zones: [{ id: 'zone', name: 'Patio' }],
      referencePoints: [],
      items: [
        { id: 'amp', kind: 'amplifier', label: 'Amp', channels: [{ id: 'ch', name: 'Patio' }], ratedWatts8Ohm: 100, minimumImpedanceOhm: 4 },
        { id: 'speaker', kind: 'speaker', label: 'Satellite', nominalImpedanceOhm: 8 },
        { id: 'junction', kind: 'junction', label: 'Spare splice' },
      ],
      runs: [{ id: 'run', ...runBody, depthReadings: [{ stationM: 2, depthM: 0.3 }] }],
      checks: [{ id: 'check', ...checkBody }],
    },
  );
  const id = (key: string) => job.ids.get(key)!;
  const channel = { amplifierItemId: id('amp'), channelId: id('ch') };
  return {
    jobId: job.id,
    version: job.version,
    zoneId: id('zone'),
    ampId: id('amp'),
    speakerId: id('speaker'),
    junctionId: id('junction'),
    runId: id('run'),
    readingId: job.depthReadingIds.get(id('run'))![0]!,
    checkId: id('check'),
    channel,
    runBody: { ...runBody, fromItemId: id('amp'), toItemId: id('speaker'), pairs: [{ pairIndex: 1, channel }] },
    checkBody: { ...checkBody, channel },
  };
}

/**
 * Issue 21: an earlier job of `siteId` that was issued (a small recorded job with a packet revision row),
 * and a second job in progress on the same site that changed the earlier job's run (a
 * `site_record_changes` row, as `PUT /runs/:runId` from the second job writes it). Returns the second
 * job, its version and the changed run's id.
 */
export async function insertSiteChange(company: { id: string; users: { lead: { id: string }; tech: { id: string } } }, siteId: string) {
  const earlier = await insertSmallRecordedJob(company, siteId);
  const later = await insertRecordedJob(company, siteId, { crewLeadUserId: company.users.lead.id, technicianUserIds: [company.users.tech.id] }, {
    zones: [],
    referencePoints: [],
    items: [],
    runs: [],
    checks: [],
  });
  await withDb(async (client) => {
    await client.query(`update jobs set status = 'issued' where id = $1`, [earlier.jobId]);
    await client.query(
      `insert into packet_revisions (company_id, job_id, revision, status, snapshot, paper_size) values ($1, $2, 1, 'failed', '{"format":1}', 'letter')`,
      [company.id, earlier.jobId],
    );
    const before = { record: { id: earlier.runId, ...earlier.runBody, depthReadings: [{ stationM: 2, depthM: 0.3 }] }, abandoned: null };
    await client.query(`update runs set label = 'Changed by the later job' where id = $1`, [earlier.runId]);
    await client.query(
      `insert into site_record_changes (site_id, job_id, record_kind, record_id, change, before, changed_on) values ($1, $2, 'run', $3, 'changed', $4, current_date)`,
      [siteId, later.id, earlier.runId, JSON.stringify(before)],
    );
  });
  return { jobId: later.id, version: later.version, recordId: earlier.runId };
}
