import exifr from 'exifr';
import { describe, expect, it } from 'vitest';
import { EXIF_READ_OPTIONS, parseExifDateTime, validGpsPosition } from '@domain/photos/photo-rules';

import { buildExifTiff, toDegreesMinutesSeconds, withExif } from './jpeg-exif';

/**
 * The header of a baseline JPEG as a canvas writes it (SOI, JFIF APP0, a quantisation table), then a
 * start of scan, one byte of entropy-coded data and EOI. Enough for a segment reader; the e2e test
 * sends a real converted photo through the server's decoder.
 */
function canvasLikeJpeg(extraSegments: number[][] = []): Uint8Array {
  const app0 = [0xff, 0xe0, 0x00, 0x10, 0x4a, 0x46, 0x49, 0x46, 0x00, 0x01, 0x01, 0x00, 0x00, 0x01, 0x00, 0x01, 0x00, 0x00];
  const dqt = [0xff, 0xdb, 0x00, 0x43, 0x00, ...Array<number>(64).fill(1)];
  const sos = [0xff, 0xda, 0x00, 0x08, 0x01, 0x01, 0x00, 0x00, 0x3f, 0x00, 0x12];
  return new Uint8Array([0xff, 0xd8, ...app0, ...extraSegments.flat(), ...dqt, ...sos, 0xff, 0xd9]);
}

/** The server's reading of a JPEG's EXIF (the shared EXIF_READ_OPTIONS, then as api/src/photos/photo-processor.ts does). */
async function readAsServer(jpeg: Uint8Array): Promise<{ takenAt: string | undefined; location: { lat: number; lon: number } | undefined }> {
  const exif = (await exifr.parse(jpeg, EXIF_READ_OPTIONS)) as Record<string, unknown> | undefined;
  return {
    takenAt: parseExifDateTime(exif?.DateTimeOriginal) ?? parseExifDateTime(exif?.CreateDate),
    location: validGpsPosition(exif?.latitude, exif?.longitude),
  };
}

const segmentMarkers = (jpeg: Uint8Array): string[] => {
  const markers: string[] = [];
  for (let at = 2; at + 4 <= jpeg.length && jpeg[at] === 0xff; ) {
    markers.push(jpeg[at + 1]!.toString(16));
    if (jpeg[at + 1] === 0xda) break;
    at += 2 + ((jpeg[at + 2]! << 8) | jpeg[at + 3]!);
  }
  return markers;
};

describe('toDegreesMinutesSeconds', () => {
  // Exif 2.32 (CIPA DC-008-2019) §4.6.6: GPSLatitude/GPSLongitude are three RATIONALs, degrees, minutes
  // and seconds. Expected values: 0.0003° × 3600 = 1.08″ and 0.0004° × 3600 = 1.44″, as exiftool 12.57
  // prints the fixture's source photo ("40 deg 0' 1.08" N", "105 deg 0' 1.44" W").
  it.each([
    [40.0003, [[40, 1], [0, 1], [10_800, 10_000]]],
    [-105.0004, [[105, 1], [0, 1], [14_400, 10_000]]],
    // 51° 28′ 40.12″ = 51.477811…°: minutes and seconds both in play.
    [51 + 28 / 60 + 40.12 / 3600, [[51, 1], [28, 1], [401_200, 10_000]]],
    // 0.99999999° is 59′ 59.99996″, which rounds to whole steps as 1° 0′ 0″, never as 60″.
    [0.99999999, [[1, 1], [0, 1], [0, 10_000]]],
  ])('should write %f° as %j', (degrees, expected) => {
    expect(toDegreesMinutesSeconds(degrees)).toEqual(expected);
  });
});

describe('withExif', () => {
  it('should carry the capture time, its offset and the position so the server reads them as from a phone JPEG', async () => {
    const sut = withExif(canvasLikeJpeg(), { takenAt: '2024:05:01 10:11:12', offset: '-06:00', position: { lat: 40.0003, lon: -105.0004 } });

    const server = await readAsServer(sut);
    expect(server.takenAt).toBe('2024-05-01T10:11:12');
    expect(server.location?.lat).toBeCloseTo(40.0003, 8);
    expect(server.location?.lon).toBeCloseTo(-105.0004, 8);
    const raw = (await exifr.parse(sut, { reviveValues: false, translateValues: false })) as Record<string, unknown>;
    expect(raw).toMatchObject({ OffsetTimeOriginal: '-06:00', GPSLatitudeRef: 'N', GPSLongitudeRef: 'W' });
    expect(Array.from(raw.GPSVersionID as ArrayLike<number>)).toEqual([2, 3, 0, 0]);
    // No orientation: the converted pixels are upright already, a copied tag would turn them again.
    expect(raw.Orientation).toBeUndefined();
  });

  it('should put the EXIF segment after the JFIF header and keep the rest of the file byte for byte', () => {
    const jpeg = canvasLikeJpeg();
    const sut = withExif(jpeg, { takenAt: '2024:05:01 10:11:12' });
    expect(segmentMarkers(sut)).toEqual(['e0', 'e1', 'db', 'da']);
    expect(sut.subarray(0, 20)).toEqual(jpeg.subarray(0, 20));
    const added = sut.length - jpeg.length;
    expect(sut.subarray(20 + added)).toEqual(jpeg.subarray(20));
  });

  it('should replace an EXIF segment the JPEG already had', async () => {
    const old = withExif(canvasLikeJpeg(), { takenAt: '2001:01:01 01:01:01', position: { lat: -33.9, lon: 151.2 } });
    const sut = withExif(old, { takenAt: '2024:05:01 10:11:12' });
    expect(segmentMarkers(sut).filter((marker) => marker === 'e1')).toHaveLength(1);
    expect(await readAsServer(sut)).toEqual({ takenAt: '2024-05-01T10:11:12', location: undefined });
  });

  it('should write southern and western positions with S and W references', async () => {
    const sut = withExif(canvasLikeJpeg(), { position: { lat: -33.8568, lon: 151.2153 } });
    const server = await readAsServer(sut);
    expect(server.takenAt).toBeUndefined();
    expect(server.location?.lat).toBeCloseTo(-33.8568, 8);
    expect(server.location?.lon).toBeCloseTo(151.2153, 8);
  });

  it.each([
    ['nothing', {}],
    ['a malformed time', { takenAt: '2024-05-01 10:11:12' }],
    ['the 0,0 of a receiver without a fix', { position: { lat: 0, lon: 0 } }],
    ['a latitude out of range', { position: { lat: 91, lon: 10 } }],
  ])('should leave the JPEG as it was when there is %s to carry', (_name, metadata) => {
    const jpeg = canvasLikeJpeg();
    expect(withExif(jpeg, metadata)).toBe(jpeg);
    expect(buildExifTiff(metadata)).toBeUndefined();
  });

  it('should drop an offset that is not ±HH:MM but keep the time', async () => {
    const sut = withExif(canvasLikeJpeg(), { takenAt: '2024:05:01 10:11:12', offset: 'GMT-6' });
    const raw = (await exifr.parse(sut, { reviveValues: false })) as Record<string, unknown>;
    expect(raw.DateTimeOriginal).toBe('2024:05:01 10:11:12');
    expect(raw.OffsetTimeOriginal).toBeUndefined();
  });

  it('should refuse bytes that are not a JPEG', () => {
    expect(() => withExif(new Uint8Array([0x89, 0x50, 0x4e, 0x47]), { takenAt: '2024:05:01 10:11:12' })).toThrow('not a JPEG');
  });
});
