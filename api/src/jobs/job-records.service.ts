import { randomUUID } from 'node:crypto';

import { Injectable } from '@nestjs/common';

import type { AuthUser } from '../common/decorators/current-user.decorator.js';
import { NotFoundError } from '../domain/errors.js';
import type { AsBuilt, Zone } from '../domain/as-built/as-built.schema.js';
import type { Item } from '../domain/as-built/item.schema.js';
import type { Job } from '../db/schema/index.js';
import type { DepthReading, Run } from '../domain/as-built/run.schema.js';
import type { CommissioningCheck } from '../domain/checks/commissioning-check.schema.js';
import {
  type ChannelSetup,
  type CheckInput,
  type DepthReadingInput,
  type ItemInput,
  NEW_RECORD_ID,
  type RunInput,
  type UpdateDepthReadingInput,
  type ZoneInput,
} from '../domain/jobs/job-record.schema.js';
import type { JobVersionResponse } from '../domain/jobs/job.schema.js';
import { type FieldIssue, validateRecord } from '../domain/jobs/record-validation.js';
import {
  type ChangeBefore,
  depthReadingIdsByRun,
  jobWorkDate,
  type RecordPlace,
  toChannelRow,
  toChannelSetup,
  toCheckRow,
  toItemRow,
  toPairRows,
  toRoutePointRows,
  toRunRow,
  toTieRows,
} from './as-built-rows.js';
import { inUse, invalid, recordHeldByOtherJob, recordNotFound } from './job-errors.js';
import { JobWriter, type WriteContext } from './job-writer.js';
import { JobsRepository } from './jobs.repository.js';

type WithVersion<T> = T & JobVersionResponse;

function assertValid(asBuilt: AsBuilt, focus: (string | number)[]): void {
  const issues = validateRecord(asBuilt, focus);
  if (issues.length > 0) throw invalid(issues);
}

function replaceAt<T>(list: readonly T[], index: number, value: T): T[] {
  return list.map((entry, i) => (i === index ? value : entry));
}

/** Where this job's new records go: its site, on its work date. */
function placeOf(job: Job): RecordPlace {
  return { siteId: job.siteId, installedOn: jobWorkDate(job) };
}

/** What a record looked like before this job's first change to it (kept to show and undo the change). */
export type RecordBefore = ChangeBefore;

/** The columns of a channel's set-up. */
function channelSetupRow(setup: ChannelSetup) {
  return {
    source: setup.source ?? null,
    gain: setup.gain ?? null,
    volumeLimit: setup.volumeLimit ?? null,
    eq: setup.eq ?? null,
    crossover: setup.crossover ?? null,
    polarity: setup.polarity ?? null,
    firmware: setup.firmware ?? null,
    networkName: setup.networkName ?? null,
    setupNotes: setup.notes ?? null,
  };
}

/**
 * Gives an amplifier's channels their ids: a new channel (placeholder `new:<i>`) gets a fresh uuid, a
 * channel sent with an id must be one of this item's existing channels.
 */
function assignChannelIds(
  item: Item,
  existing: ReadonlySet<string>,
): { item: Item; channels: { id: string; isNew: boolean }[] } {
  if (item.kind !== 'amplifier') return { item, channels: [] };
  const issues: FieldIssue[] = [];
  const channels = item.channels.map((channel, i) => {
    if (channel.id.startsWith(`${NEW_RECORD_ID}:`)) return { ...channel, id: randomUUID(), isNew: true };
    if (!existing.has(channel.id)) issues.push({ path: `channels.${i}.id`, message: 'no such channel on this amplifier; leave the id out for a new channel' });
    return { ...channel, isNew: false };
  });
  if (issues.length > 0) throw invalid(issues);
  return {
    item: { ...item, channels: channels.map(({ isNew: _isNew, ...channel }) => channel) },
    channels: channels.map((c) => ({ id: c.id, isNew: c.isNew })),
  };
}

/**
 * Writes to the parts of a job's as-built: zones, items (with ties and amplifier channels), channel
 * setup, runs (with pairs, route and depth readings) and commissioning checks. Every write goes through
 * JobWriter (company, rights, version, audit) and is validated against the whole as-built as it would
 * be afterwards, so a stored record always passes AsBuiltSchema.
 */
@Injectable()
export class JobRecordsService {
  constructor(
    private readonly repository: JobsRepository,
    private readonly writer: JobWriter,
  ) {}

  // ---- zones ------------------------------------------------------------------------------------

  createZone(actor: AuthUser, jobId: string, expectedVersion: number, input: ZoneInput): Promise<WithVersion<{ zone: Zone }>> {
    return this.writer.write(actor, jobId, expectedVersion, 'record', async ({ tx }) => {
      const row = await this.repository.insertZone(jobId, randomUUID(), input.name, tx);
      return {
        result: { zone: { id: row.id, name: row.name } },
        audit: { action: 'job.zone.create', targetType: 'zone', targetId: row.id },
      };
    });
  }

  updateZone(actor: AuthUser, jobId: string, zoneId: string, expectedVersion: number, input: ZoneInput): Promise<WithVersion<{ zone: Zone }>> {
    return this.writer.write(actor, jobId, expectedVersion, 'record', async ({ tx }) => {
      const row = await this.repository.updateZone(jobId, zoneId, input.name, tx);
      if (!row) throw recordNotFound('zone');
      return { result: { zone: { id: row.id, name: row.name } }, audit: { action: 'job.zone.update', targetType: 'zone', targetId: zoneId } };
    });
  }

  /** Deletes a zone; its items stay, without a zone. */
  deleteZone(actor: AuthUser, jobId: string, zoneId: string, expectedVersion: number): Promise<JobVersionResponse> {
    return this.writer.write(actor, jobId, expectedVersion, 'record', async ({ tx }) => {
      if (!(await this.repository.deleteZone(jobId, zoneId, tx))) throw recordNotFound('zone');
      return { result: {}, audit: { action: 'job.zone.delete', targetType: 'zone', targetId: zoneId } };
    });
  }

  // ---- items ------------------------------------------------------------------------------------

  createItem(actor: AuthUser, jobId: string, expectedVersion: number, input: ItemInput): Promise<WithVersion<{ item: Item }>> {
    return this.writer.write(actor, jobId, expectedVersion, 'record', async ({ tx, job, record }) => {
      const { asBuilt } = await record();
      const id = randomUUID();
      const { item, channels } = assignChannelIds({ ...input, id }, new Set());
      assertValid({ ...asBuilt, items: [...asBuilt.items, item] }, ['items', asBuilt.items.length]);
      await this.repository.insertItem(
        toItemRow(item, job.id, id, placeOf(job)),
        item.kind === 'amplifier' ? item.channels.map((c, i) => toChannelRow(c, id, channels[i]!.id)) : [],
        toTieRows(item, id),
        tx,
      );
      return { result: { item }, audit: { action: 'job.item.create', targetType: 'item', targetId: id, details: { kind: item.kind } } };
    });
  }

  /**
   * Replaces an item with the body (any kind). Amplifier channels sent with their id are kept (runs and
   * checks point at them); channels left out are deleted, which is refused while something uses them.
   */
  replaceItem(
    actor: AuthUser,
    jobId: string,
    itemId: string,
    expectedVersion: number,
    input: ItemInput,
  ): Promise<WithVersion<{ item: Item }>> {
    return this.writer.write(actor, jobId, expectedVersion, 'record', async (ctx) => {
      const { tx, job, record } = ctx;
      const { rows, asBuilt } = await record();
      const index = asBuilt.items.findIndex((i) => i.id === itemId);
      if (index < 0) throw recordNotFound('item');
      const existing = new Set(rows.channels.filter((c) => c.itemId === itemId).map((c) => c.id));
      const { item, channels } = assignChannelIds({ ...input, id: itemId }, existing);
      assertValid({ ...asBuilt, items: replaceAt(asBuilt.items, index, item) }, ['items', index]);
      await this.hold(ctx, 'item', itemId, 'changed');
      await this.repository.replaceItem(
        job.id,
        { ...toItemRow(item, job.id, itemId, placeOf(job)), id: itemId },
        item.kind === 'amplifier'
          ? item.channels.map((c, i) => ({ row: { ...toChannelRow(c, itemId, channels[i]!.id), id: channels[i]!.id }, isNew: channels[i]!.isNew }))
          : [],
        toTieRows(item, itemId),
        tx,
      );
      return { result: { item }, audit: { action: 'job.item.update', targetType: 'item', targetId: itemId, details: { kind: item.kind } } };
    });
  }

  /**
   * Deletes one of this job's items not yet issued. An item of the site's record (an earlier job
   * installed it, or this job did and issued it before being reopened) is not deleted: it is recorded
   * as removed by this job (taken out of the ground) on the job's work date, and leaves the system.
   */
  deleteItem(actor: AuthUser, jobId: string, itemId: string, expectedVersion: number): Promise<JobVersionResponse> {
    return this.writer.write(actor, jobId, expectedVersion, 'record', async (ctx) => {
      const { tx, job, record } = ctx;
      const { asBuilt } = await record();
      if (!asBuilt.items.some((i) => i.id === itemId)) throw recordNotFound('item');
      const issues = validateRecord({ ...asBuilt, items: asBuilt.items.filter((i) => i.id !== itemId) });
      if (issues.length > 0) throw inUse('item', issues);
      const isSiteRecord = await this.hold(ctx, 'item', itemId, 'removed');
      const otherRuns = await this.repository.runsOfOtherJobsAt(itemId, job.id, tx);
      if (!isSiteRecord && otherRuns.length > 0) {
        throw inUse('item', [{ path: 'runs', message: `run "${otherRuns[0]!.label}" of another job starts or ends here` }]);
      }
      if (isSiteRecord) {
        await this.repository.setRemoved('item', itemId, { jobId: job.id, on: jobWorkDate(job) }, tx);
        return { result: {}, audit: { action: 'job.item.remove', targetType: 'item', targetId: itemId } };
      }
      await this.repository.deleteItem(job.id, itemId, tx);
      return { result: {}, audit: { action: 'job.item.delete', targetType: 'item', targetId: itemId } };
    });
  }

  /** Records how one amplifier channel was set up (never a password: only the network name). */
  updateChannelSetup(
    actor: AuthUser,
    jobId: string,
    itemId: string,
    channelId: string,
    expectedVersion: number,
    input: ChannelSetup,
  ): Promise<WithVersion<{ channelSetup: ChannelSetup }>> {
    return this.writer.write(actor, jobId, expectedVersion, 'record', async (ctx) => {
      const { tx, record } = ctx;
      const { rows } = await record();
      if (!rows.channels.some((c) => c.id === channelId && c.itemId === itemId)) throw recordNotFound('channel');
      await this.hold(ctx, 'item', itemId, 'changed');
      const row = await this.repository.updateChannelSetup(itemId, channelId, channelSetupRow(input), tx);
      return {
        result: { channelSetup: toChannelSetup(row!) },
        audit: { action: 'job.channel_setup.update', targetType: 'amplifier_channel', targetId: channelId },
      };
    });
  }

  // ---- runs -------------------------------------------------------------------------------------

  createRun(actor: AuthUser, jobId: string, expectedVersion: number, input: RunInput): Promise<WithVersion<{ run: Run }>> {
    return this.writer.write(actor, jobId, expectedVersion, 'record', async ({ tx, job, record }) => {
      const { asBuilt } = await record();
      const id = randomUUID();
      const run: Run = { ...input, id };
      assertValid({ ...asBuilt, runs: [...asBuilt.runs, run] }, ['runs', asBuilt.runs.length]);
      await this.repository.insertRun(
        toRunRow(run, job.id, id, placeOf(job)),
        toPairRows(run, id),
        toRoutePointRows(run, id),
        (run.depthReadings ?? []).map((r) => ({ id: randomUUID(), runId: id, ...r, recordedByUserId: actor.id })),
        tx,
      );
      return { result: { run }, audit: { action: 'job.run.create', targetType: 'run', targetId: id } };
    });
  }

  /** Replaces a run with the body; its depth readings are replaced only when the body lists them. */
  replaceRun(actor: AuthUser, jobId: string, runId: string, expectedVersion: number, input: RunInput): Promise<WithVersion<{ run: Run }>> {
    return this.writer.write(actor, jobId, expectedVersion, 'record', async (ctx) => {
      const { tx, job, record } = ctx;
      const { rows, asBuilt } = await record();
      const index = asBuilt.runs.findIndex((r) => r.id === runId);
      if (index < 0) throw recordNotFound('run');
      const current = asBuilt.runs[index]!;
      const keptReadings = input.depthReadings === undefined && current.depthReadings ? { depthReadings: current.depthReadings } : {};
      const run: Run = { ...input, id: runId, ...keptReadings };
      assertValid({ ...asBuilt, runs: replaceAt(asBuilt.runs, index, run) }, ['runs', index]);
      const wasAbandoned = current.isAbandoned === true;
      const isAbandoned = run.isAbandoned === true;
      const abandonedBy = rows.runs.find((r) => r.id === runId)?.abandonedByJobId ?? null;
      await this.hold(ctx, 'run', runId, isAbandoned && (!wasAbandoned || abandonedBy === job.id) ? 'abandoned' : 'changed', { isExact: true });
      // Abandoning in place is dated: by this job, on its work date (cleared when the run is put back in service).
      if (isAbandoned !== wasAbandoned) {
        await this.repository.setAbandoned('run', runId, isAbandoned ? { jobId: job.id, on: jobWorkDate(job) } : null, tx);
      }
      await this.repository.replaceRun(
        job.id,
        { ...toRunRow(run, job.id, runId, placeOf(job)), id: runId },
        toPairRows(run, runId),
        toRoutePointRows(run, runId),
        input.depthReadings?.map((r) => ({ id: randomUUID(), runId, ...r, recordedByUserId: actor.id })),
        tx,
      );
      return { result: { run }, audit: { action: 'job.run.update', targetType: 'run', targetId: runId } };
    });
  }

  /**
   * Deletes one of this job's runs not yet issued; a run of the site's record (an earlier job's, or this
   * job's own already issued) is recorded as removed by this job instead.
   */
  deleteRun(actor: AuthUser, jobId: string, runId: string, expectedVersion: number): Promise<JobVersionResponse> {
    return this.writer.write(actor, jobId, expectedVersion, 'record', async (ctx) => {
      const { tx, job, record } = ctx;
      const { asBuilt } = await record();
      if (!asBuilt.runs.some((r) => r.id === runId)) throw recordNotFound('run');
      if (await this.hold(ctx, 'run', runId, 'removed')) {
        await this.repository.setRemoved('run', runId, { jobId: job.id, on: jobWorkDate(job) }, tx);
        return { result: {}, audit: { action: 'job.run.remove', targetType: 'run', targetId: runId } };
      }
      await this.repository.deleteRun(job.id, runId, tx);
      return { result: {}, audit: { action: 'job.run.delete', targetType: 'run', targetId: runId } };
    });
  }

  /**
   * Undoes this job's change to a record of the site's system since its last issue: the record gets
   * back its fields (and channel set-up, readings …) as they were before that change — as an earlier
   * job left it, or as this job's last issue left it — and is abandoned or not as it was then. A change
   * already issued is part of a revision and stays (404: nothing to undo).
   */
  undoChange(actor: AuthUser, jobId: string, recordId: string, expectedVersion: number): Promise<JobVersionResponse> {
    return this.writer.write(actor, jobId, expectedVersion, 'record', async ({ tx, job, record }) => {
      const change = await this.repository.findOpenChange(job.id, recordId, tx);
      if (!change) throw new NotFoundError('CHANGE_NOT_FOUND', 'This job has no change to that record since its last issue.');
      const before = change.before as unknown as RecordBefore;
      const { rows, asBuilt } = await record();
      if (change.recordKind === 'item') {
        const item = before.record as Item;
        const index = asBuilt.items.findIndex((i) => i.id === recordId);
        const items = index < 0 ? [...asBuilt.items, item] : replaceAt(asBuilt.items, index, item);
        assertValid({ ...asBuilt, items }, ['asBuiltAfterUndo', 'items']);
        if (index >= 0) {
          const existing = new Set(rows.channels.filter((c) => c.itemId === recordId).map((c) => c.id));
          await this.repository.replaceItem(
            job.id,
            { ...toItemRow(item, job.id, recordId, placeOf(job)), id: recordId },
            item.kind === 'amplifier' ? item.channels.map((c) => ({ row: { ...toChannelRow(c, recordId, c.id), id: c.id }, isNew: !existing.has(c.id) })) : [],
            toTieRows(item, recordId),
            tx,
          );
        }
        // The channels' set-ups as they were (an amplifier setting is a change too).
        for (const [channelId, setup] of Object.entries(before.channelSetups ?? {})) {
          await this.repository.updateChannelSetup(recordId, channelId, channelSetupRow(setup), tx);
        }
        await this.repository.setRemoved('item', recordId, null, tx);
        await this.repository.setAbandoned('item', recordId, before.abandoned, tx);
      } else {
        const run = before.record as Run;
        const index = asBuilt.runs.findIndex((r) => r.id === recordId);
        const runs = index < 0 ? [...asBuilt.runs, run] : replaceAt(asBuilt.runs, index, run);
        assertValid({ ...asBuilt, runs }, ['asBuiltAfterUndo', 'runs']);
        await this.repository.replaceRun(
          job.id,
          { ...toRunRow(run, job.id, recordId, placeOf(job)), id: recordId },
          toPairRows(run, recordId),
          toRoutePointRows(run, recordId),
          (run.depthReadings ?? []).map((r) => ({ id: randomUUID(), runId: recordId, ...r, recordedByUserId: null })),
          tx,
        );
        await this.repository.setRemoved('run', recordId, null, tx);
        await this.repository.setAbandoned('run', recordId, before.abandoned, tx);
      }
      await this.repository.deleteOpenChange(job.id, recordId, tx);
      return { result: {}, audit: { action: 'job.change.undo', targetType: change.recordKind, targetId: recordId } };
    });
  }

  /**
   * Before this job writes to a record of the site's system: locks the record's row, refuses (409) when
   * another open job of the site has an unissued change to it, and, when the record is part of the
   * site's record — an earlier job installed it, or this job did and has issued it (a reopened job) —
   * records this job's change (keeping the record as it was before the first change since this job's
   * last issue, amplifier channel set-ups included), so that other jobs go on seeing it as issued until
   * this job issues. A change this job already issued stays as issued; the new one is a row of its own.
   * Answers whether the record is such a site record (false: this job's own, never issued).
   */
  private async hold(
    ctx: WriteContext,
    kind: 'item' | 'run',
    id: string,
    change: 'changed' | 'abandoned' | 'removed',
    options: { isExact?: boolean } = {},
  ): Promise<boolean> {
    const { tx, job, record } = ctx;
    const row = await this.repository.lockSystemRecord(kind, id, job.siteId, tx);
    if (!row) throw recordNotFound(kind);
    const other = await this.repository.openChangeByOtherJob(id, job.id, tx);
    if (other) {
      // Named as this job sees it: the other job's unissued relabel has not happened here.
      const { asBuilt } = await record();
      const seen = kind === 'item' ? asBuilt.items.find((i) => i.id === id) : asBuilt.runs.find((r) => r.id === id);
      throw recordHeldByOtherJob(kind, seen?.label ?? row.label, other);
    }
    if (row.jobId === job.id && !row.isIssued) return false;
    const { rows, asBuilt } = await record();
    const source = kind === 'item' ? rows.items.find((i) => i.id === id) : rows.runs.find((r) => r.id === id);
    const channels = kind === 'item' ? rows.channels.filter((c) => c.itemId === id) : [];
    const before: RecordBefore = {
      record: (kind === 'item' ? asBuilt.items.find((i) => i.id === id) : asBuilt.runs.find((r) => r.id === id))!,
      abandoned: source?.abandonedByJobId && source.abandonedOn ? { jobId: source.abandonedByJobId, on: source.abandonedOn } : null,
      ...(channels.length > 0 ? { channelSetups: Object.fromEntries(channels.map((c) => [c.id, toChannelSetup(c)])) } : {}),
    };
    // Abandoned or not when this job's open cycle began: the open change's `before`, else as it stands.
    const open = await this.repository.findOpenChange(job.id, id, tx);
    const wasAbandonedByThisJob = (open ? (open.before as unknown as RecordBefore).abandoned : before.abandoned)?.jobId === job.id;
    const isAbandonedByThisJob = source?.abandonedByJobId === job.id;
    await this.repository.upsertChange(
      {
        siteId: job.siteId,
        jobId: job.id,
        recordKind: kind,
        recordId: id,
        change:
          // A further change (a depth reading) to a record this job abandoned since its last issue keeps
          // it listed as abandoned; a change to one an earlier revision of this job abandoned is a change.
          change === 'changed' && !options.isExact && isAbandonedByThisJob && !wasAbandonedByThisJob
            ? 'abandoned'
            : change === 'abandoned' && wasAbandonedByThisJob && isAbandonedByThisJob
              ? 'changed'
              : change,
        before: before as unknown as Record<string, unknown>,
        changedOn: jobWorkDate(job),
      },
      tx,
    );
    return true;
  }

  // ---- depth readings ---------------------------------------------------------------------------

  /** The quick "add depth reading" of the field flow: a station along the run and the cover there. */
  addDepthReading(
    actor: AuthUser,
    jobId: string,
    runId: string,
    expectedVersion: number,
    input: DepthReadingInput,
  ): Promise<WithVersion<{ depthReading: DepthReading & { id: string } }>> {
    return this.writer.write(actor, jobId, expectedVersion, 'field', async (ctx) => {
      const { tx, record } = ctx;
      const { asBuilt } = await record();
      const index = asBuilt.runs.findIndex((r) => r.id === runId);
      if (index < 0) throw recordNotFound('run');
      await this.hold(ctx, 'run', runId, 'changed');
      const run = asBuilt.runs[index]!;
      const readings = [...(run.depthReadings ?? []), input];
      assertValid(
        { ...asBuilt, runs: replaceAt(asBuilt.runs, index, { ...run, depthReadings: readings }) },
        ['runs', index, 'depthReadings', readings.length - 1],
      );
      const row = await this.repository.insertReading({ id: randomUUID(), runId, ...input, recordedByUserId: actor.id }, tx);
      return {
        result: { depthReading: { id: row.id, stationM: row.stationM, depthM: row.depthM } },
        audit: { action: 'job.depth_reading.create', targetType: 'depth_reading', targetId: row.id, details: { runId } },
      };
    });
  }

  updateDepthReading(
    actor: AuthUser,
    jobId: string,
    runId: string,
    readingId: string,
    expectedVersion: number,
    input: UpdateDepthReadingInput,
  ): Promise<WithVersion<{ depthReading: DepthReading & { id: string } }>> {
    return this.writer.write(actor, jobId, expectedVersion, 'field', async (ctx) => {
      const { tx, record } = ctx;
      const { rows, asBuilt } = await record();
      const index = asBuilt.runs.findIndex((r) => r.id === runId);
      if (index < 0) throw recordNotFound('run');
      await this.hold(ctx, 'run', runId, 'changed');
      const position = (depthReadingIdsByRun(rows)[runId] ?? []).indexOf(readingId);
      if (position < 0) throw recordNotFound('depth reading');
      const run = asBuilt.runs[index]!;
      const readings = replaceAt(run.depthReadings ?? [], position, { ...run.depthReadings![position]!, ...input });
      assertValid(
        { ...asBuilt, runs: replaceAt(asBuilt.runs, index, { ...run, depthReadings: readings }) },
        ['runs', index, 'depthReadings', position],
      );
      const row = await this.repository.updateReading(runId, readingId, input, tx);
      return {
        result: { depthReading: { id: readingId, stationM: row!.stationM, depthM: row!.depthM } },
        audit: { action: 'job.depth_reading.update', targetType: 'depth_reading', targetId: readingId, details: { runId } },
      };
    });
  }

  deleteDepthReading(actor: AuthUser, jobId: string, runId: string, readingId: string, expectedVersion: number): Promise<JobVersionResponse> {
    return this.writer.write(actor, jobId, expectedVersion, 'field', async (ctx) => {
      const { tx, record } = ctx;
      const { rows } = await record();
      if (!rows.runs.some((r) => r.id === runId)) throw recordNotFound('run');
      if (!rows.depthReadings.some((r) => r.id === readingId && r.runId === runId)) throw recordNotFound('depth reading');
      await this.hold(ctx, 'run', runId, 'changed');
      await this.repository.deleteReading(runId, readingId, tx);
      return { result: {}, audit: { action: 'job.depth_reading.delete', targetType: 'depth_reading', targetId: readingId, details: { runId } } };
    });
  }

  // ---- commissioning checks ---------------------------------------------------------------------

  createCheck(actor: AuthUser, jobId: string, expectedVersion: number, input: CheckInput): Promise<WithVersion<{ check: CommissioningCheck }>> {
    return this.writer.write(actor, jobId, expectedVersion, 'field', async ({ tx, job, record }) => {
      const { asBuilt } = await record();
      const id = randomUUID();
      const check: CommissioningCheck = { ...input, id };
      assertValid({ ...asBuilt, checks: [...asBuilt.checks, check] }, ['checks', asBuilt.checks.length]);
      await this.repository.insertCheck(toCheckRow(check, job.id, id, actor.id), tx);
      return { result: { check }, audit: { action: 'job.check.create', targetType: 'commissioning_check', targetId: id } };
    });
  }

  replaceCheck(
    actor: AuthUser,
    jobId: string,
    checkId: string,
    expectedVersion: number,
    input: CheckInput,
  ): Promise<WithVersion<{ check: CommissioningCheck }>> {
    return this.writer.write(actor, jobId, expectedVersion, 'field', async ({ tx, job, record }) => {
      const { asBuilt } = await record();
      const index = asBuilt.checks.findIndex((c) => c.id === checkId);
      if (index < 0) throw recordNotFound('check');
      const check: CommissioningCheck = { ...input, id: checkId };
      assertValid({ ...asBuilt, checks: replaceAt(asBuilt.checks, index, check) }, ['checks', index]);
      await this.repository.replaceCheck(job.id, { ...toCheckRow(check, job.id, checkId, actor.id), id: checkId }, tx);
      return { result: { check }, audit: { action: 'job.check.update', targetType: 'commissioning_check', targetId: checkId } };
    });
  }

  deleteCheck(actor: AuthUser, jobId: string, checkId: string, expectedVersion: number): Promise<JobVersionResponse> {
    return this.writer.write(actor, jobId, expectedVersion, 'field', async ({ tx, job, record }) => {
      const { asBuilt } = await record();
      if (!asBuilt.checks.some((c) => c.id === checkId)) throw recordNotFound('check');
      await this.repository.deleteCheck(job.id, checkId, tx);
      return { result: {}, audit: { action: 'job.check.delete', targetType: 'commissioning_check', targetId: checkId } };
    });
  }
}
