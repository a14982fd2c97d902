import { sql } from 'drizzle-orm';
import {
  bigserial,
  boolean,
  check,
  date,
  doublePrecision,
  foreignKey,
  index,
  integer,
  jsonb,
  pgEnum,
  pgTable,
  primaryKey,
  smallint,
  text,
  timestamp,
  unique,
  uniqueIndex,
  uuid,
} from 'drizzle-orm/pg-core';

import { CvLineVoltageSchema } from '../../domain/as-built/common.schema.js';
import { OnwardWiringSchema } from '../../domain/as-built/item.schema.js';
import { BurialLocationSchema, InstallMethodSchema } from '../../domain/as-built/run.schema.js';
import { JOB_STATUSES } from '../../domain/jobs/job-rules.js';
import { companies } from './companies.js';
import { referencePoints, sites } from './sites.js';
import { users } from './users.js';

/*
 * A job's as-built, normalised. Child rows cascade with their job (a draft job can be deleted whole);
 * references between children (a run's ends, a pair's channel, a tie's reference point) use the
 * default NO ACTION, so deleting something still in use fails instead of silently breaking the record.
 * NO ACTION (not RESTRICT) is checked at the end of the statement, so cascading a whole job still works.
 * Every table sorts by a `seq` (insertion order) so the as-built's arrays, and the paths of findings
 * into them, are stable between reads.
 */

/** A zod enum's values as the non-empty tuple pgEnum takes. */
const values = <T extends string>(options: readonly T[]) => options as [T, ...T[]];

// Enums take their values from the domain contracts, so the database and the API cannot drift apart.
export const jobStatus = pgEnum('job_status', JOB_STATUSES);

export const jobs = pgTable(
  'jobs',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    companyId: uuid('company_id')
      .notNull()
      .references(() => companies.id),
    // A site with jobs cannot be deleted: the jobs are the site's history.
    siteId: uuid('site_id')
      .notNull()
      .references(() => sites.id),
    title: text('title').notNull(),
    crewLeadUserId: uuid('crew_lead_user_id').references(() => users.id, { onDelete: 'set null' }),
    startDate: date('start_date', { mode: 'string' }),
    endDate: date('end_date', { mode: 'string' }),
    status: jobStatus('status').notNull().default('draft'),
    /** 1 for the first issue; reopening an issued job makes the next revision. */
    revision: integer('revision').notNull().default(1),
    /** Optimistic lock: every write to the job or any child row must name it and bumps it. */
    version: integer('version').notNull().default(1),
    notes: text('notes'),
    /** The office's comment when sending a submitted job back to the crew. */
    reviewComment: text('review_comment'),
    createdByUserId: uuid('created_by_user_id').references(() => users.id, { onDelete: 'set null' }),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
    updatedAt: timestamp('updated_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    index('jobs_company_id_status_idx').on(t.companyId, t.status),
    index('jobs_company_id_updated_at_idx').on(t.companyId, t.updatedAt),
    index('jobs_site_id_idx').on(t.siteId),
    index('jobs_crew_lead_user_id_idx').on(t.crewLeadUserId),
    index('jobs_created_by_user_id_idx').on(t.createdByUserId),
    check('jobs_revision_positive', sql`${t.revision} >= 1`),
    check('jobs_dates_ordered', sql`${t.startDate} is null or ${t.endDate} is null or ${t.startDate} <= ${t.endDate}`),
  ],
);

/** Technicians (and extra leads) assigned to a job's crew. */
export const jobTechnicians = pgTable(
  'job_technicians',
  {
    jobId: uuid('job_id')
      .notNull()
      .references(() => jobs.id, { onDelete: 'cascade' }),
    userId: uuid('user_id')
      .notNull()
      .references(() => users.id, { onDelete: 'cascade' }),
  },
  (t) => [primaryKey({ columns: [t.jobId, t.userId] }), index('job_technicians_user_id_idx').on(t.userId)],
);

export const zones = pgTable(
  'zones',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    jobId: uuid('job_id')
      .notNull()
      .references(() => jobs.id, { onDelete: 'cascade' }),
    seq: bigserial('seq', { mode: 'number' }).notNull(),
    name: text('name').notNull(),
    /** When the zone was added: one a reopened job added after its last issue is not yet the site's. */
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index('zones_job_id_idx').on(t.jobId, t.seq)],
);

export const itemKind = pgEnum('item_kind', ['amplifier', 'speaker', 'subwoofer', 'junction', 'spare_end', 'wall_entry']);
export const positionSource = pgEnum('position_source', ['ties', 'manual', 'gps']);
export const sideHint = pgEnum('side_hint', ['left', 'right']);
export const cvLineVoltage = pgEnum('cv_line_voltage', values(CvLineVoltageSchema.options));
export const onwardWiring = pgEnum('onward_wiring', values(OnwardWiringSchema.options));
export const voiceCoils = pgEnum('voice_coils', ['single', 'dual']);
export const coilWiring = pgEnum('coil_wiring', ['series', 'parallel', 'separate_channels']);

/**
 * Equipment items of every kind in one table, with the kind-specific fields as nullable columns.
 * Why not one extension table per kind: the six kinds add only a handful of scalar columns each; one
 * table keeps every run end, zone and tie a plain foreign key to `items`, loads a job's equipment in a
 * single query, and lets an item change kind without moving rows. Per-kind CHECK constraints keep the
 * required fields of each kind present. Wall entries are items (runs pass through them), so their
 * fields (material, hole, sleeve, sealant, inside/outside location) live here too.
 */
export const items = pgTable(
  'items',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    /** The job that installed the item (a draft job deleted whole takes its items with it). */
    jobId: uuid('job_id')
      .notNull()
      .references(() => jobs.id, { onDelete: 'cascade' }),
    /** The property the item is installed at: the record belongs to the site, later jobs build on it. */
    siteId: uuid('site_id')
      .notNull()
      .references(() => sites.id),
    /** The installing job's work date (its end date, else its start date, else the day it was recorded). */
    installedOn: date('installed_on', { mode: 'string' }).notNull(),
    /** The job that left the item abandoned in place, and its work date; null while in service. */
    abandonedByJobId: uuid('abandoned_by_job_id').references(() => jobs.id),
    abandonedOn: date('abandoned_on', { mode: 'string' }),
    /** The job that took the item out, and its work date; a removed item is no longer part of the system. */
    removedByJobId: uuid('removed_by_job_id').references(() => jobs.id),
    removedOn: date('removed_on', { mode: 'string' }),
    seq: bigserial('seq', { mode: 'number' }).notNull(),
    kind: itemKind('kind').notNull(),
    label: text('label').notNull(),
    model: text('model'),
    serial: text('serial'),
    zoneId: uuid('zone_id').references(() => zones.id, { onDelete: 'set null' }),
    installDate: date('install_date', { mode: 'string' }),
    warrantyEnd: date('warranty_end', { mode: 'string' }),
    positionX: doublePrecision('position_x'),
    positionY: doublePrecision('position_y'),
    positionSource: positionSource('position_source'),
    positionAccuracyM: doublePrecision('position_accuracy_m'),
    sideHint: sideHint('side_hint'),
    notes: text('notes'),
    // amplifier
    ratedWatts8Ohm: doublePrecision('rated_watts_8_ohm'),
    ratedWatts4Ohm: doublePrecision('rated_watts_4_ohm'),
    minimumImpedanceOhm: doublePrecision('minimum_impedance_ohm'),
    // speaker
    nominalImpedanceOhm: doublePrecision('nominal_impedance_ohm'),
    cvLineVoltage: cvLineVoltage('cv_line_voltage'),
    cvTapWatts: doublePrecision('cv_tap_watts'),
    dcResistanceOhm: doublePrecision('dc_resistance_ohm'),
    // speaker and subwoofer
    onwardWiring: onwardWiring('onward_wiring'),
    // subwoofer
    voiceCoils: voiceCoils('voice_coils'),
    coilImpedanceOhm: doublePrecision('coil_impedance_ohm'),
    coilWiring: coilWiring('coil_wiring'),
    dcResistanceOhmPerCoil: doublePrecision('dc_resistance_ohm_per_coil'),
    // junction
    spliceType: text('splice_type'),
    isAccessible: boolean('is_accessible'),
    // spare end
    isCapped: boolean('is_capped'),
    marker: text('marker'),
    // wall entry
    wallMaterial: text('wall_material'),
    holeDiameterM: doublePrecision('hole_diameter_m'),
    sleeve: text('sleeve'),
    sealant: text('sealant'),
    insideLocation: text('inside_location'),
    outsideLocation: text('outside_location'),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
    updatedAt: timestamp('updated_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    index('items_job_id_idx').on(t.jobId, t.seq),
    index('items_site_id_idx').on(t.siteId, t.seq),
    index('items_zone_id_idx').on(t.zoneId),
    check('items_abandoned_complete', sql`(${t.abandonedByJobId} is null) = (${t.abandonedOn} is null)`),
    check('items_removed_complete', sql`(${t.removedByJobId} is null) = (${t.removedOn} is null)`),
    check(
      'items_position_complete',
      sql`(${t.positionX} is null) = (${t.positionY} is null) and (${t.positionX} is null) = (${t.positionSource} is null)`,
    ),
    check(
      'items_amplifier_fields',
      sql`${t.kind} <> 'amplifier' or (${t.ratedWatts8Ohm} is not null and ${t.minimumImpedanceOhm} is not null)`,
    ),
    check(
      'items_speaker_fields',
      sql`${t.kind} <> 'speaker' or ((${t.nominalImpedanceOhm} is null) <> (${t.cvTapWatts} is null) and (${t.cvTapWatts} is null) = (${t.cvLineVoltage} is null))`,
    ),
    check(
      'items_subwoofer_fields',
      sql`${t.kind} <> 'subwoofer' or (${t.voiceCoils} is not null and ${t.coilImpedanceOhm} is not null)`,
    ),
    check('items_spare_end_fields', sql`${t.kind} <> 'spare_end' or ${t.isCapped} is not null`),
  ],
);

export const channelPolarity = pgEnum('channel_polarity', ['normal', 'inverted']);

/**
 * Output channels of an amplifier item, with the channel's setup as left by the crew. Passwords are
 * never stored: the network name is the only network detail kept.
 */
export const amplifierChannels = pgTable(
  'amplifier_channels',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    itemId: uuid('item_id')
      .notNull()
      .references(() => items.id, { onDelete: 'cascade' }),
    seq: bigserial('seq', { mode: 'number' }).notNull(),
    name: text('name').notNull(),
    cvLineVoltage: cvLineVoltage('cv_line_voltage'),
    cvRatedWatts: doublePrecision('cv_rated_watts'),
    source: text('source'),
    gain: text('gain'),
    volumeLimit: text('volume_limit'),
    eq: text('eq'),
    crossover: text('crossover'),
    polarity: channelPolarity('polarity'),
    firmware: text('firmware'),
    networkName: text('network_name'),
    setupNotes: text('setup_notes'),
  },
  (t) => [
    index('amplifier_channels_item_id_idx').on(t.itemId, t.seq),
    // Target of the (amplifier item, channel) composite keys of pairs and checks.
    unique('amplifier_channels_item_id_id_key').on(t.itemId, t.id),
    check('amplifier_channels_cv_complete', sql`(${t.cvLineVoltage} is null) = (${t.cvRatedWatts} is null)`),
  ],
);

/** A taped distance from a site reference point to an item. */
export const itemTies = pgTable(
  'item_ties',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    itemId: uuid('item_id')
      .notNull()
      .references(() => items.id, { onDelete: 'cascade' }),
    referencePointId: uuid('reference_point_id')
      .notNull()
      .references(() => referencePoints.id),
    ordinal: smallint('ordinal').notNull(),
    distanceM: doublePrecision('distance_m').notNull(),
  },
  (t) => [
    unique('item_ties_item_id_reference_point_id_key').on(t.itemId, t.referencePointId),
    unique('item_ties_item_id_ordinal_key').on(t.itemId, t.ordinal),
    index('item_ties_reference_point_id_idx').on(t.referencePointId),
  ],
);

export const gaugeSystem = pgEnum('gauge_system', ['awg', 'mm2']);
export const installMethod = pgEnum('install_method', values(InstallMethodSchema.options));
export const burialLocation = pgEnum('burial_location', values(BurialLocationSchema.options));

/**
 * One cable between two items of the site's system (a later job's run may start at an earlier job's
 * spare end, splice or amplifier). Lifecycle columns as on `items`.
 */
export const runs = pgTable(
  'runs',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    /** The job that installed the run. */
    jobId: uuid('job_id')
      .notNull()
      .references(() => jobs.id, { onDelete: 'cascade' }),
    siteId: uuid('site_id')
      .notNull()
      .references(() => sites.id),
    installedOn: date('installed_on', { mode: 'string' }).notNull(),
    abandonedByJobId: uuid('abandoned_by_job_id').references(() => jobs.id),
    abandonedOn: date('abandoned_on', { mode: 'string' }),
    removedByJobId: uuid('removed_by_job_id').references(() => jobs.id),
    removedOn: date('removed_on', { mode: 'string' }),
    seq: bigserial('seq', { mode: 'number' }).notNull(),
    label: text('label').notNull(),
    fromItemId: uuid('from_item_id')
      .notNull()
      .references(() => items.id),
    toItemId: uuid('to_item_id')
      .notNull()
      .references(() => items.id),
    cableType: text('cable_type').notNull(),
    gaugeSystem: gaugeSystem('gauge_system').notNull(),
    gaugeAwg: integer('gauge_awg'),
    gaugeMm2: doublePrecision('gauge_mm2'),
    conductors: integer('conductors').notNull(),
    measuredLengthM: doublePrecision('measured_length_m').notNull(),
    method: installMethod('method').notNull(),
    location: burialLocation('location'),
    isSpare: boolean('is_spare').notNull().default(false),
    isAbandoned: boolean('is_abandoned').notNull().default(false),
    notes: text('notes'),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
    updatedAt: timestamp('updated_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    index('runs_job_id_idx').on(t.jobId, t.seq),
    index('runs_site_id_idx').on(t.siteId, t.seq),
    index('runs_from_item_id_idx').on(t.fromItemId),
    check('runs_abandoned_complete', sql`(${t.abandonedByJobId} is null) = (${t.abandonedOn} is null)`),
    check('runs_removed_complete', sql`(${t.removedByJobId} is null) = (${t.removedOn} is null)`),
    index('runs_to_item_id_idx').on(t.toItemId),
    check(
      'runs_gauge_matches_system',
      sql`(${t.gaugeSystem} = 'awg' and ${t.gaugeAwg} is not null and ${t.gaugeMm2} is null)
        or (${t.gaugeSystem} = 'mm2' and ${t.gaugeMm2} is not null and ${t.gaugeAwg} is null)`,
    ),
    check('runs_ends_differ', sql`${t.fromItemId} <> ${t.toItemId}`),
  ],
);

/** Which pair of a run carries which amplifier channel; both channel columns null = a spare pair. */
export const runPairs = pgTable(
  'run_pairs',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    runId: uuid('run_id')
      .notNull()
      .references(() => runs.id, { onDelete: 'cascade' }),
    pairIndex: smallint('pair_index').notNull(),
    amplifierItemId: uuid('amplifier_item_id'),
    channelId: uuid('channel_id'),
  },
  (t) => [
    unique('run_pairs_run_id_pair_index_key').on(t.runId, t.pairIndex),
    index('run_pairs_amplifier_item_id_channel_id_idx').on(t.amplifierItemId, t.channelId),
    index('run_pairs_channel_id_idx').on(t.channelId),
    // The composite key makes "channel X of amplifier Y" impossible to store inconsistently.
    foreignKey({
      name: 'run_pairs_channel_fk',
      columns: [t.amplifierItemId, t.channelId],
      foreignColumns: [amplifierChannels.itemId, amplifierChannels.id],
    }),
    check('run_pairs_channel_complete', sql`(${t.amplifierItemId} is null) = (${t.channelId} is null)`),
  ],
);

/** The route polyline of a run on the plan, in order. */
export const runRoutePoints = pgTable(
  'run_route_points',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    runId: uuid('run_id')
      .notNull()
      .references(() => runs.id, { onDelete: 'cascade' }),
    ordinal: integer('ordinal').notNull(),
    x: doublePrecision('x').notNull(),
    y: doublePrecision('y').notNull(),
    /**
     * How the bend was placed (issue 17): 'gps' = the phone's fix, 'manual' = placed on the plan, 'ties'.
     * NULL = not stated: every bend stored before sources were kept, and bends drawn on the plan by the
     * route tool, which sends no source; they read back without one and count as drawn by hand.
     */
    source: positionSource('source'),
    /** Estimated horizontal error of the placement, metres; required for a GPS bend. */
    accuracyM: doublePrecision('accuracy_m'),
  },
  (t) => [
    unique('run_route_points_run_id_ordinal_key').on(t.runId, t.ordinal),
    check('run_route_points_gps_accuracy', sql`${t.source} is distinct from 'gps' or ${t.accuracyM} is not null`),
    check('run_route_points_accuracy_nonnegative', sql`${t.accuracyM} is null or ${t.accuracyM} >= 0`),
  ],
);

/** Cover (top of cable to finished grade) measured at a station along a run from its from-end, metres. */
export const depthReadings = pgTable(
  'depth_readings',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    runId: uuid('run_id')
      .notNull()
      .references(() => runs.id, { onDelete: 'cascade' }),
    seq: bigserial('seq', { mode: 'number' }).notNull(),
    stationM: doublePrecision('station_m').notNull(),
    depthM: doublePrecision('depth_m').notNull(),
    recordedByUserId: uuid('recorded_by_user_id').references(() => users.id, { onDelete: 'set null' }),
    recordedAt: timestamp('recorded_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    index('depth_readings_run_id_idx').on(t.runId, t.stationM),
    index('depth_readings_recorded_by_user_id_idx').on(t.recordedByUserId),
  ],
);

export const checkQuantity = pgEnum('check_quantity', ['dc_resistance', 'impedance']);

/** A measurement at the amplifier end of one channel, compared with the computed value by the analysis. */
export const commissioningChecks = pgTable(
  'commissioning_checks',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    jobId: uuid('job_id')
      .notNull()
      .references(() => jobs.id, { onDelete: 'cascade' }),
    seq: bigserial('seq', { mode: 'number' }).notNull(),
    amplifierItemId: uuid('amplifier_item_id').notNull(),
    channelId: uuid('channel_id').notNull(),
    quantity: checkQuantity('quantity').notNull(),
    measuredOhm: doublePrecision('measured_ohm').notNull(),
    frequencyHz: doublePrecision('frequency_hz'),
    isPolarityOk: boolean('is_polarity_ok'),
    isInsulationOk: boolean('is_insulation_ok'),
    notes: text('notes'),
    recordedByUserId: uuid('recorded_by_user_id').references(() => users.id, { onDelete: 'set null' }),
    recordedAt: timestamp('recorded_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    index('commissioning_checks_job_id_idx').on(t.jobId, t.seq),
    index('commissioning_checks_amplifier_item_id_channel_id_idx').on(t.amplifierItemId, t.channelId),
    index('commissioning_checks_channel_id_idx').on(t.channelId),
    index('commissioning_checks_recorded_by_user_id_idx').on(t.recordedByUserId),
    foreignKey({
      name: 'commissioning_checks_channel_fk',
      columns: [t.amplifierItemId, t.channelId],
      foreignColumns: [amplifierChannels.itemId, amplifierChannels.id],
    }),
  ],
);

export const siteRecordKind = pgEnum('site_record_kind', ['item', 'run']);
export const siteRecordChange = pgEnum('site_record_change', ['changed', 'abandoned', 'removed']);

/**
 * A job's change to a record of the site's system that an earlier job installed (or this job issued in
 * an earlier revision): the record's fields changed (a spare run made live, an amplifier setting), or it
 * was abandoned in place or removed. One row per job, record and issue cycle: `before` is the record
 * (as-built JSON) as it stood before the cycle's first change, so the change can be shown and undone.
 * `issuedAt` is set when the job's packet is issued, and an issued row is never changed again: a
 * reopened job's further change to the record is a new unissued row whose `before` is the record as
 * issued (hence at most one UNISSUED row per job and record). An unissued change locks the record
 * against changes by another open job of the site (409).
 */
export const siteRecordChanges = pgTable(
  'site_record_changes',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    siteId: uuid('site_id')
      .notNull()
      .references(() => sites.id),
    jobId: uuid('job_id')
      .notNull()
      .references(() => jobs.id, { onDelete: 'cascade' }),
    recordKind: siteRecordKind('record_kind').notNull(),
    recordId: uuid('record_id').notNull(),
    change: siteRecordChange('change').notNull(),
    before: jsonb('before').$type<Record<string, unknown>>().notNull(),
    changedOn: date('changed_on', { mode: 'string' }).notNull(),
    issuedAt: timestamp('issued_at', { withTimezone: true }),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
    updatedAt: timestamp('updated_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    // Issued rows are the history revisions relied on; only the open cycle's row is unique.
    uniqueIndex('site_record_changes_open_job_id_record_id_key')
      .on(t.jobId, t.recordId)
      .where(sql`${t.issuedAt} is null`),
    index('site_record_changes_record_id_idx').on(t.recordId),
    index('site_record_changes_site_id_idx').on(t.siteId),
  ],
);

export type Job = typeof jobs.$inferSelect;
export type NewJob = typeof jobs.$inferInsert;
export type JobStatus = (typeof jobStatus.enumValues)[number];
export type ZoneRow = typeof zones.$inferSelect;
export type ItemRow = typeof items.$inferSelect;
export type NewItemRow = typeof items.$inferInsert;
export type AmplifierChannelRow = typeof amplifierChannels.$inferSelect;
export type NewAmplifierChannelRow = typeof amplifierChannels.$inferInsert;
export type ItemTieRow = typeof itemTies.$inferSelect;
export type NewItemTieRow = typeof itemTies.$inferInsert;
export type RunRow = typeof runs.$inferSelect;
export type NewRunRow = typeof runs.$inferInsert;
export type RunPairRow = typeof runPairs.$inferSelect;
export type NewRunPairRow = typeof runPairs.$inferInsert;
export type RunRoutePointRow = typeof runRoutePoints.$inferSelect;
export type NewRunRoutePointRow = typeof runRoutePoints.$inferInsert;
export type DepthReadingRow = typeof depthReadings.$inferSelect;
export type NewDepthReadingRow = typeof depthReadings.$inferInsert;
export type SiteRecordChangeRow = typeof siteRecordChanges.$inferSelect;
export type NewSiteRecordChangeRow = typeof siteRecordChanges.$inferInsert;
export type CommissioningCheckRow = typeof commissioningChecks.$inferSelect;
export type NewCommissioningCheckRow = typeof commissioningChecks.$inferInsert;
