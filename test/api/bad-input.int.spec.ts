import { randomBytes, randomUUID } from 'node:crypto';
import { mkdtemp, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

import type { NestExpressApplication } from '@nestjs/platform-express';
import fc from 'fast-check';
import pg from 'pg';
import request from 'supertest';
import { afterAll, afterEach, beforeAll, beforeEach, describe, expect, inject, it } from 'vitest';

import { DEMO_AS_BUILT } from '../../api/src/domain/as-built/demo-as-built.js';
import { DEFAULT_DEPTH_RULES } from '../../api/src/domain/depth/depth-rules.js';
import { ROLES } from '../../api/src/domain/auth/roles.js';
import { DiskStorage } from '../../api/src/storage/disk-storage.js';
import { OBJECT_STORAGE } from '../../api/src/storage/object-storage.js';
import { makePng } from '../fixtures/photos/make-photos.js';
import {
  deeplyNestedJson,
  type FieldSpec,
  hostileButValidText,
  invalidValueFor,
  MALFORMED_JSON_BODIES,
  NON_OBJECT_JSON_BODIES,
  NOT_AN_ID,
  unstorableString,
} from '../support/bad-input-arbitraries.js';
import { changedTables, type DbFingerprint, fingerprintDatabase } from '../support/db-fingerprint.js';
import { createCompany, createUser, type TestCompany, withDb } from '../support/fixtures.js';
import { type Api, apiAs, createSite, insertRecordedJob, insertSiteChange, insertSmallRecordedJob, siteVersion } from '../support/records.js';
import { bearer, type Session, signIn } from '../support/session.js';
import { thisPartOf } from '../support/file-parts.js';
import { createTestApp } from '../support/test-app.js';

/**
 * Issue #10, bad input: every write route (POST/PUT/PATCH/DELETE the API serves) is sent malformed and
 * hostile requests — wrong types, huge strings, deep nesting, unstorable text, NaN/Infinity as raw JSON,
 * absurd measurements, ids that are not ids, unknown ids and other companies' ids, bad versions, wrong
 * content types, bodies that are not objects. Each must be answered with a 4xx in the API's one error
 * shape that names the field (for validation errors) and leaks nothing internal, and the database must
 * be exactly as it was (a whole-database fingerprint before and after). Text that is awkward but valid
 * (RTL overrides, zero-width characters, astral-plane characters, markup) must be stored and given back
 * exactly.
 *
 * The routes are discovered from the running app: a new write route fails the first test until it has a
 * case in `routes` below. Runs are bounded so that the file stays quick inside `npm test`: a fixed seed
 * and a few runs per route (BAD_INPUT_RUNS=200 BAD_INPUT_SEED=<n> for a longer hunt; fast-check prints the
 * seed of a failure).
 */
const SEED = Number(process.env.BAD_INPUT_SEED ?? 20_261_202);
const RUNS = Number(process.env.BAD_INPUT_RUNS ?? 4);
const fcOptions = (salt: number) => ({ seed: SEED + salt, numRuns: RUNS, endOnFailure: true });

type Method = 'post' | 'put' | 'patch' | 'delete';
type Json = Record<string, unknown>;

interface Ctx {
  company: TestCompany;
  session: Session;
  api: Api;
  siteId: string;
}

/** One arranged request that would succeed as it stands; the cases break one part of it at a time. */
interface Arranged {
  /** Values of the route's `:params`. */
  params: Record<string, string>;
  body?: Json;
  headers?: Record<string, string>;
  /** The job whose version must not move when a request is refused. */
  jobId?: string;
}

interface RouteCase {
  /** How the route takes its input: a JSON body, a multipart form, a refresh cookie, or nothing but its path. */
  input: 'json' | 'multipart' | 'cookie' | 'none';
  arrange: (ctx: Ctx) => Promise<Arranged>;
  /** Body fields (dotted paths into the arranged body) and what each accepts. */
  fields?: Record<string, FieldSpec>;
  /** Body fields that hold ids of the company's own records. */
  refs?: string[];
  /** Text fields whose awkward-but-valid text must come back exactly; reads the stored text from the 2xx answer. */
  texts?: Record<string, (answer: any) => unknown>;
  /** Path params that are not ids (`:role`). */
  wordParams?: string[];
  /** Multipart routes: the form field that carries the file(s). */
  fileField?: string;
  /** Writes to a job carry the job version in If-Match. */
  isVersioned?: boolean;
  isPublic?: boolean;
  /** Rate-limited per client address (sign-in, password reset): a 429 may come first. */
  isThrottled?: boolean;
  /** Every field is optional, so `{}` is a valid body. */
  isEmptyObjectValid?: boolean;
  /**
   * A successful call writes more after answering (an e-mail, a queued delivery), which would show in the
   * next check's fingerprint: such routes are only ever sent requests that must be refused.
   */
  hasLaterWrites?: boolean;
}

/** What no error body may contain: stack frames, file paths, SQL or driver messages. */
const LEAK = /\bat [\w.<>$]+ \(|\(\/|node_modules|\/work\/|\.[cm]?[jt]s:\d+|\bselect\b.+\bfrom\b|insert into|violates|relation "|syntax error at|duplicate key|invalid input syntax|drizzle|\bpg\b|postgres/i;

const ERROR_KEYS = new Set(['statusCode', 'error', 'message', 'code', 'issues', 'currentVersion']);

/** Registers a test only where it applies, so the report lists no skipped tests for parts a route lacks. */
const itWhen =
  (applies: boolean) =>
  (name: string, fn: () => Promise<void>): void => {
    if (applies) it(name, fn);
  };

function getPath(value: unknown, path: string): unknown {
  return path.split('.').reduce<unknown>((v, key) => (v !== null && typeof v === 'object' ? (v as Json)[key] : undefined), value);
}

function setPath<T>(value: T, path: string, next: unknown): T {
  const copy = structuredClone(value) as Json;
  const keys = path.split('.');
  let target: Json = copy;
  for (const key of keys.slice(0, -1)) target = target[key] as Json;
  target[keys.at(-1)!] = next;
  return copy as T;
}

function fill(route: string, params: Record<string, string>): string {
  return route.replace(/:(\w+)/g, (_m, name: string) => {
    const value = params[name];
    if (value === undefined) throw new Error(`no value arranged for :${name} of ${route}`);
    return value;
  });
}

function describeValue(value: unknown): string {
  const text = typeof value === 'string' ? JSON.stringify(value) : JSON.stringify(value) ?? String(value);
  return text.length > 80 ? `${text.slice(0, 80)}… (${text.length} chars)` : text;
}

/** A field named by the error: an issue at the field or inside it, or (without issues) the message naming it. */
function namesField(body: { message?: unknown; issues?: { path: string }[] }, field: string): boolean {
  if (Array.isArray(body.issues) && body.issues.length > 0) {
    return body.issues.some((issue) => issue.path === field || issue.path.startsWith(`${field}.`));
  }
  return typeof body.message === 'string' && body.message.includes(field);
}

describe('bad input on every write route', () => {
  let app: NestExpressApplication;
  let uploadsDir: string;
  let photoPng: Buffer;
  let db: pg.Client;
  let A: Ctx;
  let B: Ctx;
  let fingerprint: DbFingerprint;

  const server = () => app.getHttpServer();

  // ── arranging records ────────────────────────────────────────────────────────────────────────────

  async function customer(ctx: Ctx): Promise<string> {
    return (await ctx.api.expectOk('post', '/api/customers', { name: 'Bad input customer' })).id;
  }

  /**
   * A reference point arranged straight in the database: the API refuses site geometry changes while a
   * job on the site is under review, and the company's main site gets ready-to-issue jobs along the way.
   */
  async function referencePoint(ctx: Ctx, siteId = ctx.siteId): Promise<string> {
    return withDb(
      async (client) =>
        (await client.query(`insert into reference_points (site_id, label, x, y) values ($1, 'Corner', 0, 0) returning id`, [siteId])).rows[0].id as string,
    );
  }

  /** A site feature (a fence line) arranged straight in the database, as the reference points are. */
  async function siteFeature(siteId: string): Promise<string> {
    return withDb(
      async (client) =>
        (
          await client.query(
            `insert into site_features (site_id, kind, name, shape, points) values ($1, 'fence', 'Fence', 'line', '[{"x":0,"y":0},{"x":5,"y":0}]') returning id`,
            [siteId],
          )
        ).rows[0].id as string,
    );
  }

  /** A fresh site of the company (no jobs under review), with If-Match for its current version. */
  async function versionedSite(ctx: Ctx): Promise<{ siteId: string; headers: Record<string, string> }> {
    const { siteId } = await createSite(ctx.api);
    return { siteId, headers: { 'If-Match': String(await siteVersion(ctx.api, siteId)) } };
  }

  async function invitation(ctx: Ctx): Promise<string> {
    return withDb(async (client) => {
      const { rows } = await client.query(
        `insert into invitations (company_id, email, role, token_hash, expires_at)
         values ($1, $2, 'tech', $3, now() + interval '1 day') returning id`,
        [ctx.company.id, `invitee.${randomUUID()}@bad-input.example`, randomBytes(16).toString('hex')],
      );
      return rows[0].id as string;
    });
  }

  /** A job in progress with a zone, an amplifier, a speaker, a spare junction, a run with a reading, and a check. */
  async function recordedJob(ctx: Ctx) {
    const job = await insertSmallRecordedJob(ctx.company, ctx.siteId);
    return {
      ...job,
      headers: { 'If-Match': String(job.version) },
      runBody: {
        ...job.runBody,
        location: 'general',
        route: [
          { x: 0, y: 0 },
          { x: 10, y: 0 },
        ],
        depthReadings: [{ stationM: 2, depthM: 0.3 }],
        isSpare: false,
        notes: 'Along the fence',
      },
      checkBody: { ...job.checkBody, frequencyHz: 1000, isPolarityOk: true, notes: 'Meter at the amp' },
    };
  }

  /** A speaker body with every kind of field filled in (zone, ties to a site reference point, position, dates). */
  async function speakerBody(ctx: Ctx, zoneId: string): Promise<Json> {
    return {
      kind: 'speaker',
      label: 'Satellite S9',
      model: 'Model 9',
      serial: 'SN-9',
      zoneId,
      installDate: '2026-05-14',
      warrantyEnd: '2029-05-14',
      position: { x: 3, y: 4, source: 'manual', accuracyM: 0.5 },
      ties: [{ referencePointId: await referencePoint(ctx), distanceM: 5 }],
      nominalImpedanceOhm: 8,
      onwardWiring: 'parallel',
      notes: 'By the maple',
    };
  }

  async function photo(ctx: Ctx, { isDeleted = false } = {}) {
    const r = await recordedJob(ctx);
    const res = await request(server())
      .post(`/api/jobs/${r.jobId}/photos`)
      .set(bearer(ctx.session))
      .set(r.headers)
      .attach('files', photoPng, 'bad-input.png');
    if (res.status !== 201) throw new Error(`photo upload → ${res.status} ${JSON.stringify(res.body)}`);
    let version = res.body.jobVersion as number;
    const id = res.body.photos[0].id as string;
    if (isDeleted) version = (await ctx.api.expectOk('delete', `/api/photos/${id}`, undefined, { 'If-Match': String(version) })).jobVersion;
    return { id, jobId: r.jobId, runId: r.runId, headers: { 'If-Match': String(version) } };
  }

  /** A recorded job moved straight to ready to issue (version 1). */
  async function readyToIssueJob(ctx: Ctx) {
    const users = ctx.company.users;
    const job = await insertRecordedJob(ctx.company, ctx.siteId, { crewLeadUserId: users.lead.id, technicianUserIds: [] }, DEMO_AS_BUILT);
    await withDb((client) => client.query(`update jobs set status = 'ready_to_issue' where id = $1`, [job.id]));
    return job;
  }

  async function signedJob(ctx: Ctx) {
    const job = await readyToIssueJob(ctx);
    const saved = await ctx.api.expectOk('put', `/api/jobs/${job.id}/signatures/homeowner`, SIGNATURE_BODY, { 'If-Match': String(job.version) });
    return { id: job.id, version: saved.jobVersion as number };
  }

  /** An issued job with a ready revision whose stand-in files are stored. */
  async function readyPacket(ctx: Ctx): Promise<string> {
    const job = await readyToIssueJob(ctx);
    const storage = new DiskStorage(uploadsDir);
    const id = randomUUID();
    const pdf = await storage.put(`companies/${ctx.company.id}/packets/${id}/packet-rev-1.pdf`, Buffer.from('%PDF-1.4 bad input'), 'application/pdf');
    const zip = await storage.put(`companies/${ctx.company.id}/packets/${id}/packet-rev-1.zip`, Buffer.from('PK bad input'), 'application/zip');
    await withDb(async (client) => {
      await client.query(`update jobs set status = 'issued' where id = $1`, [job.id]);
      await client.query(
        `insert into packet_revisions (id, company_id, job_id, revision, status, snapshot, paper_size, pdf_key, pdf_bytes, pdf_sha256, page_count, zip_key, zip_bytes, zip_sha256, attempts)
         values ($1, $2, $3, 1, 'ready', '{}'::jsonb, 'letter', $4, $5, $6, 1, $7, $8, $9, 1)`,
        [id, ctx.company.id, job.id, pdf.key, pdf.bytes, pdf.sha256, zip.key, zip.bytes, zip.sha256],
      );
    });
    return id;
  }

  /** A failed packet e-mail of the company (on a fresh ready revision). */
  async function failedDelivery(ctx: Ctx): Promise<string> {
    const revisionId = await readyPacket(ctx);
    return withDb(async (client) => {
      const { rows } = await client.query(
        `insert into packet_deliveries (company_id, revision_id, to_address, status, attempts, last_error)
         values ($1, $2, $3, 'failed', 3, 'connect ECONNREFUSED 127.0.0.1:2525') returning id`,
        [ctx.company.id, revisionId, ctx.company.users.homeowner.email],
      );
      return rows[0].id as string;
    });
  }

  // ── what each field accepts ──────────────────────────────────────────────────────────────────────

  const label: FieldSpec = { type: 'string', min: 1, max: 120 };
  const shortText: FieldSpec = { type: 'string', max: 120 };
  const text2000: FieldSpec = { type: 'string', max: 2000 };
  const nullableText2000: FieldSpec = { type: 'string', max: 2000, nullable: true };
  const recordId: FieldSpec = { type: 'string', min: 1, max: 64 };
  const uuid: FieldSpec = { type: 'string', max: 36, format: 'uuid' };
  const coordinate: FieldSpec = { type: 'number', min: -100_000, max: 100_000 };
  const date: FieldSpec = { type: 'string', max: 10, format: 'date' };
  const email: FieldSpec = { type: 'string', max: 254, format: 'email' };
  const datetime: FieldSpec = { type: 'string', max: 40, format: 'datetime' };
  const expectedVersion: FieldSpec = { type: 'number', min: 1, max: 2 ** 31, isInteger: true };

  const siteFields: Record<string, FieldSpec> = {
    customerId: uuid,
    label,
    addressLine1: label,
    addressLine2: { type: 'string', max: 120, nullable: true },
    city: label,
    region: { type: 'string', max: 120, nullable: true },
    postalCode: { type: 'string', max: 20, nullable: true },
    country: label,
    northAzimuthDeg: { type: 'number', min: -360, max: 360 },
    origin: { type: 'object', nullable: true },
    'origin.lat': { type: 'number', min: -89.9, max: 89.9 },
    'origin.lon': { type: 'number', min: -180, max: 180 },
    // Set only by uploading the image (PUT /api/sites/:siteId/plan-image): no value of any kind is accepted here.
    planImageRef: { type: 'string', max: 0 },
    // A calibration needs a plan image first (PUT /api/sites/:siteId/plan-image), so only its type is varied here.
    planCalibration: { type: 'object', nullable: true },
    notes: nullableText2000,
  };

  const jobFields: Record<string, FieldSpec> = {
    title: { type: 'string', min: 1, max: 160 },
    crewLeadUserId: { ...uuid, nullable: true },
    technicianUserIds: { type: 'array', max: 50 },
    'technicianUserIds.0': uuid,
    startDate: { ...date, nullable: true },
    endDate: { ...date, nullable: true },
    notes: { type: 'string', max: 4000, nullable: true },
  };

  const itemFields: Record<string, FieldSpec> = {
    kind: { type: 'enum', values: ['amplifier', 'speaker', 'subwoofer', 'junction', 'spare_end', 'wall_entry'] },
    label,
    model: shortText,
    serial: shortText,
    zoneId: recordId,
    installDate: date,
    warrantyEnd: date,
    'position.x': coordinate,
    'position.source': { type: 'enum', values: ['ties', 'manual', 'gps'] },
    'position.accuracyM': { type: 'number', min: 0, max: 10_000 },
    ties: { type: 'array', max: 12 },
    'ties.0.distanceM': { type: 'number', min: 0, max: 100_000, isMinExclusive: true },
    'ties.0.referencePointId': recordId,
    nominalImpedanceOhm: { type: 'number', min: 0, max: 100_000, isMinExclusive: true },
    onwardWiring: { type: 'enum', values: ['parallel', 'series'] },
    sideHint: { type: 'enum', values: ['left', 'right'] },
    notes: text2000,
  };

  const runFields: Record<string, FieldSpec> = {
    label,
    fromItemId: recordId,
    toItemId: recordId,
    cableType: label,
    gauge: { type: 'object' },
    'gauge.awg': { type: 'number', min: -3, max: 40, isInteger: true },
    conductors: { type: 'number', min: 2, max: 32, isInteger: true },
    pairs: { type: 'array', max: 16 },
    'pairs.0.pairIndex': { type: 'number', min: 1, max: 16, isInteger: true },
    'pairs.0.channel.channelId': recordId,
    measuredLengthM: { type: 'number', min: 0, max: 100_000, isMinExclusive: true },
    method: { type: 'enum', values: ['direct_burial', 'conduit', 'under_hardscape_sleeve', 'indoor'] },
    location: { type: 'enum', values: ['general', 'under_hardscape', 'under_driveway', 'under_street', 'trench_below_concrete', 'under_building'] },
    route: { type: 'array', max: 2000 },
    'route.1.y': coordinate,
    'depthReadings.0.stationM': { type: 'number', min: 0, max: 100_000 },
    'depthReadings.0.depthM': { type: 'number', min: 0, max: 10 },
    isSpare: { type: 'boolean' },
    notes: text2000,
  };

  const checkFields: Record<string, FieldSpec> = {
    quantity: { type: 'enum', values: ['dc_resistance', 'impedance'] },
    measuredOhm: { type: 'number', min: 0, max: 1_000_000 },
    frequencyHz: { type: 'number', min: 0, max: 100_000, isMinExclusive: true },
    isPolarityOk: { type: 'boolean' },
    'channel.channelId': recordId,
    notes: text2000,
  };

  const depthReadingFields: Record<string, FieldSpec> = {
    stationM: { type: 'number', min: 0, max: 100_000 },
    depthM: { type: 'number', min: 0, max: 10 },
  };

  const SIGNATURE_BODY = { signerName: 'Bad Input Homeowner', svgPath: 'M 10 60 L 120 40 L 300 80' };

  // ── every write route ────────────────────────────────────────────────────────────────────────────

  const routes: Record<string, RouteCase> = {
    'POST /api/auth/sign-in': {
      input: 'json',
      isPublic: true,
      isThrottled: true,
      // A wrong password: even the unbroken request stores nothing.
      arrange: async (ctx) => ({ params: {}, body: { email: ctx.company.users.tech.email, password: 'not-the-password' } }),
      fields: { email, password: { type: 'string', min: 1, max: 200 } },
    },
    'POST /api/auth/refresh': { input: 'cookie', isPublic: true, arrange: async () => ({ params: {} }) },
    'POST /api/auth/sign-out': { input: 'cookie', isPublic: true, arrange: async () => ({ params: {} }) },
    'POST /api/auth/invitations/accept': {
      input: 'json',
      isPublic: true,
      arrange: async () => ({ params: {}, body: { token: randomBytes(32).toString('base64url'), name: 'Someone', password: 'long-enough-password' } }),
      fields: { token: { type: 'string', min: 20, max: 200 }, name: label, password: { type: 'string', min: 10, max: 200 } },
    },
    'POST /api/auth/password-reset': {
      input: 'json',
      isPublic: true,
      isThrottled: true,
      arrange: async () => ({ params: {}, body: { email: `nobody.${randomUUID()}@bad-input.example` } }),
      fields: { email },
    },
    'POST /api/auth/password-reset/confirm': {
      input: 'json',
      isPublic: true,
      arrange: async () => ({ params: {}, body: { token: randomBytes(32).toString('base64url'), password: 'long-enough-password' } }),
      fields: { token: { type: 'string', min: 20, max: 200 }, password: { type: 'string', min: 10, max: 200 } },
    },
    'POST /api/signup': {
      input: 'json',
      isPublic: true,
      isThrottled: true,
      // An accepted sign-up queues its verification e-mail after answering.
      hasLaterWrites: true,
      arrange: async () => ({
        params: {},
        body: { companyName: 'Bad Input Start-up', name: 'Bad Input Founder', email: `founder.${randomUUID()}@bad-input.example`, password: 'long-enough-password' },
      }),
      fields: { companyName: label, name: label, email, password: { type: 'string', min: 10, max: 200 } },
    },
    'POST /api/signup/verify': {
      input: 'json',
      isPublic: true,
      isThrottled: true,
      arrange: async () => ({ params: {}, body: { token: randomBytes(32).toString('base64url') } }),
      fields: { token: { type: 'string', min: 20, max: 200 } },
    },
    'PATCH /api/users/:id': {
      input: 'json',
      arrange: async (ctx) => ({ params: { id: (await createUser(ctx.company.id, 'tech')).id }, body: { name: 'Renamed Person', role: 'lead', isDisabled: false } }),
      fields: { name: label, role: { type: 'enum', values: ROLES }, isDisabled: { type: 'boolean' } },
    },
    'POST /api/invitations': {
      input: 'json',
      hasLaterWrites: true,
      arrange: async () => ({ params: {}, body: { email: `new.${randomUUID()}@bad-input.example`, role: 'tech', name: 'New Person' } }),
      fields: { email, role: { type: 'enum', values: ROLES }, name: label },
    },
    'PATCH /api/company/settings': {
      input: 'json',
      arrange: async () => ({ params: {}, body: { lengthUnits: 'metric', gaugeUnits: 'mm2', paperSize: 'a4' } }),
      fields: {
        lengthUnits: { type: 'enum', values: ['imperial', 'metric'] },
        gaugeUnits: { type: 'enum', values: ['awg', 'mm2'] },
        paperSize: { type: 'enum', values: ['letter', 'a4'] },
      },
    },
    'PATCH /api/company/profile': {
      input: 'json',
      arrange: async () => ({
        params: {},
        body: {
          tradeName: 'Bad Input Outdoor Sound',
          phone: '(555) 010-0190',
          email: 'office@bad-input.example',
          website: 'https://bad-input.example',
          postalAddress: '1 Test Row\nNowhere',
          licenceNumbers: ['LV-0000 (invented)'],
          timeZone: 'America/Denver',
          locale: 'en-US',
        },
      }),
      fields: {
        tradeName: label,
        phone: { type: 'string', max: 40, format: 'phone', nullable: true },
        email: { ...email, nullable: true },
        website: { type: 'string', max: 200, nullable: true },
        postalAddress: { type: 'string', max: 500, nullable: true },
        licenceNumbers: { type: 'array', max: 10 },
        timeZone: { type: 'string', max: 64, nullable: true },
        locale: { type: 'string', max: 35 },
      },
      texts: { tradeName: (r) => r.tradeName, postalAddress: (r) => r.postalAddress },
    },
    'PUT /api/company/profile/logo': { input: 'multipart', fileField: 'file', arrange: async () => ({ params: {}, body: {} }) },
    'DELETE /api/company/profile/logo': {
      input: 'none',
      arrange: async (ctx) => {
        const res = await request(server()).put('/api/company/profile/logo').set(bearer(ctx.session)).attach('file', photoPng, 'logo.png');
        if (res.status !== 200) throw new Error(`logo upload → ${res.status} ${JSON.stringify(res.body)}`);
        return { params: {} };
      },
    },
    'PUT /api/company/depth-rules': {
      input: 'json',
      arrange: async () => ({ params: {}, body: structuredClone(DEFAULT_DEPTH_RULES) as unknown as Json }),
      fields: { name: label, rules: { type: 'array', max: 200 } },
      texts: { name: (r) => r.table.name },
    },
    'DELETE /api/company/depth-rules': { input: 'none', arrange: async () => ({ params: {} }) },
    'PATCH /api/me/preferences': {
      input: 'json',
      arrange: async () => ({ params: {}, body: { lengthUnits: 'metric', gaugeUnits: null } }),
      fields: {
        lengthUnits: { type: 'enum', values: ['imperial', 'metric'], nullable: true },
        gaugeUnits: { type: 'enum', values: ['awg', 'mm2'], nullable: true },
      },
    },
    'DELETE /api/invitations/:id': { input: 'none', arrange: async (ctx) => ({ params: { id: await invitation(ctx) } }) },
    'POST /api/invitations/:id/resend': { input: 'none', arrange: async (ctx) => ({ params: { id: await invitation(ctx) } }) },
    'POST /api/analysis': {
      input: 'json',
      arrange: async () => ({ params: {}, body: { asBuilt: structuredClone(DEMO_AS_BUILT), options: { lossLimitDb: 0.5 } } }),
      fields: {
        asBuilt: { type: 'object' },
        'asBuilt.zones': { type: 'array', max: 200 },
        'asBuilt.items.0.label': label,
        'asBuilt.items.0.kind': itemFields.kind!,
        'asBuilt.runs.0.gauge.awg': runFields['gauge.awg']!,
        'asBuilt.runs.0.measuredLengthM': runFields.measuredLengthM!,
        'asBuilt.runs.1.depthReadings.0.depthM': { type: 'number', min: 0, max: 10 },
        'asBuilt.site.origin.lat': { type: 'number', min: -89.9, max: 89.9 },
        'options.lossLimitDb': { type: 'number', min: 0, max: 20, isMinExclusive: true },
      },
    },
    'POST /api/customers': {
      input: 'json',
      arrange: async () => ({ params: {}, body: { name: 'Bad input customer', email: 'someone@bad-input.example', phone: '555 0100', notes: 'Gate code at the office' } }),
      fields: { name: label, email: { ...email, nullable: true }, phone: { type: 'string', max: 40, format: 'phone', nullable: true }, notes: nullableText2000 },
      texts: { name: (r) => r.name, notes: (r) => r.notes },
    },
    'PATCH /api/customers/:id': {
      input: 'json',
      arrange: async (ctx) => ({ params: { id: await customer(ctx) }, body: { phone: '555 0100' } }),
      fields: { name: label, email: { ...email, nullable: true }, phone: { type: 'string', max: 40, format: 'phone', nullable: true }, notes: nullableText2000 },
    },
    'DELETE /api/customers/:id': { input: 'none', arrange: async (ctx) => ({ params: { id: await customer(ctx) } }) },
    'POST /api/sites': {
      input: 'json',
      arrange: async (ctx) => ({
        params: {},
        body: {
          customerId: await customer(ctx),
          label: 'Yard',
          addressLine1: '1 Nowhere Way',
          city: 'Fableford',
          country: 'Testland',
          northAzimuthDeg: 12,
          origin: { lat: 40, lon: -105 },
        },
      }),
      fields: siteFields,
      refs: ['customerId'],
      texts: { label: (r) => r.label, notes: (r) => r.notes },
    },
    // Site writes name the site's version (If-Match), as job writes name the job's.
    'PATCH /api/sites/:id': {
      input: 'json',
      isVersioned: true,
      arrange: async (ctx) => {
        const { siteId, headers } = await versionedSite(ctx);
        return { params: { id: siteId }, headers, body: { customerId: await customer(ctx), notes: 'Dog in the yard', origin: { lat: 40, lon: -105 } } };
      },
      fields: siteFields,
      refs: ['customerId'],
    },
    'DELETE /api/sites/:id': { input: 'none', arrange: async (ctx) => ({ params: { id: (await createSite(ctx.api)).siteId } }) },
    'PUT /api/sites/:siteId/plan-image': {
      input: 'multipart',
      fileField: 'file',
      isVersioned: true,
      arrange: async (ctx) => {
        const { siteId, headers } = await versionedSite(ctx);
        return { params: { siteId }, headers, body: {} };
      },
    },
    'DELETE /api/sites/:siteId/plan-image': {
      input: 'none',
      isVersioned: true,
      arrange: async (ctx) => {
        const { siteId, headers } = await versionedSite(ctx);
        const res = await request(server()).put(`/api/sites/${siteId}/plan-image`).set(bearer(ctx.session)).set(headers).attach('file', photoPng, 'plan.png');
        if (res.status !== 200) throw new Error(`plan image upload → ${res.status} ${JSON.stringify(res.body)}`);
        return { params: { siteId }, headers: { 'If-Match': String(res.body.siteVersion) } };
      },
    },
    'POST /api/sites/:siteId/reference-points': {
      input: 'json',
      isVersioned: true,
      arrange: async (ctx) => {
        const { siteId, headers } = await versionedSite(ctx);
        return { params: { siteId }, headers, body: { label: 'Gate post', x: 3, y: 4, notes: 'Painted orange' } };
      },
      fields: { label, x: coordinate, y: coordinate, notes: nullableText2000 },
      texts: { label: (r) => r.label },
    },
    'PATCH /api/sites/:siteId/reference-points/:pointId': {
      input: 'json',
      isVersioned: true,
      arrange: async (ctx) => {
        const { siteId, headers } = await versionedSite(ctx);
        return { params: { siteId, pointId: await referencePoint(ctx, siteId) }, headers, body: { x: 1 } };
      },
      fields: { label, x: coordinate, y: coordinate, notes: nullableText2000 },
    },
    'DELETE /api/sites/:siteId/reference-points/:pointId': {
      input: 'none',
      isVersioned: true,
      arrange: async (ctx) => {
        const { siteId, headers } = await versionedSite(ctx);
        return { params: { siteId, pointId: await referencePoint(ctx, siteId) }, headers };
      },
    },
    // Site features (issue 15): named outlines and lines, written as site geometry (If-Match).
    'POST /api/sites/:siteId/features': {
      input: 'json',
      isVersioned: true,
      arrange: async (ctx) => {
        const { siteId, headers } = await versionedSite(ctx);
        return { params: { siteId }, headers, body: { kind: 'fence', name: 'East fence', shape: 'line', points: [{ x: 0, y: 0 }, { x: 10, y: 0 }] } };
      },
      fields: {
        kind: { type: 'enum', values: ['house', 'outbuilding', 'fence', 'wall', 'patio', 'path', 'pool', 'spa', 'driveway', 'tree', 'bed', 'other'] },
        name: label,
        shape: { type: 'enum', values: ['polygon', 'line'] },
        points: { type: 'array', max: 500 },
        'points.0.x': coordinate,
        'points.1.y': coordinate,
      },
      texts: { name: (r) => r.name },
    },
    'PATCH /api/sites/:siteId/features/:featureId': {
      input: 'json',
      isVersioned: true,
      arrange: async (ctx) => {
        const { siteId, headers } = await versionedSite(ctx);
        return { params: { siteId, featureId: await siteFeature(siteId) }, headers, body: { name: 'Back fence' } };
      },
      fields: {
        kind: { type: 'enum', values: ['house', 'outbuilding', 'fence', 'wall', 'patio', 'path', 'pool', 'spa', 'driveway', 'tree', 'bed', 'other'] },
        name: label,
        shape: { type: 'enum', values: ['polygon', 'line'] },
        points: { type: 'array', max: 500 },
      },
      texts: { name: (r) => r.name },
    },
    'DELETE /api/sites/:siteId/features/:featureId': {
      input: 'none',
      isVersioned: true,
      arrange: async (ctx) => {
        const { siteId, headers } = await versionedSite(ctx);
        return { params: { siteId, featureId: await siteFeature(siteId) }, headers };
      },
    },
    'POST /api/sites/:siteId/homeowners': {
      input: 'json',
      arrange: async (ctx) => ({ params: { siteId: (await createSite(ctx.api)).siteId }, body: { userId: ctx.company.users.homeowner.id } }),
      fields: { userId: uuid },
      refs: ['userId'],
    },
    'POST /api/sites/:siteId/homeowner-invitations': {
      input: 'json',
      arrange: async (ctx) => ({ params: { siteId: ctx.siteId }, body: { email: `owner.${randomUUID()}@bad-input.example`, name: 'Invited Owner' } }),
      fields: { email, name: label },
      hasLaterWrites: true,
    },
    'DELETE /api/sites/:siteId/homeowners/:userId': {
      input: 'none',
      arrange: async (ctx) => {
        const { siteId } = await createSite(ctx.api);
        await ctx.api.expectOk('post', `/api/sites/${siteId}/homeowners`, { userId: ctx.company.users.homeowner.id });
        return { params: { siteId, userId: ctx.company.users.homeowner.id } };
      },
    },
    'POST /api/jobs': {
      input: 'json',
      arrange: async (ctx) => ({
        params: {},
        body: {
          siteId: ctx.siteId,
          title: 'Bad input job',
          crewLeadUserId: ctx.company.users.lead.id,
          technicianUserIds: [ctx.company.users.tech.id],
          startDate: '2026-05-01',
          endDate: '2026-05-02',
          notes: 'Sod goes down Friday',
        },
      }),
      fields: { siteId: uuid, ...jobFields },
      refs: ['siteId', 'crewLeadUserId', 'technicianUserIds.0'],
      texts: { title: (r) => r.title, notes: (r) => r.notes },
    },
    'PATCH /api/jobs/:id': {
      input: 'json',
      isVersioned: true,
      arrange: async (ctx) => {
        const r = await recordedJob(ctx);
        return {
          params: { id: r.jobId },
          jobId: r.jobId,
          headers: r.headers,
          body: { title: 'Renamed', crewLeadUserId: ctx.company.users.lead.id, technicianUserIds: [ctx.company.users.tech.id], startDate: '2026-05-01', endDate: '2026-05-02' },
        };
      },
      fields: jobFields,
      refs: ['crewLeadUserId', 'technicianUserIds.0'],
    },
    'DELETE /api/jobs/:id': {
      input: 'none',
      isVersioned: true,
      arrange: async (ctx) => {
        const r = await recordedJob(ctx);
        await withDb((client) => client.query(`update jobs set status = 'draft' where id = $1`, [r.jobId]));
        return { params: { id: r.jobId }, jobId: r.jobId, headers: r.headers };
      },
    },
    'POST /api/jobs/:id/status': {
      input: 'json',
      isVersioned: true,
      arrange: async (ctx) => {
        const r = await recordedJob(ctx);
        return { params: { id: r.jobId }, jobId: r.jobId, headers: r.headers, body: { to: 'submitted', comment: 'All buried' } };
      },
      fields: {
        to: { type: 'enum', values: ['in_progress', 'submitted', 'ready_to_issue'] },
        comment: { type: 'string', max: 2000 },
        expectedVersion,
      },
    },
    'POST /api/jobs/:jobId/zones': {
      input: 'json',
      isVersioned: true,
      arrange: async (ctx) => {
        const r = await recordedJob(ctx);
        return { params: { jobId: r.jobId }, jobId: r.jobId, headers: r.headers, body: { name: 'Spa' } };
      },
      fields: { name: label },
      texts: { name: (r) => r.zone?.name },
    },
    'PATCH /api/jobs/:jobId/zones/:zoneId': {
      input: 'json',
      isVersioned: true,
      arrange: async (ctx) => {
        const r = await recordedJob(ctx);
        return { params: { jobId: r.jobId, zoneId: r.zoneId }, jobId: r.jobId, headers: r.headers, body: { name: 'Terrace' } };
      },
      fields: { name: label },
    },
    'DELETE /api/jobs/:jobId/zones/:zoneId': {
      input: 'none',
      isVersioned: true,
      arrange: async (ctx) => {
        const r = await recordedJob(ctx);
        return { params: { jobId: r.jobId, zoneId: r.zoneId }, jobId: r.jobId, headers: r.headers };
      },
    },
    'POST /api/jobs/:jobId/items': {
      input: 'json',
      isVersioned: true,
      arrange: async (ctx) => {
        const r = await recordedJob(ctx);
        return { params: { jobId: r.jobId }, jobId: r.jobId, headers: r.headers, body: await speakerBody(ctx, r.zoneId) };
      },
      fields: itemFields,
      refs: ['zoneId', 'ties.0.referencePointId'],
      texts: { label: (r) => r.item?.label, notes: (r) => r.item?.notes },
    },
    // The amplifier here (the speaker on create): its channels keep their ids, which are references too.
    'PUT /api/jobs/:jobId/items/:itemId': {
      input: 'json',
      isVersioned: true,
      arrange: async (ctx) => {
        const r = await recordedJob(ctx);
        return {
          params: { jobId: r.jobId, itemId: r.ampId },
          jobId: r.jobId,
          headers: r.headers,
          body: {
            kind: 'amplifier',
            label: 'Amp',
            zoneId: r.zoneId,
            channels: [{ id: r.channel.channelId, name: 'Patio' }, { name: 'Spa', constantVoltage: { lineVoltage: '70V', ratedWatts: 60 } }],
            ratedWatts8Ohm: 100,
            ratedWatts4Ohm: 160,
            minimumImpedanceOhm: 4,
          },
        };
      },
      fields: {
        kind: itemFields.kind!,
        label,
        zoneId: recordId,
        channels: { type: 'array', max: 32 },
        'channels.0.name': label,
        'channels.1.constantVoltage.lineVoltage': { type: 'enum', values: ['25V', '70V', '100V'] },
        'channels.1.constantVoltage.ratedWatts': { type: 'number', min: 0, max: 100_000, isMinExclusive: true },
        ratedWatts8Ohm: { type: 'number', min: 0, max: 100_000, isMinExclusive: true },
        minimumImpedanceOhm: { type: 'number', min: 0, max: 100_000, isMinExclusive: true },
      },
      refs: ['zoneId', 'channels.0.id'],
    },
    'DELETE /api/jobs/:jobId/items/:itemId': {
      input: 'none',
      isVersioned: true,
      arrange: async (ctx) => {
        const r = await recordedJob(ctx);
        return { params: { jobId: r.jobId, itemId: r.junctionId }, jobId: r.jobId, headers: r.headers };
      },
    },
    'PUT /api/jobs/:jobId/items/:itemId/channels/:channelId/setup': {
      input: 'json',
      isVersioned: true,
      isEmptyObjectValid: true,
      arrange: async (ctx) => {
        const r = await recordedJob(ctx);
        return {
          params: { jobId: r.jobId, itemId: r.ampId, channelId: r.channel.channelId },
          jobId: r.jobId,
          headers: r.headers,
          body: { source: 'Streamer', gain: '-6 dB', polarity: 'normal', networkName: 'yard-amp', notes: 'Limiter on' },
        };
      },
      fields: {
        source: { ...shortText, nullable: true },
        gain: { ...shortText, nullable: true },
        crossover: { ...shortText, nullable: true },
        polarity: { type: 'enum', values: ['normal', 'inverted'], nullable: true },
        networkName: { ...shortText, nullable: true },
        notes: nullableText2000,
      },
    },
    'POST /api/jobs/:jobId/runs': {
      input: 'json',
      isVersioned: true,
      arrange: async (ctx) => {
        const r = await recordedJob(ctx);
        return { params: { jobId: r.jobId }, jobId: r.jobId, headers: r.headers, body: { ...r.runBody, toItemId: r.junctionId } };
      },
      fields: runFields,
      refs: ['fromItemId', 'toItemId', 'pairs.0.channel.amplifierItemId', 'pairs.0.channel.channelId'],
      texts: { label: (r) => r.run?.label, cableType: (r) => r.run?.cableType },
    },
    'PUT /api/jobs/:jobId/runs/:runId': {
      input: 'json',
      isVersioned: true,
      arrange: async (ctx) => {
        const r = await recordedJob(ctx);
        return { params: { jobId: r.jobId, runId: r.runId }, jobId: r.jobId, headers: r.headers, body: r.runBody };
      },
      fields: runFields,
      refs: ['fromItemId', 'toItemId', 'pairs.0.channel.amplifierItemId', 'pairs.0.channel.channelId'],
    },
    'DELETE /api/jobs/:jobId/runs/:runId': {
      input: 'none',
      isVersioned: true,
      arrange: async (ctx) => {
        const r = await recordedJob(ctx);
        return { params: { jobId: r.jobId, runId: r.runId }, jobId: r.jobId, headers: r.headers };
      },
    },
    'DELETE /api/jobs/:jobId/site-changes/:recordId': {
      input: 'none',
      isVersioned: true,
      arrange: async (ctx) => {
        const change = await insertSiteChange(ctx.company, ctx.siteId);
        return { params: { jobId: change.jobId, recordId: change.recordId }, jobId: change.jobId, headers: { 'If-Match': String(change.version) } };
      },
    },
    'POST /api/jobs/:jobId/runs/:runId/depth-readings': {
      input: 'json',
      isVersioned: true,
      arrange: async (ctx) => {
        const r = await recordedJob(ctx);
        return { params: { jobId: r.jobId, runId: r.runId }, jobId: r.jobId, headers: r.headers, body: { stationM: 4, depthM: 0.25 } };
      },
      fields: depthReadingFields,
    },
    'PATCH /api/jobs/:jobId/runs/:runId/depth-readings/:readingId': {
      input: 'json',
      isVersioned: true,
      arrange: async (ctx) => {
        const r = await recordedJob(ctx);
        return {
          params: { jobId: r.jobId, runId: r.runId, readingId: r.readingId },
          jobId: r.jobId,
          headers: r.headers,
          body: { stationM: 3, depthM: 0.28 },
        };
      },
      fields: depthReadingFields,
    },
    'DELETE /api/jobs/:jobId/runs/:runId/depth-readings/:readingId': {
      input: 'none',
      isVersioned: true,
      arrange: async (ctx) => {
        const r = await recordedJob(ctx);
        return { params: { jobId: r.jobId, runId: r.runId, readingId: r.readingId }, jobId: r.jobId, headers: r.headers };
      },
    },
    'POST /api/jobs/:jobId/checks': {
      input: 'json',
      isVersioned: true,
      arrange: async (ctx) => {
        const r = await recordedJob(ctx);
        return { params: { jobId: r.jobId }, jobId: r.jobId, headers: r.headers, body: { ...r.checkBody, quantity: 'impedance' } };
      },
      fields: checkFields,
      refs: ['channel.amplifierItemId', 'channel.channelId'],
      texts: { notes: (r) => r.check?.notes },
    },
    'PUT /api/jobs/:jobId/checks/:checkId': {
      input: 'json',
      isVersioned: true,
      arrange: async (ctx) => {
        const r = await recordedJob(ctx);
        return { params: { jobId: r.jobId, checkId: r.checkId }, jobId: r.jobId, headers: r.headers, body: r.checkBody };
      },
      fields: checkFields,
      refs: ['channel.amplifierItemId', 'channel.channelId'],
    },
    'DELETE /api/jobs/:jobId/checks/:checkId': {
      input: 'none',
      isVersioned: true,
      arrange: async (ctx) => {
        const r = await recordedJob(ctx);
        return { params: { jobId: r.jobId, checkId: r.checkId }, jobId: r.jobId, headers: r.headers };
      },
    },
    'POST /api/jobs/:jobId/photos': {
      input: 'multipart',
      fileField: 'files',
      isVersioned: true,
      arrange: async (ctx) => {
        const r = await recordedJob(ctx);
        return {
          params: { jobId: r.jobId },
          jobId: r.jobId,
          headers: r.headers,
          body: { caption: 'Trench', takenAt: '2026-05-14T10:00:00Z', target: JSON.stringify({ type: 'run', id: r.runId }), clientUploadId: 'upload-1' },
        };
      },
      fields: {
        caption: { type: 'string', max: 500 },
        takenAt: datetime,
        target: { type: 'object' },
        clientUploadId: { type: 'string', max: 100, format: 'clientUploadId' },
      },
    },
    'PATCH /api/photos/:id': {
      input: 'json',
      isVersioned: true,
      arrange: async (ctx) => {
        const p = await photo(ctx);
        return { params: { id: p.id }, jobId: p.jobId, headers: p.headers, body: { caption: 'Wall entry', takenAt: '2026-05-14T10:00:00Z', target: { type: 'run', id: p.runId } } };
      },
      fields: {
        caption: { type: 'string', max: 500, nullable: true },
        takenAt: { ...datetime, nullable: true },
        target: { type: 'object' },
        'target.type': { type: 'enum', values: ['job', 'item', 'run', 'depth_reading'] },
        'target.id': uuid,
        expectedVersion,
      },
      refs: ['target.id'],
      texts: { caption: (r) => r.photo?.caption ?? r.caption },
    },
    'DELETE /api/photos/:id': {
      input: 'none',
      isVersioned: true,
      arrange: async (ctx) => {
        const p = await photo(ctx);
        return { params: { id: p.id }, jobId: p.jobId, headers: p.headers };
      },
    },
    'POST /api/photos/:id/restore': {
      input: 'none',
      isVersioned: true,
      arrange: async (ctx) => {
        const p = await photo(ctx, { isDeleted: true });
        return { params: { id: p.id }, jobId: p.jobId, headers: p.headers };
      },
    },
    'POST /api/jobs/:jobId/packets': {
      input: 'json',
      isVersioned: true,
      // Without open must-fix findings no acknowledgement is needed, so `{}` is a valid issue.
      isEmptyObjectValid: true,
      // A successful issue queues the render after answering.
      hasLaterWrites: true,
      arrange: async (ctx) => {
        const job = await readyToIssueJob(ctx);
        return { params: { jobId: job.id }, jobId: job.id, headers: { 'If-Match': String(job.version) }, body: {} };
      },
      fields: { acknowledgements: { type: 'array', max: 200 }, expectedVersion },
    },
    'PUT /api/jobs/:jobId/signatures/:role': {
      input: 'json',
      isVersioned: true,
      wordParams: ['role'],
      arrange: async (ctx) => {
        const job = await readyToIssueJob(ctx);
        return { params: { jobId: job.id, role: 'homeowner' }, jobId: job.id, headers: { 'If-Match': String(job.version) }, body: { ...SIGNATURE_BODY, signedAt: '2026-05-14T10:00:00Z' } };
      },
      fields: {
        signerName: label,
        svgPath: { type: 'string', min: 1, max: 200_000, format: 'svgPath' },
        signedAt: datetime,
        expectedVersion,
      },
      texts: { signerName: (r) => r.signature?.signerName ?? r.signerName },
    },
    'DELETE /api/jobs/:jobId/signatures/:role': {
      input: 'none',
      isVersioned: true,
      wordParams: ['role'],
      arrange: async (ctx) => {
        const job = await signedJob(ctx);
        return { params: { jobId: job.id, role: 'homeowner' }, jobId: job.id, headers: { 'If-Match': String(job.version) } };
      },
    },
    'POST /api/packets/:id/send': {
      input: 'json',
      // Without `to` the packet goes to the site's homeowners, so `{}` is a valid send.
      isEmptyObjectValid: true,
      hasLaterWrites: true,
      arrange: async (ctx) => ({
        params: { id: await readyPacket(ctx) },
        body: { to: [ctx.company.users.homeowner.email], cc: ['neighbour@bad-input.example'], message: 'Your packet', pdf: 'link' },
      }),
      fields: {
        to: { type: 'array', max: 20 },
        'to.0': email,
        cc: { type: 'array', max: 5 },
        'cc.0': email,
        message: { type: 'string', max: 1000 },
        pdf: { type: 'enum', values: ['attached', 'link'] },
      },
    },
    'POST /api/deliveries/:id/resend': {
      input: 'none',
      // A successful resend queues an e-mail: only refused requests are sent.
      hasLaterWrites: true,
      arrange: async (ctx) => ({ params: { id: await failedDelivery(ctx) } }),
    },
    'POST /api/deliveries/:id/dismiss': {
      input: 'none',
      arrange: async (ctx) => ({ params: { id: await failedDelivery(ctx) } }),
    },
    'POST /api/sites/:siteId/locate-links': {
      input: 'json',
      arrange: async (ctx) => ({ params: { siteId: ctx.siteId }, body: { expiresInDays: 7, note: 'Fence crew' } }),
      fields: { expiresInDays: { type: 'number', min: 1, max: 365, isInteger: true }, note: { type: 'string', max: 500 } },
    },
    'DELETE /api/locate-links/:id': {
      input: 'none',
      arrange: async (ctx) => ({ params: { id: (await ctx.api.expectOk('post', `/api/sites/${ctx.siteId}/locate-links`, { expiresInDays: 1 })).id } }),
    },
  };

  // ── sending and checking ─────────────────────────────────────────────────────────────────────────

  interface Sent {
    method: Method;
    path: string;
    headers?: Record<string, string>;
    /** A JSON value (serialised by supertest), or raw text with its content type. */
    json?: unknown;
    raw?: { text: string | Buffer; contentType: string };
    multipart?: { fields: Record<string, string | string[]>; files: { field: string; name: string; content: Buffer; contentType?: string }[] };
    isPublic?: boolean;
  }

  /** Sends `sent` on purpose (it may write): what was refused before it is checked first. */
  async function send(sent: Sent) {
    await settleRefused();
    return sendNow(sent);
  }

  function sendNow(sent: Sent) {
    let req = request(server())[sent.method](sent.path);
    if (!sent.isPublic) req = req.set(bearer(A.session));
    for (const [name, value] of Object.entries(sent.headers ?? {})) req = req.set(name, value);
    if (sent.multipart) {
      for (const [name, value] of Object.entries(sent.multipart.fields)) {
        for (const one of Array.isArray(value) ? value : [value]) req = req.field(name, one);
      }
      for (const file of sent.multipart.files) req = req.attach(file.field, file.content, { filename: file.name, contentType: file.contentType ?? 'image/png' });
      return req;
    }
    if (sent.raw) return req.set('Content-Type', sent.raw.contentType).send(sent.raw.text as string);
    if (sent.json !== undefined) return req.send(sent.json as object);
    return req;
  }

  async function jobVersion(jobId: string | undefined): Promise<number | undefined> {
    if (!jobId) return undefined;
    const { rows } = await db.query('select version from jobs where id = $1', [jobId]);
    return rows[0]?.version as number | undefined;
  }

  /**
   * Sends `sent` and asserts the refusal: a 4xx (not 5xx, not 2xx) in the one error shape, leaking
   * nothing, naming `field` when it is a validation error, with the database and the job's version as
   * they were.
   */
  /**
   * Refused requests sent since the database's fingerprint was last taken: the fingerprint (every table's
   * row versions, tens of ms on a worker's database late in a run) is compared once for all of them, when
   * the test ends or before anything is written on purpose, rather than after each one (about 1500 times a
   * run). A failure names every request of the batch; each one's job version is still checked at once.
   */
  let refusedSince: string[] = [];

  async function settleRefused(): Promise<void> {
    if (refusedSince.length === 0) return;
    const sent = refusedSince;
    refusedSince = [];
    const after = await fingerprintDatabase(db);
    expect(changedTables(fingerprint, after), `rows changed after one of these refused requests:\n${sent.join('\n')}\n`).toEqual([]);
    fingerprint = after;
  }

  async function expectRefused(sent: Sent, what: string, { field, jobId, statuses }: { field?: string; jobId?: string; statuses?: number[] } = {}) {
    const versionBefore = await jobVersion(jobId);
    const res = await sendNow(sent);
    const context = `${sent.method.toUpperCase()} ${sent.path.slice(0, 120)} with ${what} → ${res.status} ${JSON.stringify(res.body)?.slice(0, 400)}`;
    expect(res.status, context).toBeGreaterThanOrEqual(400);
    expect(res.status, context).toBeLessThan(500);
    if (statuses) expect(statuses, context).toContain(res.status);
    expect(res.headers['content-type'] ?? '', context).toMatch(/^application\/json/);
    const body = res.body as Json;
    expect(body.statusCode, context).toBe(res.status);
    expect(typeof body.error, context).toBe('string');
    expect(typeof body.message, context).toBe('string');
    expect(Object.keys(body).filter((key) => !ERROR_KEYS.has(key)), context).toEqual([]);
    expect(JSON.stringify(body), context).not.toMatch(LEAK);
    if (field && res.status === 400) expect(namesField(body as never, field), `${context}\nthe error does not name ${field}`).toBe(true);
    refusedSince.push(context);
    expect(await jobVersion(jobId), context).toBe(versionBefore);
    expect(({} as Json).polluted, context).toBeUndefined();
    return res;
  }

  /** The arranged request as a `Sent`, with `body` in place of the arranged body. */
  function sentFor(route: string, spec: RouteCase, base: Arranged, overrides: Partial<Sent> = {}): Sent {
    const [method, pattern] = route.split(' ') as [string, string];
    return {
      method: method.toLowerCase() as Method,
      path: fill(pattern, base.params),
      headers: base.headers,
      isPublic: spec.isPublic,
      ...(spec.input === 'json' ? { json: base.body } : {}),
      ...(spec.input === 'multipart' ? { multipart: { fields: (base.body ?? {}) as Record<string, string>, files: [{ field: spec.fileField!, name: 'ok.png', content: photoPng }] } } : {}),
      ...overrides,
    };
  }

  /** Raw JSON text of `body` with the JSON text `valueText` at `field` (for values JSON.stringify cannot make). */
  function withRawValue(body: Json, field: string, valueText: string): string {
    const marker = `__raw_${randomUUID()}__`;
    return JSON.stringify(setPath(body, field, marker)).replace(JSON.stringify(marker), valueText);
  }

  const arrangedByRoute = new Map<string, Arranged>();

  const otherByRoute = new Map<string, Arranged>();

  /** The same request arranged for company B (whose ids company A's admin then sends); made once per route. */
  async function arrangedForB(route: string, spec: RouteCase): Promise<Arranged> {
    if (!otherByRoute.has(route)) {
      await settleRefused();
      otherByRoute.set(route, await spec.arrange(B));
      fingerprint = await fingerprintDatabase(db);
    }
    return otherByRoute.get(route)!;
  }

  /** Turn by turn across routes: each route sends `count` of `values`, and every value is sent by some route. */
  function inTurn<T>(values: readonly T[], routeIndex: number, count = 1): T[] {
    return Array.from({ length: Math.min(count, values.length) }, (_, k) => values[(routeIndex * count + k) % values.length]!);
  }

  async function arranged(route: string, spec: RouteCase, { isFresh = false } = {}): Promise<Arranged> {
    if (isFresh || !arrangedByRoute.has(route)) {
      await settleRefused();
      arrangedByRoute.set(route, await spec.arrange(A));
      fingerprint = await fingerprintDatabase(db);
    }
    return arrangedByRoute.get(route)!;
  }

  beforeAll(async () => {
    uploadsDir = await mkdtemp(join(tmpdir(), 'loamline-bad-input-uploads-'));
    photoPng = await makePng();
    app = await createTestApp({ override: (builder) => builder.overrideProvider(OBJECT_STORAGE).useValue(new DiskStorage(uploadsDir)) });
    db = new pg.Client({ connectionString: inject('databaseUrl') });
    await db.connect();
    const ctx = async (label: string): Promise<Ctx> => {
      const company = await createCompany(label);
      const session = await signIn(app, company.users.admin);
      const api = apiAs(app, session);
      return { company, session, api, siteId: (await createSite(api, { origin: { lat: 40, lon: -105 } })).siteId };
    };
    A = await ctx('Bad Input A');
    B = await ctx('Bad Input B');
    fingerprint = await fingerprintDatabase(db);
  });

  // Every test's refused requests are checked before the next test takes a fresh fingerprint.
  afterEach(async () => {
    await settleRefused();
  });

  afterAll(async () => {
    await db?.end();
    await app?.close();
    await rm(uploadsDir, { recursive: true, force: true });
  });

  it('should have a bad-input case for every write route the API serves', () => {
    const express = app.getHttpAdapter().getInstance() as { router: { stack: { route?: { path: string; methods: Record<string, boolean> } }[] } };
    const served = express.router.stack
      .flatMap((layer) => (layer.route ? Object.keys(layer.route.methods).map((m) => `${m.toUpperCase()} ${layer.route!.path}`) : []))
      .filter((route) => /^(POST|PUT|PATCH|DELETE) /.test(route));
    const missing = served.filter((route) => !(route in routes));
    expect(missing, `add a case to \`routes\` in test/api/bad-input.int.spec.ts for: ${missing.join(', ')}`).toEqual([]);
    const gone = Object.keys(routes).filter((route) => !served.includes(route));
    expect(gone, `these cases name routes the API no longer serves: ${gone.join(', ')}`).toEqual([]);
  });

  // Dealt out over this file and bad-input.part-*.int.spec.ts, which run in parallel.
  describe.each(thisPartOf(import.meta.url, Object.entries(routes).map(([route, spec], i) => [route, spec, i] as const)))('%s', (route, spec, routeIndex) => {
    // A failed check leaves whatever it wrote; start each test from the database as it is.
    beforeEach(async () => {
      fingerprint = await fingerprintDatabase(db);
    });

    const paramNames = [...route.matchAll(/:(\w+)/g)].map((m) => m[1]!);
    const fieldNames = Object.keys(spec.fields ?? {});

    itWhen(paramNames.length > 0)('refuses path params that are not ids, unknown ids and other companies’ ids', async () => {
      const base = await arranged(route, spec);
      const other = await arrangedForB(route, spec);
      for (const [p, name] of paramNames.entries()) {
        const isWord = spec.wordParams?.includes(name) ?? false;
        const notId = inTurn(NOT_AN_ID, routeIndex * 3 + p);
        const values = isWord ? ['owner', 'homeowner%20', ...notId] : [...notId, randomUUID(), other.params[name]!];
        for (const value of values) {
          await expectRefused(sentFor(route, spec, { ...base, params: { ...base.params, [name]: value } }), `:${name} = ${describeValue(value)}`, {
            field: name,
            jobId: base.jobId,
          });
        }
      }
    });

    // Routes on the company's own record (its logo, its depth rules) take no path params and no JSON body:
    // a malformed body must be refused before it reaches them.
    itWhen(paramNames.length === 0 && (spec.input === 'none' || spec.input === 'multipart'))('refuses a malformed JSON body and changes nothing', async () => {
      const base = await arranged(route, spec);
      for (const { name, text } of MALFORMED_JSON_BODIES.slice(0, 3)) {
        await expectRefused({ ...sentFor(route, spec, base), multipart: undefined, raw: { text, contentType: 'application/json' } }, `a body that is ${name}`, {
          statuses: [400],
        });
      }
    });

    itWhen(spec.isVersioned === true)('refuses a missing, malformed or stale job version', async () => {
      const base = await arranged(route, spec);
      const current = Number(base.headers!['If-Match']);
      const malformed = inTurn(['abc', '"1"x', '-1', '99999999999', '1.5', '1, 2', 'W/"x"', '""'], routeIndex, 2);
      const cases: [string | undefined, number[]][] = [
        [undefined, [428]],
        ...malformed.map((header): [string, number[]] => [header, [400]]),
        [String(current + 1), [412]],
      ];
      for (const [header, statuses] of cases) {
        const headers = { ...base.headers };
        delete headers['If-Match'];
        if (header !== undefined) headers['If-Match'] = header;
        const sent = sentFor(route, spec, base, { headers });
        await expectRefused(sent, `If-Match ${describeValue(header)}`, { field: header === undefined ? undefined : 'If-Match', statuses, jobId: base.jobId });
      }
      if (spec.input === 'json') {
        // The version in the body instead: far beyond any version (and beyond a 32-bit column) is a conflict, not a crash.
        const headers = { ...base.headers };
        delete headers['If-Match'];
        for (const version of [2 ** 31, 1e15]) {
          await expectRefused(sentFor(route, spec, base, { headers, json: { ...base.body, expectedVersion: version } }), `expectedVersion ${version} in the body`, {
            field: 'expectedVersion',
            statuses: [412],
            jobId: base.jobId,
          });
        }
      }
    });

    itWhen(spec.input === 'json')('refuses bodies that are not a JSON object of the right shape', async () => {
      const base = await arranged(route, spec);
      const raw = (text: string, contentType = 'application/json') => sentFor(route, spec, base, { json: undefined, raw: { text, contentType } });
      // Each route gets some of the malformed and non-object bodies in turn (the whole-API tests below send
      // every one of them to one route too).
      for (const { name, text } of [...inTurn(MALFORMED_JSON_BODIES, routeIndex), ...inTurn(NON_OBJECT_JSON_BODIES, routeIndex, 2)]) {
        await expectRefused(raw(text), `a body that is ${name}`, { jobId: base.jobId });
      }
      // The right JSON under the wrong content type is not read as JSON.
      for (const contentType of inTurn(['text/plain', 'application/x-www-form-urlencoded'], routeIndex)) {
        await expectRefused(raw(JSON.stringify(base.body), contentType), contentType, { jobId: base.jobId });
      }
      if (!spec.isEmptyObjectValid) {
        await expectRefused(sentFor(route, spec, base, { json: undefined }), 'no body at all', { jobId: base.jobId });
        await expectRefused(raw('{}'), 'an empty object', { jobId: base.jobId });
      }
      const [first] = fieldNames;
      if (first) {
        await expectRefused(raw(withRawValue(base.body!, first, deeplyNestedJson(10_000))), `${first} nested 10 000 levels deep`, { field: first, jobId: base.jobId });
        await expectRefused(raw(withRawValue(base.body!, first, deeplyNestedJson(10_000, '{"a":1}').replace(/\[/g, '{"k":').replace(/\]/g, '}'))), `${first} as 10 000 nested objects`, {
          field: first,
          jobId: base.jobId,
        });
      }
      const numeric = fieldNames.find((f) => spec.fields![f]!.type === 'number');
      if (numeric) {
        // JSON.parse reads 1e400 as Infinity and -1e400 as -Infinity.
        for (const literal of ['1e400', '-1e400']) {
          await expectRefused(raw(withRawValue(base.body!, numeric, literal)), `${numeric}: ${literal}`, { field: numeric, jobId: base.jobId });
        }
      }
      const textual = fieldNames.find((f) => spec.fields![f]!.type === 'string' && !f.includes('.'));
      if (textual) {
        // Duplicate keys: the last one wins, and it is wrong.
        const text = JSON.stringify(base.body).replace(/^\{/, `{${JSON.stringify(textual)}:"fine",`).replace(/\}$/, `,${JSON.stringify(textual)}:12345}`);
        await expectRefused(raw(text), `${textual} given twice, the second time as a number`, { field: textual, jobId: base.jobId });
      }
    });

    itWhen(fieldNames.length > 0)('refuses a wrong, out-of-range or unstorable value in any one field', async () => {
      const base = await arranged(route, spec);
      for (const field of fieldNames) {
        // Every mutated field's parent must exist in the baseline, or the mutation tests nothing.
        if (field.includes('.')) expect(getPath(base.body, field.split('.').slice(0, -1).join('.')), `${route}: baseline has no parent for ${field}`).toBeTypeOf('object');
      }
      const mutation = fc
        .constantFrom(...fieldNames)
        .chain((field) => invalidValueFor(spec.fields![field]!).map((value) => ({ field, value })))
        // A form carries only text (a number is sent as its digits, which may be a fine caption), and no
        // unpaired surrogate: the client's UTF-8 encoder replaces it before sending.
        .filter(({ value }) => spec.input !== 'multipart' || (typeof value === 'string' && value.isWellFormed()));
      await fc.assert(
        fc.asyncProperty(mutation, async ({ field, value }) => {
          const body = setPath(base.body!, field, value);
          const sent =
            spec.input === 'multipart'
              ? sentFor(route, spec, base, { multipart: { fields: body as Record<string, string>, files: [{ field: spec.fileField!, name: 'ok.png', content: photoPng }] } })
              : sentFor(route, spec, base, { json: body });
          await expectRefused(sent, `${field} = ${describeValue(value)}`, { field, jobId: base.jobId, statuses: spec.isThrottled ? undefined : [400, 413] });
        }),
        fcOptions(route.length),
      );
      // Each text field once with text no database column can hold: NUL, or (in JSON) an unpaired surrogate.
      const textFields = fieldNames.filter((f) => spec.fields![f]!.type === 'string');
      for (const [i, field] of textFields.entries()) {
        const value = i % 2 === 0 || spec.input === 'multipart' ? 'N\u0000UL' : 'half \ud83d';
        const body = setPath(base.body!, field, value);
        const sent =
          spec.input === 'multipart'
            ? sentFor(route, spec, base, { multipart: { fields: body as Record<string, string>, files: [{ field: spec.fileField!, name: 'ok.png', content: photoPng }] } })
            : sentFor(route, spec, base, { json: body });
        await expectRefused(sent, `${field} = ${describeValue(value)}`, { field, jobId: base.jobId });
      }
    });

    itWhen((spec.refs ?? []).length > 0)('refuses references to unknown records, other companies’ records and non-ids', async () => {
      const base = await arranged(route, spec);
      const other = await arrangedForB(route, spec);
      for (const [r, ref] of spec.refs!.entries()) {
        for (const value of [getPath(other.body, ref), ...inTurn([randomUUID(), 'not-a-uuid', 'x'.repeat(64)], routeIndex + r)]) {
          await expectRefused(sentFor(route, spec, base, { json: setPath(base.body!, ref, value) }), `${ref} = ${describeValue(value)}`, { field: ref, jobId: base.jobId });
        }
      }
    });

    itWhen(spec.texts !== undefined)('stores awkward but valid text exactly as sent', async () => {
      const texts = Object.keys(spec.texts ?? {});
      await fc.assert(
        fc.asyncProperty(fc.constantFrom(...texts), hostileButValidText(100), async (field, text) => {
          const base = await arranged(route, spec, { isFresh: true });
          const res = await send(sentFor(route, spec, base, { json: setPath(base.body!, field, text) }));
          expect(res.status, `${field} = ${describeValue(text)} → ${res.status} ${JSON.stringify(res.body)}`).toBeLessThan(300);
          expect(spec.texts![field]!(res.body)).toBe(text);
        }),
        // Each run arranges a fresh record (the last one was changed), so fewer of them.
        { ...fcOptions(route.length + 1), numRuns: Math.max(2, Math.ceil(RUNS / 2)) },
      );
      arrangedByRoute.delete(route);
    });

    itWhen(spec.input === 'cookie')('changes nothing for a garbage, huge or hostile refresh cookie', async () => {
      const path = route.split(' ')[1]!;
      const cookies = [
        'loamline_refresh=garbage',
        `loamline_refresh=${'x'.repeat(8000)}`,
        'loamline_refresh=%00%00',
        `loamline_refresh=${randomUUID()}.${randomBytes(32).toString('base64url')}`,
        "loamline_refresh=' or 1=1 --",
        'loamline_refresh=%E2%80%AE',
        'loamline_refresh=a; loamline_refresh=b',
      ];
      for (const cookie of cookies) {
        const res = await request(server()).post(path).set('Cookie', cookie);
        expect(res.status, `${cookie.slice(0, 60)} → ${res.status} ${JSON.stringify(res.body)}`).toBeLessThan(500);
        // Signing out with a token that is not a session is still "signed out"; a refresh is refused.
        expect(res.status).toBe(route.endsWith('refresh') ? 401 : 204);
        const after = await fingerprintDatabase(db);
        expect(changedTables(fingerprint, after), cookie.slice(0, 60)).toEqual([]);
        fingerprint = after;
      }
    });

    itWhen(spec.input === 'json')('ignores prototype-polluting keys without a crash', async () => {
      const base = await arranged(route, spec, { isFresh: true });
      const polluting = '{"__proto__":{"polluted":"yes"},"constructor":{"prototype":{"polluted":"yes"}},';
      if (spec.hasLaterWrites) {
        // Alongside a wrong field, so that nothing is sent or queued: still no crash and no pollution.
        const [first] = fieldNames;
        const text = JSON.stringify(setPath(base.body!, first!, 12345)).replace(/^\{/, polluting);
        await expectRefused(sentFor(route, spec, base, { json: undefined, raw: { text, contentType: 'application/json' } }), `prototype keys and ${first} = 12345`, {
          field: first,
        });
      } else {
        const text = JSON.stringify(base.body).replace(/^\{/, polluting);
        const res = await send(sentFor(route, spec, base, { json: undefined, raw: { text, contentType: 'application/json' } }));
        expect(res.status, JSON.stringify(res.body)).toBeLessThan(500);
      }
      expect(({} as Json).polluted).toBeUndefined();
      arrangedByRoute.delete(route);
    });
  });

  const multipartRoutes = Object.entries(routes).filter(([, spec]) => spec.input === 'multipart');

  describe.each(multipartRoutes)('multipart uploads: %s', (route, spec) => {
    const [, pattern] = route.split(' ') as [string, string];
    const fileField = spec.fileField!;

    function upload(b: Arranged, fields: Record<string, string | string[]>, files: NonNullable<Sent['multipart']>['files']): Sent {
      const method = route.split(' ')[0]!.toLowerCase() as Method;
      return { method, path: fill(pattern, b.params), headers: b.headers, multipart: { fields, files } };
    }

    it('refuses no file, a wrong field name, two files, an empty file, bytes that are not an image and huge text fields', async () => {
      fingerprint = await fingerprintDatabase(db);
      const b = await arranged(route, spec);
      const png = { field: fileField, name: 'ok.png', content: photoPng };
      const jobId = b.jobId;
      await expectRefused(upload(b, { caption: 'No file' }, []), 'a form without a file', { field: fileField, jobId });
      await expectRefused(upload(b, {}, [{ ...png, field: 'photo' }]), 'the file under the field "photo"', { jobId });
      await expectRefused(upload(b, {}, [{ ...png, content: Buffer.alloc(0) }]), 'an empty file', { jobId });
      await expectRefused(
        upload(b, {}, [{ ...png, content: Buffer.from('<svg xmlns="http://www.w3.org/2000/svg"><script>alert(1)</script></svg>'), contentType: 'image/png' }]),
        'SVG text named .png',
        { jobId },
      );
      await expectRefused(upload(b, {}, [{ ...png, content: Buffer.from('%PDF-1.4 not a photo'), name: 'x.jpg', contentType: 'image/jpeg' }]), 'a PDF named .jpg', { jobId });
      await expectRefused(upload(b, {}, [{ ...png, content: photoPng.subarray(0, 40) }]), 'a truncated PNG', { jobId });
      // More than one file where one is wanted, or more than the upload limit allows.
      const tooMany = Array.from({ length: fileField === 'file' ? 2 : 40 }, () => png);
      await expectRefused(upload(b, {}, tooMany), `${tooMany.length} files`, { jobId });
      await expectRefused(upload(b, { caption: 'c'.repeat(2 * 1024 * 1024) }, [png]), 'a 2 MB text field', { field: 'caption', jobId });
      await expectRefused(upload(b, { [`k${'e'.repeat(300)}`]: 'v', '__proto__': 'x' }, [{ ...png, content: Buffer.from('not an image') }]), 'odd field names and a non-image', { jobId });
      await expectRefused({ ...upload(b, {}, []), multipart: undefined, raw: { text: JSON.stringify({ caption: 'JSON, not a form' }), contentType: 'application/json' } }, 'a JSON body instead of a form', {
        jobId,
      });
      await expectRefused(
        {
          ...upload(b, {}, []),
          multipart: undefined,
          raw: { text: `--x\r\nContent-Disposition: form-data; name="${fileField}"; filename="a.png"\r\n\r\nabc`, contentType: 'multipart/form-data; boundary=x' },
        },
        'a multipart body cut off mid-part',
        { jobId },
      );
      await expectRefused({ ...upload(b, {}, []), multipart: undefined, raw: { text: 'abc', contentType: 'multipart/form-data' } }, 'multipart without a boundary', { jobId });
    });

    itWhen(route === 'POST /api/jobs/:jobId/photos')('refuses a photo target that is broken, unknown or another company’s, and mismatched upload ids', async () => {
      fingerprint = await fingerprintDatabase(db);
      const b = await arranged(route, spec);
      const png = { field: fileField, name: 'ok.png', content: photoPng };
      const jobId = b.jobId;
      await expectRefused(upload(b, { target: '{"type":"run","id":' }, [png]), 'a target that is broken JSON', { field: 'target', jobId });
      await expectRefused(upload(b, { target: JSON.stringify({ type: 'run', id: randomUUID() }) }, [png]), 'a target run that does not exist', { field: 'target', jobId });
      await settleRefused();
      const other = await spec.arrange(B);
      fingerprint = await fingerprintDatabase(db);
      await expectRefused(upload(b, { target: other.body!.target as string }, [png]), 'another company’s run as target', { field: 'target', jobId });
      await expectRefused(upload(b, { clientUploadId: ['a', 'b'] }, [png]), 'two client upload ids for one file', { field: 'clientUploadId', jobId });
    });
  });

  describe('the whole API', () => {
    it('refuses a JSON body over the size limit with 413 before any route sees it', async () => {
      const big = JSON.stringify({ name: 'z'.repeat(6 * 1024 * 1024) });
      await expectRefused({ method: 'post', path: '/api/customers', raw: { text: big, contentType: 'application/json' } }, 'a 6 MB body', { statuses: [413] });
    });

    it('refuses every kind of malformed or non-object JSON, and a body nested 100 000 levels deep, without a crash', async () => {
      for (const { name, text } of [...MALFORMED_JSON_BODIES, ...NON_OBJECT_JSON_BODIES]) {
        await expectRefused({ method: 'post', path: '/api/customers', raw: { text, contentType: 'application/json' } }, `a body that is ${name}`, { statuses: [400] });
      }
      await expectRefused({ method: 'post', path: '/api/customers', raw: { text: deeplyNestedJson(100_000), contentType: 'application/json' } }, 'a body nested 100 000 levels deep', {
        statuses: [400],
      });
    });

    it('refuses a 10 000-level nested as-built on the stateless analysis without a crash', async () => {
      const text = `{"asBuilt":${deeplyNestedJson(10_000, '{}').replace(/\[\{\}\]/, '{}')}}`;
      await expectRefused({ method: 'post', path: '/api/analysis', raw: { text, contentType: 'application/json' } }, 'a deeply nested as-built', { field: 'asBuilt' });
    });

    // Found by this suite: a form-encoded body (parsed by Nest's default urlencoded parser into one stray
    // key) reached PUT …/channels/:channelId/setup as {}, a valid "every field empty" replace, and wiped the setup.
    it('refuses a body that is neither JSON nor multipart with 415, and lets a bare POST through', async () => {
      const r = await routes['PUT /api/jobs/:jobId/items/:itemId/channels/:channelId/setup']!.arrange(A);
      fingerprint = await fingerprintDatabase(db);
      const path = fill('/api/jobs/:jobId/items/:itemId/channels/:channelId/setup', r.params);
      for (const contentType of ['application/x-www-form-urlencoded', 'text/plain', 'application/xml']) {
        await expectRefused({ method: 'put', path, headers: r.headers, raw: { text: 'gain=-6', contentType } }, contentType, { statuses: [415], jobId: r.jobId });
      }
      const res = await request(server()).post('/api/auth/sign-out').set('Content-Length', '0');
      expect(res.status).toBe(204);
    });

    it('keeps answering after all of the above', async () => {
      const res = await request(server()).get('/api/health');
      expect(res.status).toBe(200);
    });
  });

  // The arbitrary behind the unstorable-text mutations must make what it says, or those cases test nothing.
  it('makes unstorable strings that really are unstorable', () => {
    fc.assert(fc.property(unstorableString(), (s) => s.includes('\u0000') || !s.isWellFormed()), { seed: SEED, numRuns: 50 });
  });
});
