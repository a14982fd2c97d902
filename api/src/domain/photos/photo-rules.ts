import type { Role } from '../auth/roles.js';
import type { PhotoVariant } from './photo.schema.js';

/** Image types accepted for upload, told apart by their first bytes, never by name or client type. */
export type SniffedImageType = 'jpeg' | 'png' | 'webp' | 'heic' | 'avif';

export const IMAGE_CONTENT_TYPES: Record<SniffedImageType, string> = {
  jpeg: 'image/jpeg',
  png: 'image/png',
  webp: 'image/webp',
  heic: 'image/heic',
  avif: 'image/avif',
};

export const IMAGE_EXTENSIONS: Record<SniffedImageType, string> = {
  jpeg: 'jpg',
  png: 'png',
  webp: 'webp',
  heic: 'heic',
  avif: 'avif',
};

const ascii = (bytes: Uint8Array, start: number, length: number) =>
  String.fromCharCode(...bytes.subarray(start, start + length));

const HEIC_BRANDS = new Set(['heic', 'heix', 'hevc', 'hevx', 'heim', 'heis', 'hevm', 'hevs']);
const AVIF_BRANDS = new Set(['avif', 'avis']);

/**
 * The image type from its magic numbers: JPEG `FF D8 FF`, PNG's 8-byte signature, WebP `RIFF….WEBP`,
 * and ISO-BMFF `ftyp` boxes whose major or compatible brands say HEIC or AVIF (`mif1` alone is
 * ambiguous and is read as HEIC, which is what phones write). Anything else is `undefined`.
 */
export function sniffImageType(bytes: Uint8Array): SniffedImageType | undefined {
  if (bytes.length >= 3 && bytes[0] === 0xff && bytes[1] === 0xd8 && bytes[2] === 0xff) return 'jpeg';
  if (bytes.length >= 8 && [0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a].every((b, i) => bytes[i] === b)) return 'png';
  if (bytes.length >= 12 && ascii(bytes, 0, 4) === 'RIFF' && ascii(bytes, 8, 4) === 'WEBP') return 'webp';
  if (bytes.length >= 12 && ascii(bytes, 4, 4) === 'ftyp') {
    const boxSize = ((bytes[0]! << 24) | (bytes[1]! << 16) | (bytes[2]! << 8) | bytes[3]!) >>> 0;
    const end = Math.min(bytes.length, Math.max(boxSize, 16), 256);
    const brands = [ascii(bytes, 8, 4)];
    for (let offset = 16; offset + 4 <= end; offset += 4) brands.push(ascii(bytes, offset, 4));
    if (brands.some((brand) => AVIF_BRANDS.has(brand))) return 'avif';
    if (brands.some((brand) => HEIC_BRANDS.has(brand) || brand === 'mif1' || brand === 'msf1')) return 'heic';
  }
  return undefined;
}

/**
 * A file name safe to show and store as metadata: the last path segment, control characters and
 * anything outside a conservative set replaced, at most 120 characters. Storage keys never use it.
 */
export function sanitizeFileName(name: string | undefined): string | null {
  if (!name) return null;
  const base = name.split(/[\\/]/).pop() ?? '';
  const cleaned = base
    .normalize('NFC')
    .replace(/[^\p{L}\p{N} ._()+-]/gu, '_')
    .replace(/^[.\s]+/, '')
    .trim()
    .slice(0, 120);
  return cleaned === '' ? null : cleaned;
}

/**
 * How a photo's EXIF is read (exifr's options), on the server for an upload and in the browser for a
 * HEIC converted before upload: only the capture time, its offset and the position, as raw values.
 */
export const EXIF_READ_OPTIONS = {
  tiff: true,
  exif: true,
  gps: true,
  ifd1: false,
  interop: false,
  xmp: false,
  icc: false,
  iptc: false,
  jfif: false,
  ihdr: false,
  reviveValues: false,
  translateValues: false,
  pick: ['DateTimeOriginal', 'CreateDate', 'OffsetTimeOriginal', 'GPSLatitude', 'GPSLatitudeRef', 'GPSLongitude', 'GPSLongitudeRef'],
};

/**
 * EXIF `DateTimeOriginal` (`2024:05:01 10:11:12`) as ISO local time `2024-05-01T10:11:12`, or
 * `undefined` when absent or malformed (cameras write `0000:00:00 00:00:00` when their clock is unset).
 */
export function parseExifDateTime(value: unknown): string | undefined {
  if (typeof value !== 'string') return undefined;
  const match = /^(\d{4}):(\d{2}):(\d{2})[ T](\d{2}):(\d{2}):(\d{2})/.exec(value.trim());
  if (!match) return undefined;
  const [, y, mo, d, h, mi, s] = match.map(Number) as [number, number, number, number, number, number, number];
  if (y < 1900 || mo < 1 || mo > 12 || d < 1 || d > 31 || h > 23 || mi > 59 || s > 59) return undefined;
  const pad = (n: number) => String(n).padStart(2, '0');
  return `${y}-${pad(mo)}-${pad(d)}T${pad(h)}:${pad(mi)}:${pad(s)}`;
}

/** A GPS position when both coordinates are finite and in range (and not the 0,0 of an unset receiver). */
export function validGpsPosition(lat: unknown, lon: unknown): { lat: number; lon: number } | undefined {
  if (typeof lat !== 'number' || typeof lon !== 'number' || !Number.isFinite(lat) || !Number.isFinite(lon)) return undefined;
  if (Math.abs(lat) > 90 || Math.abs(lon) > 180 || (lat === 0 && lon === 0)) return undefined;
  return { lat, lon };
}

/**
 * May `role` fetch `variant` of a company photo? Originals (full EXIF, GPS included) are for staff;
 * homeowners will see derivatives only, once they are given photos at all.
 */
export function canReadPhotoVariant(role: Role, variant: PhotoVariant): boolean {
  if (role === 'homeowner') return false;
  return variant !== 'original' || ['admin', 'office', 'lead', 'tech'].includes(role);
}

/** Bounding boxes of the derivatives: thumb is cropped to a square; print is ~8 in at 300 dpi. */
export const DERIVATIVE_SIZES = {
  thumb: { width: 320, height: 320, fit: 'cover' },
  screen: { width: 1600, height: 1600, fit: 'inside' },
  print: { width: 2400, height: 2400, fit: 'inside' },
} as const;
