import type { AsBuilt } from '../domain/as-built/as-built.schema.js';
import type { AmplifierChannel, Item, Position } from '../domain/as-built/item.schema.js';
import type { RoutePoint, Run } from '../domain/as-built/run.schema.js';
import type { CommissioningCheck } from '../domain/checks/commissioning-check.schema.js';
import type { ChannelSetup } from '../domain/jobs/job-record.schema.js';
import type { SiteRecordInfo } from '../domain/jobs/job.schema.js';
import type { SiteFeatureKind, SiteFeatureShape } from '../domain/sites/site-feature.schema.js';
import type {
  AmplifierChannelRow,
  CommissioningCheckRow,
  DepthReadingRow,
  ItemRow,
  ItemTieRow,
  NewAmplifierChannelRow,
  NewCommissioningCheckRow,
  NewItemRow,
  NewItemTieRow,
  NewRunPairRow,
  NewRunRoutePointRow,
  NewRunRow,
  ReferencePointRow,
  SiteFeatureRow,
  SiteRecordChangeRow,
  RunPairRow,
  RunRoutePointRow,
  RunRow,
  Site,
  ZoneRow,
} from '../db/schema/index.js';

/*
 * Pure mapping between a job's normalised rows and the as-built contract (AsBuiltSchema), both ways.
 * Optional as-built fields are omitted (not null) when the column is null, so a record read back
 * equals the one written.
 */

/** Everything the as-built of one job is made of, as loaded by JobsRepository.loadRecord. */
export interface JobRecordRows {
  site: Pick<Site, 'northAzimuthDeg' | 'originLat' | 'originLon'>;
  zones: ZoneRow[];
  referencePoints: ReferencePointRow[];
  /** The site's features (landmarks); absent where the caller does not load them. */
  features?: SiteFeatureRow[];
  items: ItemRow[];
  channels: AmplifierChannelRow[];
  ties: ItemTieRow[];
  runs: RunRow[];
  pairs: RunPairRow[];
  routePoints: RunRoutePointRow[];
  depthReadings: DepthReadingRow[];
  checks: CommissioningCheckRow[];
  /** Who installed and changed the records of the site's system (absent where the caller does not load it). */
  system?: {
    /** The job whose view of the system this is. */
    jobId: string;
    /** Titles of the site's jobs by id. */
    jobTitles: Record<string, string>;
    /** Changes by jobs to records earlier jobs installed, oldest first. */
    changes: SiteRecordChangeRow[];
    /** Records of earlier jobs this job removed (no longer part of its system). */
    removedByThisJob: { kind: 'item' | 'run'; id: string; label: string; removedOn: string }[];
    /** When this job last issued a packet revision (null: never); its records added by then are issued. */
    lastIssuedAt?: Date | null;
  };
}

type Defined<T> = { [K in keyof T]: Exclude<T[K], null> };

/** Drops null and undefined values so optional as-built fields are absent rather than null. */
function present<T extends Record<string, unknown>>(fields: T): Partial<Defined<T>> {
  return Object.fromEntries(Object.entries(fields).filter(([, v]) => v !== null && v !== undefined)) as Partial<Defined<T>>;
}

function groupBy<T>(rows: readonly T[], key: (row: T) => string): Map<string, T[]> {
  const groups = new Map<string, T[]>();
  for (const row of rows) {
    const k = key(row);
    const list = groups.get(k);
    if (list) list.push(row);
    else groups.set(k, [row]);
  }
  return groups;
}

const bySeq = (a: { seq: number }, b: { seq: number }) => a.seq - b.seq;

function toPosition(row: ItemRow): Position | undefined {
  if (row.positionX === null || row.positionY === null || row.positionSource === null) return undefined;
  return { x: row.positionX, y: row.positionY, source: row.positionSource, ...present({ accuracyM: row.positionAccuracyM }) };
}

function toChannel(row: AmplifierChannelRow): AmplifierChannel {
  return {
    id: row.id,
    name: row.name,
    ...(row.cvLineVoltage !== null && row.cvRatedWatts !== null
      ? { constantVoltage: { lineVoltage: row.cvLineVoltage, ratedWatts: row.cvRatedWatts } }
      : {}),
  };
}

function toItem(row: ItemRow, channels: AmplifierChannelRow[], ties: ItemTieRow[]): Item {
  const position = toPosition(row);
  const base = {
    id: row.id,
    label: row.label,
    ...present({
      model: row.model,
      serial: row.serial,
      zoneId: row.zoneId,
      installDate: row.installDate,
      warrantyEnd: row.warrantyEnd,
    }),
    ...(position ? { position } : {}),
    ...(ties.length > 0
      ? {
          ties: [...ties]
            .sort((a, b) => a.ordinal - b.ordinal)
            .map((t) => ({ referencePointId: t.referencePointId, distanceM: t.distanceM })),
        }
      : {}),
    ...present({ sideHint: row.sideHint, notes: row.notes }),
  };
  switch (row.kind) {
    case 'amplifier':
      return {
        ...base,
        kind: 'amplifier',
        channels: [...channels].sort(bySeq).map(toChannel),
        ratedWatts8Ohm: row.ratedWatts8Ohm!,
        ...present({ ratedWatts4Ohm: row.ratedWatts4Ohm }),
        minimumImpedanceOhm: row.minimumImpedanceOhm!,
      };
    case 'speaker':
      return {
        ...base,
        kind: 'speaker',
        ...present({ nominalImpedanceOhm: row.nominalImpedanceOhm }),
        ...(row.cvLineVoltage !== null && row.cvTapWatts !== null
          ? { constantVoltage: { lineVoltage: row.cvLineVoltage, tapWatts: row.cvTapWatts } }
          : {}),
        ...present({ dcResistanceOhm: row.dcResistanceOhm, onwardWiring: row.onwardWiring }),
      };
    case 'subwoofer':
      return {
        ...base,
        kind: 'subwoofer',
        voiceCoils: row.voiceCoils!,
        coilImpedanceOhm: row.coilImpedanceOhm!,
        ...present({
          coilWiring: row.coilWiring,
          dcResistanceOhmPerCoil: row.dcResistanceOhmPerCoil,
          onwardWiring: row.onwardWiring,
        }),
      };
    case 'junction':
      return { ...base, kind: 'junction', ...present({ spliceType: row.spliceType, isAccessible: row.isAccessible }) };
    case 'spare_end':
      return { ...base, kind: 'spare_end', isCapped: row.isCapped ?? false, ...present({ marker: row.marker }) };
    case 'wall_entry':
      return {
        ...base,
        kind: 'wall_entry',
        ...present({
          wallMaterial: row.wallMaterial,
          holeDiameterM: row.holeDiameterM,
          sleeve: row.sleeve,
          sealant: row.sealant,
          insideLocation: row.insideLocation,
          outsideLocation: row.outsideLocation,
        }),
      };
  }
}

/** Depth readings of a run in as-built order: by station, then in the order they were taken. */
export function sortReadings<T extends { stationM: number; seq: number }>(readings: readonly T[]): T[] {
  return [...readings].sort((a, b) => a.stationM - b.stationM || a.seq - b.seq);
}

/** A stored bend; a NULL source (not stated: drawn, or stored before sources were kept) reads back without one. */
function toRoutePoint(row: RunRoutePointRow): RoutePoint {
  return {
    x: row.x,
    y: row.y,
    ...(row.source !== null ? { source: row.source } : {}),
    ...(row.accuracyM !== null ? { accuracyM: row.accuracyM } : {}),
  };
}

function toRun(row: RunRow, pairs: RunPairRow[], route: RunRoutePointRow[], readings: DepthReadingRow[]): Run {
  return {
    id: row.id,
    label: row.label,
    fromItemId: row.fromItemId,
    toItemId: row.toItemId,
    cableType: row.cableType,
    gauge: row.gaugeSystem === 'awg' ? { system: 'awg', awg: row.gaugeAwg! } : { system: 'mm2', mm2: row.gaugeMm2! },
    conductors: row.conductors,
    pairs: [...pairs]
      .sort((a, b) => a.pairIndex - b.pairIndex)
      .map((p) => ({
        pairIndex: p.pairIndex,
        channel:
          p.amplifierItemId !== null && p.channelId !== null ? { amplifierItemId: p.amplifierItemId, channelId: p.channelId } : null,
      })),
    measuredLengthM: row.measuredLengthM,
    method: row.method,
    ...present({ location: row.location }),
    ...(route.length > 0
      ? { route: [...route].sort((a, b) => a.ordinal - b.ordinal).map(toRoutePoint) }
      : {}),
    ...(readings.length > 0
      ? { depthReadings: sortReadings(readings).map((r) => ({ stationM: r.stationM, depthM: r.depthM })) }
      : {}),
    ...(row.isSpare ? { isSpare: true } : {}),
    ...(row.isAbandoned ? { isAbandoned: true } : {}),
    ...present({ notes: row.notes }),
  };
}

function toCheck(row: CommissioningCheckRow): CommissioningCheck {
  return {
    id: row.id,
    channel: { amplifierItemId: row.amplifierItemId, channelId: row.channelId },
    quantity: row.quantity,
    measuredOhm: row.measuredOhm,
    ...present({
      frequencyHz: row.frequencyHz,
      isPolarityOk: row.isPolarityOk,
      isInsulationOk: row.isInsulationOk,
      notes: row.notes,
    }),
  };
}

/** What an earlier record looked like before a job's first change to it (`site_record_changes.before`). */
export interface ChangeBefore {
  record: Item | Run;
  abandoned: { jobId: string; on: string } | null;
  /**
   * An amplifier's channel set-ups by channel id (they are not part of the as-built item). Absent in
   * changes recorded before set-ups were kept with them.
   */
  channelSetups?: Record<string, ChannelSetup>;
}

/**
 * Other jobs' changes to earlier records that are not issued yet, by record id. Such a change has not
 * happened for this job (issue 21): its view of the system, its analysis and its packet show the record
 * as it was before (another job's unissued change must not enter this job's packet as a change).
 */
function openChangesOfOtherJobs(rows: Pick<JobRecordRows, 'system'>): Map<string, { jobId: string; before: ChangeBefore }> {
  const system = rows.system;
  const out = new Map<string, { jobId: string; before: ChangeBefore }>();
  if (!system) return out;
  for (const c of system.changes) {
    if (c.jobId !== system.jobId && c.issuedAt === null) out.set(c.recordId, { jobId: c.jobId, before: c.before as unknown as ChangeBefore });
  }
  return out;
}

/** Assembles the as-built of one job from its rows; every id is the row's uuid. */
export function toAsBuilt(rows: JobRecordRows): AsBuilt {
  const held = openChangesOfOtherJobs(rows);
  const channelsByItem = groupBy(rows.channels, (c) => c.itemId);
  const tiesByItem = groupBy(rows.ties, (t) => t.itemId);
  const pairsByRun = groupBy(rows.pairs, (p) => p.runId);
  const routeByRun = groupBy(rows.routePoints, (p) => p.runId);
  const readingsByRun = groupBy(rows.depthReadings, (r) => r.runId);
  const { northAzimuthDeg, originLat, originLon } = rows.site;
  return {
    site: {
      northAzimuthDeg,
      ...(originLat !== null && originLon !== null ? { origin: { lat: originLat, lon: originLon } } : {}),
      ...(rows.features !== undefined && rows.features.length > 0
        ? {
            features: [...rows.features]
              .sort(bySeq)
              .map((f) => ({ id: f.id, kind: f.kind as SiteFeatureKind, name: f.name, shape: f.shape as SiteFeatureShape, points: f.points.map((p) => ({ x: p.x, y: p.y })) })),
          }
        : {}),
    },
    zones: [...rows.zones].sort(bySeq).map((z) => ({ id: z.id, name: z.name })),
    referencePoints: [...rows.referencePoints].sort(bySeq).map((p) => ({ id: p.id, label: p.label, x: p.x, y: p.y })),
    items: [...rows.items]
      .sort(bySeq)
      .map((row) => (held.get(row.id)?.before.record as Item | undefined) ?? toItem(row, channelsByItem.get(row.id) ?? [], tiesByItem.get(row.id) ?? [])),
    runs: [...rows.runs]
      .sort(bySeq)
      .map(
        (row) =>
          (held.get(row.id)?.before.record as Run | undefined) ??
          toRun(row, pairsByRun.get(row.id) ?? [], routeByRun.get(row.id) ?? [], readingsByRun.get(row.id) ?? []),
      ),
    checks: [...rows.checks].sort(bySeq).map(toCheck),
  };
}

/** The ids of each run's depth readings, in the order of the as-built's `depthReadings`. */
export function depthReadingIdsByRun(rows: Pick<JobRecordRows, 'depthReadings'>): Record<string, string[]> {
  const out: Record<string, string[]> = {};
  for (const [runId, readings] of groupBy(rows.depthReadings, (r) => r.runId)) {
    out[runId] = sortReadings(readings).map((r) => r.id);
  }
  return out;
}

/**
 * Provenance of every record in the job's view of the site's system, by record id: installed by which
 * job and when (this job or an existing one), changed by which jobs, abandoned by which job since when.
 */
export function toSiteRecords(rows: JobRecordRows): Record<string, SiteRecordInfo> {
  const system = rows.system;
  if (!system) return {};
  const title = (jobId: string) => system.jobTitles[jobId] ?? '';
  const held = openChangesOfOtherJobs(rows);
  // Another job's unissued change has not happened for this job (see openChangesOfOtherJobs).
  const changesByRecord = groupBy(
    system.changes.filter((c) => held.get(c.recordId)?.jobId !== c.jobId),
    (c) => c.recordId,
  );
  const out: Record<string, SiteRecordInfo> = {};
  const abandonedOf = (row: ItemRow | RunRow): SiteRecordInfo['abandoned'] => {
    const before = held.get(row.id)?.before;
    const by = before ? before.abandoned : row.abandonedByJobId !== null && row.abandonedOn !== null ? { jobId: row.abandonedByJobId, on: row.abandonedOn } : null;
    return by ? { jobId: by.jobId, jobTitle: title(by.jobId), on: by.on } : null;
  };
  const lastIssuedAt = system.lastIssuedAt ?? null;
  const add = (kind: 'item' | 'run', row: ItemRow | RunRow) => {
    out[row.id] = {
      kind,
      isThisJob: row.jobId === system.jobId,
      // Another job's record is in this job's view only once issued (JobsRepository.loadRecord).
      isIssued: row.jobId !== system.jobId || (lastIssuedAt !== null && row.createdAt.getTime() <= lastIssuedAt.getTime()),
      installedBy: { jobId: row.jobId, jobTitle: title(row.jobId) },
      installedOn: row.installedOn,
      changedBy: (changesByRecord.get(row.id) ?? []).map((c) => ({
        jobId: c.jobId,
        jobTitle: title(c.jobId),
        change: c.change,
        on: c.changedOn,
        isIssued: c.issuedAt !== null,
      })),
      abandoned: abandonedOf(row),
    };
  };
  for (const row of [...rows.items].sort(bySeq)) add('item', row);
  for (const row of [...rows.runs].sort(bySeq)) add('run', row);
  return out;
}

/**
 * The set-up of every amplifier channel in the job's view of the system, by channel id. An amplifier
 * another open job has changed without issuing shows the set-ups it had before that change, as
 * toAsBuilt shows its fields (issue 21: a gain turned down by another open job is not in this job's
 * packet). A change recorded before set-ups were kept with it falls back to the channel's row.
 */
export function toChannelSetups(rows: Pick<JobRecordRows, 'channels' | 'system'>): Record<string, ChannelSetup> {
  const held = openChangesOfOtherJobs(rows);
  /** The channels of an amplifier as it was before another open job's change, with their set-ups then. */
  const heldChannels = (itemId: string): Map<string, ChannelSetup | undefined> | undefined => {
    const before = held.get(itemId)?.before;
    if (!before) return undefined;
    const record = before.record as Item;
    return new Map((record.kind === 'amplifier' ? record.channels : []).map((c) => [c.id, before.channelSetups?.[c.id]]));
  };
  const out: Record<string, ChannelSetup> = {};
  for (const row of [...rows.channels].sort(bySeq)) {
    const before = heldChannels(row.itemId);
    // A channel the other job added is not on the amplifier as this job sees it.
    if (before && !before.has(row.id)) continue;
    out[row.id] = before?.get(row.id) ?? toChannelSetup(row);
  }
  // A channel the other job deleted is still on the amplifier as this job sees it, set up as it was.
  for (const itemId of held.keys()) {
    for (const [channelId, setup] of heldChannels(itemId) ?? []) if (setup && !(channelId in out)) out[channelId] = setup;
  }
  return out;
}

export function toChannelSetup(row: AmplifierChannelRow): ChannelSetup {
  return {
    source: row.source,
    gain: row.gain,
    volumeLimit: row.volumeLimit,
    eq: row.eq,
    crossover: row.crossover,
    polarity: row.polarity,
    firmware: row.firmware,
    networkName: row.networkName,
    notes: row.setupNotes,
  };
}

// ---- as-built → rows -------------------------------------------------------------------------------

/**
 * The `items` row of an item. Every kind-specific column is written (null when it does not apply), so
 * replacing an item clears what its previous version had.
 */
/** Where a new record of the site's system goes: the site, and its installing job's work date. */
export interface RecordPlace {
  siteId: string;
  installedOn: string;
}

/** A job's work date: its end date, else its start date, else the day it was created (ISO date). */
export function jobWorkDate(job: { startDate: string | null; endDate: string | null; createdAt: Date }): string {
  return job.endDate ?? job.startDate ?? job.createdAt.toISOString().slice(0, 10);
}

export function toItemRow(item: Item, jobId: string, id: string, place: RecordPlace): Omit<NewItemRow, 'seq'> {
  const amp = item.kind === 'amplifier' ? item : undefined;
  const speaker = item.kind === 'speaker' ? item : undefined;
  const sub = item.kind === 'subwoofer' ? item : undefined;
  const junction = item.kind === 'junction' ? item : undefined;
  const spare = item.kind === 'spare_end' ? item : undefined;
  const wall = item.kind === 'wall_entry' ? item : undefined;
  return {
    id,
    jobId,
    siteId: place.siteId,
    installedOn: place.installedOn,
    kind: item.kind,
    label: item.label,
    model: item.model ?? null,
    serial: item.serial ?? null,
    zoneId: item.zoneId ?? null,
    installDate: item.installDate ?? null,
    warrantyEnd: item.warrantyEnd ?? null,
    positionX: item.position?.x ?? null,
    positionY: item.position?.y ?? null,
    positionSource: item.position?.source ?? null,
    positionAccuracyM: item.position?.accuracyM ?? null,
    sideHint: item.sideHint ?? null,
    notes: item.notes ?? null,
    ratedWatts8Ohm: amp?.ratedWatts8Ohm ?? null,
    ratedWatts4Ohm: amp?.ratedWatts4Ohm ?? null,
    minimumImpedanceOhm: amp?.minimumImpedanceOhm ?? null,
    nominalImpedanceOhm: speaker?.nominalImpedanceOhm ?? null,
    cvLineVoltage: speaker?.constantVoltage?.lineVoltage ?? null,
    cvTapWatts: speaker?.constantVoltage?.tapWatts ?? null,
    dcResistanceOhm: speaker?.dcResistanceOhm ?? null,
    onwardWiring: speaker?.onwardWiring ?? sub?.onwardWiring ?? null,
    voiceCoils: sub?.voiceCoils ?? null,
    coilImpedanceOhm: sub?.coilImpedanceOhm ?? null,
    coilWiring: sub?.coilWiring ?? null,
    dcResistanceOhmPerCoil: sub?.dcResistanceOhmPerCoil ?? null,
    spliceType: junction?.spliceType ?? null,
    isAccessible: junction?.isAccessible ?? null,
    isCapped: spare?.isCapped ?? null,
    marker: spare?.marker ?? null,
    wallMaterial: wall?.wallMaterial ?? null,
    holeDiameterM: wall?.holeDiameterM ?? null,
    sleeve: wall?.sleeve ?? null,
    sealant: wall?.sealant ?? null,
    insideLocation: wall?.insideLocation ?? null,
    outsideLocation: wall?.outsideLocation ?? null,
  };
}

/** The electrical columns of a channel row (its setup is written separately). */
export function toChannelRow(channel: AmplifierChannel, itemId: string, id: string): Omit<NewAmplifierChannelRow, 'seq'> {
  return {
    id,
    itemId,
    name: channel.name,
    cvLineVoltage: channel.constantVoltage?.lineVoltage ?? null,
    cvRatedWatts: channel.constantVoltage?.ratedWatts ?? null,
  };
}

export function toTieRows(item: Item, itemId: string): NewItemTieRow[] {
  return (item.ties ?? []).map((tie, ordinal) => ({
    itemId,
    referencePointId: tie.referencePointId,
    ordinal,
    distanceM: tie.distanceM,
  }));
}

export function toRunRow(run: Run, jobId: string, id: string, place: RecordPlace): Omit<NewRunRow, 'seq'> {
  return {
    id,
    jobId,
    siteId: place.siteId,
    installedOn: place.installedOn,
    label: run.label,
    fromItemId: run.fromItemId,
    toItemId: run.toItemId,
    cableType: run.cableType,
    gaugeSystem: run.gauge.system,
    gaugeAwg: run.gauge.system === 'awg' ? run.gauge.awg : null,
    gaugeMm2: run.gauge.system === 'mm2' ? run.gauge.mm2 : null,
    conductors: run.conductors,
    measuredLengthM: run.measuredLengthM,
    method: run.method,
    location: run.location ?? null,
    isSpare: run.isSpare ?? false,
    isAbandoned: run.isAbandoned ?? false,
    notes: run.notes ?? null,
  };
}

export function toPairRows(run: Run, runId: string): NewRunPairRow[] {
  return run.pairs.map((pair) => ({
    runId,
    pairIndex: pair.pairIndex,
    amplifierItemId: pair.channel?.amplifierItemId ?? null,
    channelId: pair.channel?.channelId ?? null,
  }));
}

export function toRoutePointRows(run: Run, runId: string): NewRunRoutePointRow[] {
  return (run.route ?? []).map((point, ordinal) => ({
    runId,
    ordinal,
    x: point.x,
    y: point.y,
    source: point.source ?? null,
    accuracyM: point.accuracyM ?? null,
  }));
}

export function toCheckRow(check: CommissioningCheck, jobId: string, id: string, recordedByUserId: string | null): Omit<NewCommissioningCheckRow, 'seq'> {
  return {
    id,
    jobId,
    amplifierItemId: check.channel.amplifierItemId,
    channelId: check.channel.channelId,
    quantity: check.quantity,
    measuredOhm: check.measuredOhm,
    frequencyHz: check.frequencyHz ?? null,
    isPolarityOk: check.isPolarityOk ?? null,
    isInsulationOk: check.isInsulationOk ?? null,
    notes: check.notes ?? null,
    recordedByUserId,
  };
}

/** Insertable rows of a whole as-built (for seeding a recorded job), without the sequence columns. */
export interface NewJobRecordRows {
  referencePoints: { id: string; siteId: string; label: string; x: number; y: number }[];
  zones: { id: string; jobId: string; name: string }[];
  items: Omit<NewItemRow, 'seq'>[];
  channels: Omit<NewAmplifierChannelRow, 'seq'>[];
  ties: NewItemTieRow[];
  runs: Omit<NewRunRow, 'seq'>[];
  pairs: NewRunPairRow[];
  routePoints: NewRunRoutePointRow[];
  depthReadings: { id: string; runId: string; stationM: number; depthM: number }[];
  checks: Omit<NewCommissioningCheckRow, 'seq'>[];
}

/**
 * Rows for a whole as-built on `jobId` at `siteId`. `idFor` maps each as-built id to the row's uuid
 * (and must return the same uuid for the same id); `newId` makes ids for depth readings, which have
 * none in the as-built. Insert in the order of the fields so that the sequences keep the as-built order.
 */
export function toRecordRows(
  asBuilt: AsBuilt,
  ids: { jobId: string; siteId: string; installedOn: string; idFor: (asBuiltId: string) => string; newId: () => string },
): NewJobRecordRows {
  const { jobId, siteId, idFor, newId } = ids;
  const place: RecordPlace = { siteId, installedOn: ids.installedOn };
  const mapChannel = (c: { amplifierItemId: string; channelId: string }) => ({
    amplifierItemId: idFor(c.amplifierItemId),
    channelId: idFor(c.channelId),
  });
  const items = asBuilt.items.map((item): Item => ({
    ...item,
    id: idFor(item.id),
    ...(item.zoneId ? { zoneId: idFor(item.zoneId) } : {}),
    ...(item.ties ? { ties: item.ties.map((t) => ({ ...t, referencePointId: idFor(t.referencePointId) })) } : {}),
    ...(item.kind === 'amplifier' ? { channels: item.channels.map((c) => ({ ...c, id: idFor(c.id) })) } : {}),
  }) as Item);
  const runs = asBuilt.runs.map((run): Run => ({
    ...run,
    id: idFor(run.id),
    fromItemId: idFor(run.fromItemId),
    toItemId: idFor(run.toItemId),
    pairs: run.pairs.map((p) => ({ ...p, channel: p.channel ? mapChannel(p.channel) : null })),
  }));
  return {
    referencePoints: asBuilt.referencePoints.map((p) => ({ id: idFor(p.id), siteId, label: p.label, x: p.x, y: p.y })),
    zones: asBuilt.zones.map((z) => ({ id: idFor(z.id), jobId, name: z.name })),
    items: items.map((item) => toItemRow(item, jobId, item.id, place)),
    channels: items.flatMap((item) => (item.kind === 'amplifier' ? item.channels.map((c) => toChannelRow(c, item.id, c.id)) : [])),
    ties: items.flatMap((item) => toTieRows(item, item.id)),
    runs: runs.map((run) => toRunRow(run, jobId, run.id, place)),
    pairs: runs.flatMap((run) => toPairRows(run, run.id)),
    routePoints: runs.flatMap((run) => toRoutePointRows(run, run.id)),
    depthReadings: runs.flatMap((run) => (run.depthReadings ?? []).map((r) => ({ id: newId(), runId: run.id, ...r }))),
    checks: asBuilt.checks.map((check) =>
      toCheckRow({ ...check, channel: mapChannel(check.channel) }, jobId, idFor(check.id), null),
    ),
  };
}
