import { sniffImageType } from '@domain/photos/photo-rules';

import type { HeicWorkerReply, HeicWorkerRequest } from './heic-worker';

/** Turns one HEIC file into a JPEG file (capture time and position kept). */
export type HeicConverter = { convert: (file: File) => Promise<File>; close: () => void };

/** What the picked files become: the ones ready to queue, and a plain sentence for each that is not. */
export type PreparedPhotos = { files: File[]; problems: string[] };

/** Does the file's content say HEIC/HEIF (the `ftyp` brands; the name and the browser's type are not trusted)? */
export async function isHeicFile(file: Blob): Promise<boolean> {
  const head = new Uint8Array(await file.slice(0, 256).arrayBuffer());
  return sniffImageType(head) === 'heic';
}

/** `IMG_0042.HEIC` → `IMG_0042.jpg`; a name without a HEIC/HEIF ending gets `.jpg` added. */
export function jpegNameFor(name: string): string {
  const base = name.replace(/\.(heic|heif|hif)$/i, '');
  return `${base || 'photo'}.jpg`;
}

/** Can this browser run the converter: a module worker, a canvas it can draw on there, and WebAssembly? */
export function canConvertHeic(): boolean {
  return typeof Worker !== 'undefined' && typeof OffscreenCanvas !== 'undefined' && typeof WebAssembly !== 'undefined';
}

export function cannotConvertMessage(name: string): string {
  return (
    `${name} is a HEIC photo that this browser could not turn into a JPEG. Set the phone's camera to its most ` +
    'compatible format (JPEG), or share the photo as JPEG, and add it again.'
  );
}

/**
 * The converter in a module worker (heic-worker.ts): the page stays responsive during a decode, and
 * libheif is loaded only when a HEIC photo is picked. One worker for a batch, one file at a time
 * (a 12 MP photo is about 48 MB of pixels while it converts); `close` ends it and frees that memory.
 */
export function createWorkerHeicConverter(): HeicConverter {
  let worker: Worker | undefined;
  let nextId = 1;
  const pending = new Map<number, { resolve: (jpeg: ArrayBuffer) => void; reject: (error: Error) => void }>();

  const fail = (error: Error) => {
    for (const { reject } of pending.values()) reject(error);
    pending.clear();
  };
  const start = (): Worker => {
    if (worker) return worker;
    const started = new Worker(new URL('./heic-worker.ts', import.meta.url), { type: 'module', name: 'heic-converter' });
    started.addEventListener('message', (event: MessageEvent<HeicWorkerReply>) => {
      const reply = event.data;
      const waiting = pending.get(reply.id);
      if (!waiting) return;
      pending.delete(reply.id);
      if ('jpeg' in reply) waiting.resolve(reply.jpeg);
      else waiting.reject(new Error(reply.error));
    });
    started.addEventListener('error', (event) => {
      event.preventDefault();
      fail(new Error(event.message || 'the converter stopped'));
      started.terminate();
      worker = undefined;
    });
    worker = started;
    return started;
  };

  return {
    async convert(file) {
      const bytes = await file.arrayBuffer();
      const id = nextId++;
      const jpeg = await new Promise<ArrayBuffer>((resolve, reject) => {
        pending.set(id, { resolve, reject });
        start().postMessage({ id, bytes } satisfies HeicWorkerRequest, [bytes]);
      });
      return new File([jpeg], jpegNameFor(file.name), { type: 'image/jpeg', lastModified: file.lastModified });
    },
    close() {
      fail(new Error('the converter was closed'));
      worker?.terminate();
      worker = undefined;
    },
  };
}

export type PreparePhotosOptions = {
  /** Makes the converter, only when a HEIC file is among the picked ones. */
  createConverter?: () => HeicConverter;
  isSupported?: () => boolean;
  /** Told how many HEIC files are about to be converted (0 when none), before the first starts. */
  onConverting?: (count: number) => void;
};

/**
 * The picked files as the server takes them: JPEG, PNG and WebP (and anything else, which the server
 * refuses with its reason) go as they are; HEIC/HEIF from a phone set to high efficiency is converted
 * to JPEG here first, because the server's image library cannot decode HEVC. A file that cannot be
 * converted is left out with a plain sentence saying what to do, and the others still go.
 */
export async function preparePhotos(files: readonly File[], options: PreparePhotosOptions = {}): Promise<PreparedPhotos> {
  const { createConverter = createWorkerHeicConverter, isSupported = canConvertHeic, onConverting } = options;
  const isHeic = await Promise.all(files.map((file) => isHeicFile(file).catch(() => false)));
  const heicCount = isHeic.filter(Boolean).length;
  onConverting?.(heicCount);
  if (heicCount === 0) return { files: [...files], problems: [] };

  const prepared: File[] = [];
  const problems: string[] = [];
  const converter = isSupported() ? createConverter() : undefined;
  try {
    for (const [index, file] of files.entries()) {
      if (!isHeic[index]) {
        prepared.push(file);
        continue;
      }
      if (!converter) {
        problems.push(cannotConvertMessage(file.name));
        continue;
      }
      try {
        prepared.push(await converter.convert(file));
      } catch {
        problems.push(cannotConvertMessage(file.name));
      }
    }
  } finally {
    converter?.close();
  }
  return { files: prepared, problems };
}
