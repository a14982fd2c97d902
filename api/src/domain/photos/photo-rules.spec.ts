import { describe, expect, it } from 'vitest';

import { canReadPhotoVariant, parseExifDateTime, sanitizeFileName, sniffImageType, validGpsPosition } from './photo-rules.js';
import { UploadPhotosFieldsSchema } from './photo.schema.js';

const bytes = (...values: (number | string)[]) =>
  Uint8Array.from(values.flatMap((v) => (typeof v === 'string' ? [...v].map((c) => c.charCodeAt(0)) : [v])));

const ftyp = (major: string, ...compatible: string[]) =>
  bytes(0, 0, 0, 16 + 4 * compatible.length, 'ftyp', major, 0, 0, 0, 0, ...compatible);

describe(sniffImageType.name, () => {
  it.each([
    ['JPEG', bytes(0xff, 0xd8, 0xff, 0xe1, 0, 0), 'jpeg'],
    ['PNG', bytes(0x89, 'PNG', 0x0d, 0x0a, 0x1a, 0x0a, 0, 0), 'png'],
    ['WebP', bytes('RIFF', 0, 0, 0, 0, 'WEBP', 'VP8 '), 'webp'],
    ['HEIC (a phone\'s high-efficiency format)', ftyp('heic', 'mif1', 'heic'), 'heic'],
    ['HEIC by mif1 only', ftyp('mif1', 'mif1'), 'heic'],
    ['AVIF', ftyp('avif', 'mif1', 'avif'), 'avif'],
    ['text named .jpg', bytes('hello, this is not a photo'), undefined],
    ['PDF', bytes('%PDF-1.7'), undefined],
    ['GIF', bytes('GIF89a', 0, 0), undefined],
    ['MP4', ftyp('isom', 'isom', 'mp41'), undefined],
    ['two bytes of JPEG', bytes(0xff, 0xd8), undefined],
    ['empty', bytes(), undefined],
  ])('should read %s as %s', (_name, input, expected) => {
    expect(sniffImageType(input)).toBe(expected);
  });
});

describe(sanitizeFileName.name, () => {
  it.each([
    ['IMG_0042.JPG', 'IMG_0042.JPG'],
    ['../../etc/passwd', 'passwd'],
    ['..\\..\\windows\\win.ini', 'win.ini'],
    ['trench <script>.jpg', 'trench _script_.jpg'],
    ['.hidden.jpg', 'hidden.jpg'],
    ['nul\0byte.jpg', 'nul_byte.jpg'],
    ['', null],
    [undefined, null],
    ['../', null],
  ])('should make %j into %j', (input, expected) => {
    expect(sanitizeFileName(input)).toBe(expected);
  });

  it('should cap the length at 120 characters', () => {
    expect(sanitizeFileName(`${'a'.repeat(300)}.jpg`)).toHaveLength(120);
  });
});

describe(parseExifDateTime.name, () => {
  it.each([
    ['2024:05:01 10:11:12', '2024-05-01T10:11:12'],
    ['2024:05:01 10:11:12.123', '2024-05-01T10:11:12'],
    ['0000:00:00 00:00:00', undefined],
    ['2024:13:01 10:11:12', undefined],
    ['yesterday', undefined],
    [undefined, undefined],
    [1714558272, undefined],
  ])('should read %j as %j', (input, expected) => {
    expect(parseExifDateTime(input)).toBe(expected);
  });
});

describe(validGpsPosition.name, () => {
  it.each([
    [40.0003, -105.0004, { lat: 40.0003, lon: -105.0004 }],
    [0, 0, undefined],
    [91, 0, undefined],
    [10, 181, undefined],
    [Number.NaN, 1, undefined],
    ['45', '1', undefined],
  ])('should read (%j, %j) as %j', (lat, lon, expected) => {
    expect(validGpsPosition(lat, lon)).toEqual(expected);
  });
});

describe(canReadPhotoVariant.name, () => {
  it.each([
    ['tech', 'original', true],
    ['office', 'print', true],
    ['homeowner', 'thumb', false],
    ['homeowner', 'original', false],
  ] as const)('should let %s read %s: %s', (role, variant, expected) => {
    expect(canReadPhotoVariant(role, variant)).toBe(expected);
  });
});

describe('UploadPhotosFieldsSchema', () => {
  it('should read a JSON target, one or several client upload ids, and a blank caption as none', () => {
    const id = '0b7f6a3e-3b5c-4a34-9d1c-2a9a6f0b1c2d';
    expect(
      UploadPhotosFieldsSchema.parse({ target: JSON.stringify({ type: 'run', id }), clientUploadId: 'a1', caption: '  ' }),
    ).toEqual({ target: { type: 'run', id }, clientUploadId: ['a1'], caption: null });
    expect(UploadPhotosFieldsSchema.parse({ clientUploadId: ['a1', 'a2'] }).clientUploadId).toEqual(['a1', 'a2']);
  });

  it('should refuse a target without an id, and a client upload id with a slash', () => {
    expect(UploadPhotosFieldsSchema.safeParse({ target: '{"type":"item"}' }).success).toBe(false);
    expect(UploadPhotosFieldsSchema.safeParse({ clientUploadId: '../x' }).success).toBe(false);
  });
});
