import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';

import { ApiError } from '../../../lib/api-client';
import { resetSession, setSession } from '../../../lib/session';
import { buildSessionResponse, buildSessionUser } from '../../../testing/data';
import { buildAsBuilt, buildJobAsBuilt } from '../../../testing/job-data';
import type { JobWrite } from '../api/send-job-write';

import { withLocalId, withOfflineRecord } from './offline-records';
import { enqueuePendingWrite, readAllPendingWrites, readPendingWrites, resetPendingWritesForTests } from './pending-writes';
import { handleConflictsOf, replayAllPendingWrites, replayPendingWrites, type ReplayDeps } from './replay-pending-writes';

const offline = () => new ApiError({ status: 0, message: 'Cannot reach the server.' });
const conflict = (currentVersion: number) => new ApiError({ status: 412, message: 'changed', code: 'VERSION_CONFLICT', currentVersion });

const moveItem: JobWrite = { endpoint: 'replaceItem', params: { itemId: 'i1' }, body: { label: 'P1' }, label: 'Position of P1' };
const reading: JobWrite = { endpoint: 'addDepthReading', params: { runId: 'r1' }, body: { stationM: 1, depthM: 0.45 }, label: 'Reading' };
const notes: JobWrite = { endpoint: 'updateJob', params: {}, body: { notes: 'Gate code 4411' }, label: 'Job notes' };

/** What the API answers a create with: the record under the id it gave it (amplifier channels too). */
function created(write: JobWrite): Record<string, unknown> {
  if (write.endpoint === 'createItem') {
    const body = write.body as { channels?: { name: string }[] };
    return { item: { ...body, id: 'server-item', ...(body.channels ? { channels: body.channels.map((c, i) => ({ ...c, id: `server-ch${i}` })) } : {}) } };
  }
  if (write.endpoint === 'createRun') return { run: { ...(write.body as object), id: 'server-run' } };
  return {};
}

/** A server that answers each write with the next version, and remembers what it was sent. */
function fakeServer(version: number, answer?: (write: JobWrite, sentOn: number) => Error | undefined) {
  const sent: { jobId: string; endpoint: string; version: number; key: string | undefined }[] = [];
  const bodies: JobWrite[] = [];
  const send = vi.fn<ReplayDeps['send']>(async (jobId, sentOn, write) => {
    const failure = answer?.(write, sentOn);
    if (failure) throw failure;
    sent.push({ jobId, endpoint: write.endpoint, version: sentOn, key: write.idempotencyKey });
    bodies.push(write);
    version += 1;
    return { jobVersion: version, ...created(write) };
  });
  return { sent, bodies, deps: { send, knownVersion: () => version, onRefused: vi.fn() } satisfies ReplayDeps };
}

describe('replaying the offline write queue (issue 17)', () => {
  beforeEach(() => {
    resetPendingWritesForTests();
    setSession(buildSessionResponse(buildSessionUser('lead')));
  });
  afterEach(() => resetSession());

  it('should send in order, each replacing write on the version the one before produced, with its kept key', async () => {
    await enqueuePendingWrite('job-1', { ...moveItem, idempotencyKey: 'key-move-1' }, 7);
    await enqueuePendingWrite('job-1', notes, 7);
    await enqueuePendingWrite('job-1', reading, 7);
    const server = fakeServer(7);

    expect(await replayPendingWrites('job-1', server.deps)).toEqual({ sent: 3 });
    expect(server.sent).toEqual([
      { jobId: 'job-1', endpoint: 'replaceItem', version: 7, key: 'key-move-1' },
      { jobId: 'job-1', endpoint: 'updateJob', version: 8, key: expect.any(String) },
      { jobId: 'job-1', endpoint: 'addDepthReading', version: 9, key: expect.any(String) },
    ]);
    expect(readPendingWrites('job-1')).toEqual([]);
  });

  it('should stop on no signal and keep the rest in order for the next try', async () => {
    await enqueuePendingWrite('job-1', reading, 3);
    await enqueuePendingWrite('job-1', notes, 3);
    let isOnline = true;
    const server = fakeServer(3, () => (isOnline ? undefined : offline()));
    server.deps.send.mockImplementationOnce(async () => {
      isOnline = false;
      return { jobVersion: 4 };
    });

    expect(await replayPendingWrites('job-1', server.deps)).toEqual({ sent: 1, stoppedBy: 'no-signal' });
    expect(readPendingWrites('job-1').map((entry) => entry.write.label)).toEqual(['Job notes']);
  });

  it('should send an added record again on the version a conflict names, but never a replacing write', async () => {
    await enqueuePendingWrite('job-1', reading, 3);
    const additive = fakeServer(5, (_write, sentOn) => (sentOn < 6 ? conflict(6) : undefined));
    additive.deps.knownVersion = () => 5;
    expect(await replayPendingWrites('job-1', additive.deps)).toEqual({ sent: 1 });
    expect(additive.sent.map((call) => call.version)).toEqual([6]);

    await enqueuePendingWrite('job-1', moveItem, 3);
    const replacing = fakeServer(5, () => conflict(6));
    expect(await replayPendingWrites('job-1', replacing.deps), 'no job page open: it waits there').toEqual({ sent: 0, stoppedBy: 'conflict' });
    expect(readPendingWrites('job-1')).toHaveLength(1);

    // With the job page open, its dialog asks; the entry leaves the queue once the crew has chosen.
    const ask = vi.fn(async () => undefined);
    const stop = handleConflictsOf('job-1', ask);
    expect(await replayPendingWrites('job-1', replacing.deps)).toEqual({ sent: 0 });
    expect(ask).toHaveBeenCalledWith(expect.objectContaining({ label: 'Position of P1' }), 6);
    expect(readPendingWrites('job-1')).toEqual([]);
    stop();
  });

  it('should take a refused write off the queue and say so', async () => {
    await enqueuePendingWrite('job-1', notes, 2);
    await enqueuePendingWrite('job-1', reading, 2);
    const refusal = new ApiError({ status: 409, message: 'The job is submitted', code: 'JOB_NOT_EDITABLE' });
    const server = fakeServer(2, (write) => (write.endpoint === 'updateJob' ? refusal : undefined));

    expect(await replayPendingWrites('job-1', server.deps)).toEqual({ sent: 1 });
    expect(server.deps.onRefused).toHaveBeenCalledWith(expect.objectContaining({ label: 'Job notes' }), refusal);
    expect(readPendingWrites('job-1')).toEqual([]);
  });

  it('should replay every job from any page, oldest first, once even when asked twice at the same time', async () => {
    await enqueuePendingWrite('job-b', notes, 4);
    await enqueuePendingWrite('job-a', reading, 9);
    await enqueuePendingWrite('job-b', reading, 4);
    const server = fakeServer(20);

    const [first, second] = await Promise.all([replayAllPendingWrites(server.deps), replayAllPendingWrites(server.deps)]);
    expect(server.sent.map((call) => `${call.jobId} ${call.endpoint}`)).toEqual(['job-b updateJob', 'job-b addDepthReading', 'job-a addDepthReading']);
    expect(first.sent + second.sent, 'each write is sent and counted once').toBe(3);
    expect(readAllPendingWrites()).toEqual([]);
  });

  it('should let offline work build on a record created offline, and send it with the id the server gave (issue 17)', async () => {
    const amp = withLocalId({ endpoint: 'createItem', params: {}, body: { kind: 'amplifier', label: 'Pool amp', channels: [{ name: 'A' }] }, label: 'New amplifier' });
    const speaker = withLocalId({ endpoint: 'createItem', params: {}, body: { kind: 'speaker', label: 'Lawn speaker L1' }, label: 'New speaker' });
    expect(amp.localId).toMatch(/^[0-9a-f-]{36}$/);

    // Shown at once in the kept as-built under its local id, channels included, for the run form to pick.
    const kept = withOfflineRecord(withOfflineRecord(buildJobAsBuilt(buildAsBuilt()), amp), speaker)!;
    const shownAmp = kept.asBuilt.items.find((item) => item.id === amp.localId);
    expect(shownAmp).toMatchObject({ label: 'Pool amp', channels: [{ id: `${amp.localId}:ch0`, name: 'A' }] });
    expect(kept.asBuilt.items.some((item) => item.id === speaker.localId)).toBe(true);

    await enqueuePendingWrite('job-1', amp, 5);
    await enqueuePendingWrite('job-1', speaker, 5);
    const run: JobWrite = {
      endpoint: 'createRun',
      params: {},
      body: { label: 'Lawn run', fromItemId: amp.localId, toItemId: speaker.localId, pairs: [{ pairIndex: 1, channel: { amplifierItemId: amp.localId, channelId: `${amp.localId}:ch0` } }] },
      label: 'New run',
    };
    await enqueuePendingWrite('job-1', run, 5);
    await enqueuePendingWrite('job-1', { endpoint: 'addDepthReading', params: { runId: 'unrelated-run' }, body: { stationM: 1, depthM: 0.4 }, label: 'Reading' }, 5);

    // The server names both items "server-item"; the amplifier's channel "server-ch0".
    const server = fakeServer(5);
    let stopAfterItems = true;
    server.deps.send.mockImplementation(async (_jobId, sentOn, write) => {
      if (write.endpoint === 'createRun' && stopAfterItems) {
        stopAfterItems = false;
        throw offline();
      }
      server.bodies.push(write);
      return { jobVersion: sentOn + 1, ...created(write) };
    });
    expect(await replayPendingWrites('job-1', server.deps)).toEqual({ sent: 2, stoppedBy: 'no-signal' });
    // Kept durably with the server's ids before the run went out, so a reload now loses nothing.
    const [waiting] = readPendingWrites('job-1');
    expect(waiting?.write.body).toEqual({
      label: 'Lawn run',
      fromItemId: 'server-item',
      toItemId: 'server-item',
      pairs: [{ pairIndex: 1, channel: { amplifierItemId: 'server-item', channelId: 'server-ch0' } }],
    });

    expect(await replayPendingWrites('job-1', server.deps)).toEqual({ sent: 2 });
    expect(server.bodies.map((write) => write.endpoint)).toEqual(['createItem', 'createItem', 'createRun', 'addDepthReading']);
    expect(server.bodies[3]!.params, 'ids that are not local stay as they are').toEqual({ runId: 'unrelated-run' });
  });

  it('should send a reference point made offline to the site on the site version, before the tie made to it, with the id the server gave (issue 17)', async () => {
    const point = withLocalId({
      endpoint: 'createReferencePoint',
      params: { siteId: 'site-1' },
      body: { label: 'Gate post', x: 4, y: -2 },
      label: 'Reference point "Gate post"',
    });
    expect(point.localId).toEqual(expect.any(String));
    const kept = withOfflineRecord(buildJobAsBuilt(buildAsBuilt()), point)!;
    expect(kept.asBuilt.referencePoints.at(-1), 'shown on the device at once, for ties to pick').toMatchObject({ id: point.localId, label: 'Gate post', x: 4, y: -2 });
    const speaker = withLocalId({
      endpoint: 'createItem',
      params: {},
      body: { kind: 'speaker', label: 'P2', ties: [{ referencePointId: point.localId, distanceM: 3 }] },
      label: 'P2',
    });
    await enqueuePendingWrite('job-1', point, 7);
    await enqueuePendingWrite('job-1', speaker, 7);

    const sent: { endpoint: string; version: number; body: unknown }[] = [];
    let jobVersion = 7;
    const deps: ReplayDeps = {
      send: vi.fn<ReplayDeps['send']>(async (_jobId, version, write) => {
        sent.push({ endpoint: write.endpoint, version, body: write.body });
        if (write.endpoint === 'createReferencePoint') {
          // A site write bumps the site and every open job on it.
          jobVersion += 1;
          return { ...(write.body as object), id: 'server-point', notes: null, siteVersion: 13, jobVersions: { 'job-1': jobVersion } };
        }
        jobVersion += 1;
        return { jobVersion, ...created(write) };
      }),
      // What the kept as-built says: the sender keeps each answer's job version there.
      knownVersion: () => jobVersion,
      knownSiteVersion: (siteId) => (siteId === 'site-1' ? 12 : undefined),
      onRefused: vi.fn(),
    };

    expect(await replayPendingWrites('job-1', deps)).toEqual({ sent: 2 });
    expect(sent.map(({ endpoint, version }) => ({ endpoint, version }))).toEqual([
      { endpoint: 'createReferencePoint', version: 12 },
      { endpoint: 'createItem', version: 8 },
    ]);
    expect(sent[1]!.body).toMatchObject({ ties: [{ referencePointId: 'server-point', distanceM: 3 }] });
    expect(readPendingWrites('job-1')).toEqual([]);
  });
});
