import exifr from 'exifr';
import { EXIF_READ_OPTIONS, sniffImageType, validGpsPosition } from '@domain/photos/photo-rules';

import { extractHeifExif } from './heif-exif';
import { cleanMetadata, type CarriedMetadata } from './jpeg-exif';

const text = (value: unknown): string | undefined => (typeof value === 'string' ? value.replace(/\0+$/, '').trim() : undefined);

/**
 * The capture time (DateTimeOriginal, else CreateDate) and GPS position of an image file's EXIF (HEIC
 * or JPEG). Empty when the file has none or its EXIF cannot be read: the photo is still worth keeping.
 * A HEIC's EXIF is found with heif-exif.ts and handed to exifr as TIFF (exifr's own HEIC reader misses
 * the EXIF of files whose item locations use a base offset, as libheif writes them).
 */
export async function readCarriedMetadata(bytes: Uint8Array): Promise<CarriedMetadata> {
  try {
    const source = sniffImageType(bytes.subarray(0, 256)) === 'heic' ? extractHeifExif(bytes) : bytes;
    if (!source) return {};
    const exif = (await exifr.parse(source, EXIF_READ_OPTIONS)) as Record<string, unknown> | undefined;
    if (!exif) return {};
    const original = text(exif.DateTimeOriginal);
    const takenAt = original ?? text(exif.CreateDate);
    const offset = original === undefined ? undefined : text(exif.OffsetTimeOriginal);
    return cleanMetadata({ takenAt, offset, position: validGpsPosition(exif.latitude, exif.longitude) });
  } catch {
    return {};
  }
}
