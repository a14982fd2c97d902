import { afterEach, beforeEach, describe, expect, it } from 'vitest';

import { ApiError } from '../../../lib/api-client';
import { resetSession, setSession } from '../../../lib/session';
import { buildSessionResponse, buildSessionUser } from '../../../testing/data';
import { isWorthRetrying } from './replay-pending-writes';

import { enqueuePendingWrite, loadPendingWrites, readAllPendingWrites, readPendingWrites, removePendingWrite, resetPendingWritesForTests } from './pending-writes';

describe('the offline write queue (issue 17)', () => {
  beforeEach(() => {
    localStorage.clear();
    resetPendingWritesForTests();
    resetSession();
  });
  afterEach(() => resetSession());

  it('should keep writes in order with one idempotency key each, per person, until removed', async () => {
    setSession(buildSessionResponse(buildSessionUser('lead')));
    const a = await enqueuePendingWrite('job-1', { endpoint: 'createItem', params: {}, body: { label: 'S1' }, label: 'Speaker S1' }, 7);
    const b = await enqueuePendingWrite('job-1', { endpoint: 'createCheck', params: {}, body: {}, label: 'Check', idempotencyKey: 'kept-key-123' }, 7);
    await enqueuePendingWrite('job-2', { endpoint: 'updateJob', params: {}, body: { notes: 'x' }, label: 'Job notes' }, 3);

    expect(readPendingWrites('job-1').map((entry) => entry.write.label)).toEqual(['Speaker S1', 'Check']);
    expect(a.write.idempotencyKey).toMatch(/^[A-Za-z0-9_.:-]{8,128}$/);
    expect(b.write.idempotencyKey, 'a key made before the first attempt is kept').toBe('kept-key-123');
    expect(a.seq).toBeLessThan(b.seq);
    expect(readAllPendingWrites()).toHaveLength(3);
    // The same array until the queue changes (useSyncExternalStore).
    expect(readPendingWrites('job-1')).toBe(readPendingWrites('job-1'));

    // Someone else signed in on this phone neither sees nor sends the lead's changes.
    setSession(buildSessionResponse(buildSessionUser('tech')));
    expect(readPendingWrites('job-1')).toEqual([]);
    expect(readAllPendingWrites()).toEqual([]);

    setSession(buildSessionResponse(buildSessionUser('lead')));
    await removePendingWrite('job-1', a.id);
    expect(readPendingWrites('job-1').map((entry) => entry.id)).toEqual([b.id]);
  });

  it('should move writes queued in localStorage by the earlier app into the queue, each with a new key', async () => {
    localStorage.setItem(
      'loamline.pending.job-9',
      JSON.stringify([{ id: 'old-1', write: { method: 'POST', path: '/zones', body: { name: 'Lawn' }, label: 'New zone' }, baseVersion: 2, queuedAt: '2026-12-01T10:00:00Z' }]),
    );
    await loadPendingWrites();
    setSession(buildSessionResponse(buildSessionUser('lead')));
    const [moved] = readPendingWrites('job-9');
    expect(moved?.write.label).toBe('New zone');
    expect(moved?.write, 'kept as an endpoint and its parameters, not a path').toMatchObject({ endpoint: 'createZone', params: {}, body: { name: 'Lawn' } });
    expect(moved?.write.idempotencyKey).toBeTruthy();
    expect(localStorage.getItem('loamline.pending.job-9')).toBeNull();
  });

  it('should retry no signal, a busy server and a change still being saved, and not a refusal', () => {
    expect(isWorthRetrying(new ApiError({ status: 0, message: 'Cannot reach the server.' }))).toBe(true);
    expect(isWorthRetrying(new ApiError({ status: 503, message: 'down', code: 'DATABASE_UNAVAILABLE' }))).toBe(true);
    expect(isWorthRetrying(new ApiError({ status: 409, message: 'busy', code: 'IDEMPOTENCY_IN_PROGRESS' }))).toBe(true);
    expect(isWorthRetrying(new ApiError({ status: 412, message: 'changed', code: 'VERSION_CONFLICT' }))).toBe(false);
    expect(isWorthRetrying(new ApiError({ status: 400, message: 'bad', code: 'VALIDATION_FAILED' }))).toBe(false);
  });
});
