import { describe, expect, it } from 'vitest';

import { readFixture } from '../../../testing/read-fixture';

import { readCarriedMetadata } from './heic-metadata';
import { extractHeifExif } from './heif-exif';
import { buildExifTiff } from './jpeg-exif';

const HEIC = await readFixture('photos/field-photo.heic');

const uint = (value: number, size: number): number[] => Array.from({ length: size }, (_, index) => Math.floor(value / 256 ** (size - 1 - index)) % 256);
const ascii = (text: string): number[] => [...text].map((char) => char.charCodeAt(0));
const box = (type: string, payload: number[]): number[] => [...uint(8 + payload.length, 4), ...ascii(type), ...payload];
const fullBox = (type: string, version: number, payload: number[]): number[] => box(type, [version, 0, 0, 0, ...payload]);

type Layout = {
  /** iloc version 0 (offsets in the file), or 1 with a construction method. */
  ilocVersion: 0 | 1;
  baseOffsetSize: 0 | 4 | 8;
  /** 0: the item's bytes are in `mdat`; 1: in the `idat` box. */
  method?: 0 | 1;
  /** The item's bytes in this many extents. */
  extents?: 1 | 2;
  /** What stands between the 4-byte offset field and the TIFF header. */
  prefix: number[];
  /** The item's first field, when it should not be the prefix's length (a broken file). */
  tiffOffset?: number;
  itemType?: string;
};

/**
 * A HEIF file with one coded image item (its bytes are not needed) and one EXIF item, laid out by the
 * rules of ISO/IEC 14496-12 §8.11 (`meta`, `iinf`/`infe` v2, `iloc` v0/v1) and ISO/IEC 23008-12 A.2.1
 * (the EXIF item starts with the 32-bit offset of the TIFF header).
 */
function heifFile(tiff: Uint8Array, layout: Layout): Uint8Array {
  const item = [...uint(layout.tiffOffset ?? layout.prefix.length, 4), ...layout.prefix, ...tiff];
  const ftyp = box('ftyp', [...ascii('heic'), 0, 0, 0, 0, ...ascii('mif1heic')]);
  const iinf = fullBox('iinf', 0, [
    ...uint(2, 2),
    ...fullBox('infe', 2, [...uint(1, 2), 0, 0, ...ascii('hvc1'), 0]),
    ...fullBox('infe', 2, [...uint(2, 2), 0, 0, ...ascii(layout.itemType ?? 'Exif'), 0]),
  ]);
  const split = layout.extents === 2 ? Math.floor(item.length / 2) : item.length;
  const pieces = layout.extents === 2 ? [[0, split], [split, item.length - split]] : [[0, item.length]];
  const method = layout.method ?? 0;
  const iloc = (dataAt: number) => {
    const entry = (id: number, at: number, extents: number[][]) => [
      ...uint(id, 2),
      ...(layout.ilocVersion === 1 ? uint(method, 2) : []),
      0,
      0,
      // With a base offset the extents count from it; without, each extent holds the file offset.
      ...uint(layout.baseOffsetSize ? at : 0, layout.baseOffsetSize),
      ...uint(extents.length, 2),
      ...extents.flatMap(([offset, length]) => [...uint((layout.baseOffsetSize ? 0 : at) + offset!, 4), ...uint(length!, 4)]),
    ];
    return fullBox('iloc', layout.ilocVersion, [0x44, layout.baseOffsetSize << 4, ...uint(2, 2), ...entry(1, 0, [[0, 0]]), ...entry(2, dataAt, pieces)]);
  };
  const idat = method === 1 ? box('idat', item) : [];
  // Two passes: the EXIF item's offset depends on the size of the boxes before it.
  const metaOf = (dataAt: number) => fullBox('meta', 0, [...box('hdlr', [0, 0, 0, 0, 0, 0, 0, 0, ...ascii('pict')]), ...iinf, ...iloc(dataAt), ...idat]);
  const mdatPayloadAt = ftyp.length + metaOf(0).length + 8;
  const meta = metaOf(method === 1 ? 0 : mdatPayloadAt);
  return new Uint8Array([...ftyp, ...meta, ...box('mdat', method === 1 ? [] : item)]);
}

const TIFF = buildExifTiff({ takenAt: '2024:05:01 10:11:12', position: { lat: -33.8568, lon: 151.2153 } })!;
const EXIF_HEADER = [...ascii('Exif'), 0, 0];

describe('extractHeifExif', () => {
  it('should find the EXIF of a real libheif HEIC, whose item location uses a base offset', () => {
    const sut = extractHeifExif(HEIC);
    expect(sut && [...sut.subarray(0, 4)]).toEqual([0x49, 0x49, 0x2a, 0x00]);
    expect(sut).toHaveLength(372);
  });

  it.each<[string, Layout]>([
    ['as phones write it (file offsets, "Exif\\0\\0" before the TIFF header)', { ilocVersion: 0, baseOffsetSize: 0, prefix: EXIF_HEADER }],
    ['as libheif writes it (a base offset, no prefix)', { ilocVersion: 1, baseOffsetSize: 4, prefix: [] }],
    ['with an 8-byte base offset', { ilocVersion: 1, baseOffsetSize: 8, prefix: EXIF_HEADER }],
    ['in the idat box (construction method 1)', { ilocVersion: 1, baseOffsetSize: 0, method: 1, prefix: EXIF_HEADER }],
    ['in two extents', { ilocVersion: 0, baseOffsetSize: 0, extents: 2, prefix: EXIF_HEADER }],
  ])('should return the TIFF bytes of an EXIF item stored %s', async (_name, layout) => {
    const file = heifFile(TIFF, layout);
    expect(extractHeifExif(file)).toEqual(TIFF);
    const metadata = await readCarriedMetadata(file);
    expect(metadata.takenAt).toBe('2024:05:01 10:11:12');
    expect(metadata.position?.lat).toBeCloseTo(-33.8568, 8);
    expect(metadata.position?.lon).toBeCloseTo(151.2153, 8);
  });

  it('should give nothing for a HEIF without an EXIF item, a broken one, or bytes that are not HEIF', () => {
    expect(extractHeifExif(heifFile(TIFF, { ilocVersion: 0, baseOffsetSize: 0, prefix: EXIF_HEADER, itemType: 'mime' }))).toBeUndefined();
    expect(extractHeifExif(heifFile(TIFF, { ilocVersion: 0, baseOffsetSize: 0, prefix: EXIF_HEADER, tiffOffset: 2 }))).toBeUndefined();
    expect(extractHeifExif(HEIC.subarray(0, 200))).toBeUndefined();
    expect(extractHeifExif(new TextEncoder().encode('these are my notes, not a photo'))).toBeUndefined();
  });
});
