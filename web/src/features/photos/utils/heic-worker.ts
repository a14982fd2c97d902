/**
 * The HEIC → JPEG converter, in its own module worker so a 12 MP decode never blocks the page and
 * libheif (≈1.4 MB of WebAssembly) is fetched only when a HEIC photo is picked. libheif decodes the
 * primary image with its rotation and mirroring applied (so no EXIF orientation is written), the
 * worker's OffscreenCanvas encodes JPEG, and the capture time and position are copied from the HEIC's
 * EXIF into the JPEG's (jpeg-exif.ts), where the server reads them as for any phone JPEG.
 */
import libheifFactory from 'libheif-js/libheif-wasm/libheif.js';
import wasmUrl from 'libheif-js/libheif-wasm/libheif.wasm?url';

import { readCarriedMetadata } from './heic-metadata';
import { withExif } from './jpeg-exif';

export type HeicWorkerRequest = { id: number; bytes: ArrayBuffer };
export type HeicWorkerReply = { id: number; jpeg: ArrayBuffer } | { id: number; error: string };

/** The part of libheif-js's JavaScript wrapper used here (its .d.ts lists only the raw C functions). */
type HeifImage = {
  get_width(): number;
  get_height(): number;
  is_primary(): boolean;
  display(target: ImageData, done: (shown: ImageData | null) => void): void;
  free(): void;
};
type LibHeif = {
  HeifDecoder: new () => { decoder: number | null; decode(bytes: Uint8Array): HeifImage[] };
  heif_context_free(context: number): void;
};

/** JPEG quality: close to what phones write for "most compatible", well under the upload limit. */
const JPEG_QUALITY = 0.9;

let libheif: Promise<LibHeif> | undefined;

function loadLibHeif(): Promise<LibHeif> {
  libheif ??= (async () => {
    const response = await fetch(wasmUrl);
    if (!response.ok) throw new Error(`the HEIC decoder could not be loaded (${response.status})`);
    // Given the bytes, the Emscripten module compiles them at once (a worker may compile synchronously).
    const wasmBinary = await response.arrayBuffer();
    return libheifFactory({ wasmBinary }) as unknown as LibHeif;
  })();
  libheif.catch(() => (libheif = undefined));
  return libheif;
}

async function decode(bytes: Uint8Array): Promise<ImageData> {
  const lib = await loadLibHeif();
  const decoder = new lib.HeifDecoder();
  const images = decoder.decode(bytes);
  try {
    const image = images.find((candidate) => candidate.is_primary()) ?? images[0];
    if (!image) throw new Error('the file holds no image');
    const pixels = new ImageData(image.get_width(), image.get_height());
    // Opaque unless the image says otherwise: JPEG has no alpha, and a transparent pixel would turn black.
    for (let alpha = 3; alpha < pixels.data.length; alpha += 4) pixels.data[alpha] = 255;
    await new Promise<void>((resolve, reject) => image.display(pixels, (shown) => (shown ? resolve() : reject(new Error('the image could not be decoded')))));
    return pixels;
  } finally {
    for (const image of images) image.free();
    if (decoder.decoder) lib.heif_context_free(decoder.decoder);
  }
}

async function convert(bytes: Uint8Array): Promise<Uint8Array> {
  const pixels = await decode(bytes);
  const canvas = new OffscreenCanvas(pixels.width, pixels.height);
  const context = canvas.getContext('2d');
  if (!context) throw new Error('this browser cannot draw images in the background');
  context.putImageData(pixels, 0, 0);
  const jpeg = new Uint8Array(await (await canvas.convertToBlob({ type: 'image/jpeg', quality: JPEG_QUALITY })).arrayBuffer());
  return withExif(jpeg, await readCarriedMetadata(bytes));
}

/** The worker's global scope, typed by hand: the web's tsconfig has the DOM library, not WebWorker's. */
const scope = self as unknown as {
  addEventListener(type: 'message', listener: (event: MessageEvent<HeicWorkerRequest>) => void): void;
  postMessage(message: HeicWorkerReply, transfer?: Transferable[]): void;
};

scope.addEventListener('message', (event) => {
  const { id, bytes } = event.data;
  convert(new Uint8Array(bytes)).then(
    (jpeg) => {
      const buffer = jpeg.buffer.slice(jpeg.byteOffset, jpeg.byteOffset + jpeg.byteLength) as ArrayBuffer;
      scope.postMessage({ id, jpeg: buffer } satisfies HeicWorkerReply, [buffer]);
    },
    (error: unknown) => scope.postMessage({ id, error: error instanceof Error ? error.message : String(error) } satisfies HeicWorkerReply),
  );
});
