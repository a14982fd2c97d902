import { afterEach, describe, expect, it, vi } from 'vitest';
import type { UploadPhotosResponse } from '@domain/photos/photo.schema';

import { ApiError } from '../../../lib/api-client';
import { createMemoryUploadStore, type QueuedUpload } from '../../../lib/upload-queue-store';

import { UploadQueue, type UploadEntry, type UploadSender } from './upload-queue';

const JOB = 'job-1';
const RUN = { type: 'run', id: '7d1e2f30-1111-4a4a-9b9b-000000000020' } as const;

function answer(upload: QueuedUpload, jobVersion: number, isReplay = false): UploadPhotosResponse {
  return { photos: [{ id: `photo-of-${upload.id}` } as UploadPhotosResponse['photos'][number]], isReplay, jobVersion };
}

function photo(name: string): File {
  return new File([new Uint8Array([0xff, 0xd8, 0xff, 1, 2, 3])], name, { type: 'image/jpeg' });
}

let ids = 0;
function setup(send: UploadSender, options: { stored?: QueuedUpload[]; version?: number; isOnline?: () => boolean } = {}) {
  const store = createMemoryUploadStore(options.stored);
  const getVersion = vi.fn(async () => options.version ?? 3);
  const sut = new UploadQueue({
    store,
    send: vi.fn(send),
    getVersion,
    backoffMs: () => 10,
    isOnline: options.isOnline ?? (() => true),
    newId: () => `u-${++ids}`,
  });
  const seen: UploadEntry['status']['kind'][][] = [];
  sut.subscribe(() => seen.push(sut.getSnapshot().map((entry) => entry.status.kind)));
  return { sut, store, getVersion, seen, statusOf: (id: string) => sut.getSnapshot().find((entry) => entry.id === id)?.status };
}

describe(UploadQueue.name, () => {
  let sut: UploadQueue | undefined;
  afterEach(() => sut?.stop());

  describe('add', () => {
    it('should store each file, send them one at a time with progress, and forget them once the server has them', async () => {
      let inFlight = 0;
      const sends: { id: string; version: number }[] = [];
      const ctx = setup(async (upload, version, { onProgress }) => {
        inFlight += 1;
        expect(inFlight).toBe(1);
        sends.push({ id: upload.id, version });
        onProgress({ loaded: 3, total: 6 });
        await new Promise((resolve) => setTimeout(resolve, 5));
        inFlight -= 1;
        return answer(upload, version + 1);
      });
      sut = ctx.sut;
      const [first, second] = await sut.add(JOB, [photo('trench.jpg'), photo('entry.jpg')], { target: RUN, caption: ' tape at 18 in ' });

      expect((await ctx.store.list()).map((upload) => upload.id)).toEqual([first, second]);
      await vi.waitFor(() => expect(ctx.statusOf(second!)?.kind).toBe('done'));
      expect(sends.map((s) => s.id)).toEqual([first, second]);
      expect(ctx.seen.flat()).toContain('uploading');
      expect(ctx.seen.some((kinds) => kinds[0] === 'uploading' && kinds[1] === 'waiting')).toBe(true);
      expect(sut.getSnapshot()[0]).toMatchObject({ caption: 'tape at 18 in', target: RUN, status: { kind: 'done', photoId: `photo-of-${first}` } });
      expect(await ctx.store.list()).toEqual([]);
    });
  });

  describe('retries', () => {
    it('should retry a dropped connection with the same clientUploadId until it gets through (waiting → uploading → retrying → done)', async () => {
      const attempts: string[] = [];
      const ctx = setup(async (upload, version) => {
        attempts.push(upload.id);
        if (attempts.length < 3) throw new ApiError({ status: 0, code: 'NETWORK_ERROR', message: 'Cannot reach the server.' });
        return answer(upload, version + 1, true);
      });
      sut = ctx.sut;
      const [id] = await sut.add(JOB, [photo('rack.jpg')], { target: { type: 'job' } });

      await vi.waitFor(() => expect(ctx.statusOf(id!)?.kind).toBe('done'));
      expect(attempts).toEqual([id, id, id]);
      const kinds = ctx.seen.map((list) => list[0]);
      expect(kinds).toEqual(expect.arrayContaining(['waiting', 'uploading', 'retrying', 'done']));
      expect(kinds.indexOf('retrying')).toBeLessThan(kinds.lastIndexOf('done'));
    });

    it('should wait for the connection instead of counting down while offline, and go as soon as it is woken', async () => {
      let online = false;
      let calls = 0;
      const ctx = setup(
        async (upload, version) => {
          calls += 1;
          if (!online) throw new ApiError({ status: 0, code: 'NETWORK_ERROR', message: 'Cannot reach the server.' });
          return answer(upload, version + 1);
        },
        { isOnline: () => online },
      );
      sut = ctx.sut;
      const [id] = await sut.add(JOB, [photo('trench.jpg')], { target: RUN });
      await vi.waitFor(() => expect(ctx.statusOf(id!)).toMatchObject({ kind: 'retrying', retryAt: null, reason: 'No connection' }));
      await new Promise((resolve) => setTimeout(resolve, 30));
      expect(calls).toBe(1);

      online = true;
      sut.wake();
      await vi.waitFor(() => expect(ctx.statusOf(id!)?.kind).toBe('done'));
    });

    it('should send again on the version the conflict names (uploads are additive)', async () => {
      const versions: number[] = [];
      const ctx = setup(async (upload, version) => {
        versions.push(version);
        if (version === 3) throw new ApiError({ status: 412, code: 'VERSION_CONFLICT', message: 'Someone saved first.', currentVersion: 7 });
        return answer(upload, version + 1);
      });
      sut = ctx.sut;
      const [id] = await sut.add(JOB, [photo('trench.jpg')], { target: RUN });

      await vi.waitFor(() => expect(ctx.statusOf(id!)?.kind).toBe('done'));
      expect(versions).toEqual([3, 7]);
    });

    it('should wait and try again, never give up, while the job keeps changing under the upload (issue 17)', async () => {
      let calls = 0;
      const ctx = setup(async (upload, version) => {
        calls += 1;
        // Six conflicts in a row (offline changes replaying), then the job holds still.
        if (calls <= 6) throw new ApiError({ status: 412, code: 'VERSION_CONFLICT', message: 'Someone saved first.', currentVersion: version + 1 });
        return answer(upload, version + 1);
      });
      sut = ctx.sut;
      const [id] = await sut.add(JOB, [photo('trench.jpg')], { target: RUN });
      await vi.waitFor(() => expect(ctx.statusOf(id!)?.kind).toBe('done'));
      expect(calls).toBe(7);
    });

    it.each([408, 429, 500, 503])('should retry a %i', async (status) => {
      let calls = 0;
      const ctx = setup(async (upload, version) => {
        calls += 1;
        if (calls === 1) throw new ApiError({ status, message: 'Try later.' });
        return answer(upload, version + 1);
      });
      sut = ctx.sut;
      const [id] = await sut.add(JOB, [photo('a.jpg')], { target: RUN });
      await vi.waitFor(() => expect(ctx.statusOf(id!)?.kind).toBe('done'));
      expect(calls).toBe(2);
    });
  });

  describe('refusals', () => {
    it('should stop at a 415 with the server’s message, keep the file for a retry, and not send it again by itself', async () => {
      const message = 'files[0] "IMG_0001.HEIC" is a HEIC photo, which this server cannot read. Send JPEG instead.';
      let calls = 0;
      const ctx = setup(async () => {
        calls += 1;
        throw new ApiError({ status: 415, code: 'HEIC_NOT_SUPPORTED', message });
      });
      sut = ctx.sut;
      const [id] = await sut.add(JOB, [photo('IMG_0001.HEIC')], { target: RUN });

      await vi.waitFor(() => expect(ctx.statusOf(id!)).toEqual({ kind: 'failed', reason: message }));
      await vi.waitFor(async () => expect((await ctx.store.list())[0]?.failure).toBe(message));
      sut.wake();
      await new Promise((resolve) => setTimeout(resolve, 30));
      expect(calls).toBe(1);
    });

    it.each([400, 403, 404, 413, 422])('should not retry a %i', async (status) => {
      let calls = 0;
      const ctx = setup(async () => {
        calls += 1;
        throw new ApiError({ status, message: `refused with ${status}` });
      });
      sut = ctx.sut;
      const [id] = await sut.add(JOB, [photo('a.jpg')], { target: RUN });
      await vi.waitFor(() => expect(ctx.statusOf(id!)).toEqual({ kind: 'failed', reason: `refused with ${status}` }));
      await new Promise((resolve) => setTimeout(resolve, 30));
      expect(calls).toBe(1);
    });

    it('should send a refused upload again when the crew retries it', async () => {
      let calls = 0;
      const ctx = setup(async (upload, version) => {
        calls += 1;
        if (calls === 1) throw new ApiError({ status: 403, message: 'You are not on this job’s crew.' });
        return answer(upload, version + 1);
      });
      sut = ctx.sut;
      const [id] = await sut.add(JOB, [photo('a.jpg')], { target: RUN });
      await vi.waitFor(() => expect(ctx.statusOf(id!)?.kind).toBe('failed'));
      await sut.retry(id!);
      await vi.waitFor(() => expect(ctx.statusOf(id!)?.kind).toBe('done'));
    });
  });

  describe('start', () => {
    it('should resume what the store kept from a previous page, with the same ids, and show stored refusals as failed', async () => {
      const stored: QueuedUpload[] = [
        { id: 'u-kept-1', jobId: JOB, target: RUN, caption: null, file: photo('one.jpg'), name: 'one.jpg', queuedAt: '2026-05-01T10:00:00.000Z' },
        {
          id: 'u-kept-2',
          jobId: JOB,
          target: RUN,
          caption: null,
          file: photo('two.heic'),
          name: 'two.heic',
          queuedAt: '2026-05-01T10:00:00.001Z',
          failure: 'Not a JPEG.',
        },
      ];
      const sent: string[] = [];
      const ctx = setup(
        async (upload, version) => {
          sent.push(upload.id);
          return answer(upload, version + 1);
        },
        { stored },
      );
      sut = ctx.sut;
      await sut.start();

      await vi.waitFor(() => expect(ctx.statusOf('u-kept-1')?.kind).toBe('done'));
      expect(ctx.statusOf('u-kept-2')).toEqual({ kind: 'failed', reason: 'Not a JPEG.' });
      expect(sent).toEqual(['u-kept-1']);
      expect((await ctx.store.list()).map((upload) => upload.id)).toEqual(['u-kept-2']);
    });
  });

  describe('discard', () => {
    it('should drop a waiting upload from the queue and the store', async () => {
      const ctx = setup(async () => {
        throw new ApiError({ status: 0, message: 'Cannot reach the server.' });
      }, { isOnline: () => false });
      sut = ctx.sut;
      const [id] = await sut.add(JOB, [photo('a.jpg')], { target: RUN });
      await vi.waitFor(() => expect(ctx.statusOf(id!)?.kind).toBe('retrying'));
      await sut.discard(id!);
      expect(sut.getSnapshot()).toEqual([]);
      expect(await ctx.store.list()).toEqual([]);
    });
  });
});
