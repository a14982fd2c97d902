/**
 * What a converted photo carries over from its original: the capture time and position that the
 * server reads from a JPEG's EXIF for the record (api/src/photos/photo-processor.ts). Nothing else:
 * no camera, no orientation (the converted pixels are upright already), no thumbnail.
 */
export type CarriedMetadata = {
  /** EXIF DateTimeOriginal as the camera wrote it, `YYYY:MM:DD HH:MM:SS` (local time, no zone). */
  takenAt?: string;
  /** EXIF OffsetTimeOriginal, `+HH:MM` or `-HH:MM`, when the camera wrote one. */
  offset?: string;
  /** WGS 84 degrees, north and east positive. */
  position?: { lat: number; lon: number };
};

const EXIF_DATE_TIME = /^\d{4}:\d{2}:\d{2} \d{2}:\d{2}:\d{2}$/;
const EXIF_OFFSET = /^[+-]\d{2}:\d{2}$/;

// TIFF 6.0 §2 field types.
const BYTE = 1;
const ASCII = 2;
const LONG = 4;
const RATIONAL = 5;
const UNDEFINED = 7;
const TYPE_SIZE: Record<number, number> = { [BYTE]: 1, [ASCII]: 1, [LONG]: 4, [RATIONAL]: 8, [UNDEFINED]: 1 };

type Field = { tag: number; type: number; count: number; value: Uint8Array };

const asciiField = (tag: number, text: string): Field => {
  const value = new Uint8Array(text.length + 1);
  for (let index = 0; index < text.length; index += 1) value[index] = text.charCodeAt(index) & 0x7f;
  return { tag, type: ASCII, count: value.length, value };
};

const rationalsField = (tag: number, pairs: readonly (readonly [number, number])[]): Field => {
  const value = new Uint8Array(pairs.length * 8);
  const view = new DataView(value.buffer);
  pairs.forEach(([numerator, denominator], index) => {
    view.setUint32(index * 8, numerator);
    view.setUint32(index * 8 + 4, denominator);
  });
  return { tag, type: RATIONAL, count: pairs.length, value };
};

const longField = (tag: number, value: number): Field => {
  const bytes = new Uint8Array(4);
  new DataView(bytes.buffer).setUint32(0, value);
  return { tag, type: LONG, count: 1, value: bytes };
};

/** Steps of 1/10 000 of an arc second (about 3 mm on the ground): exact integers, no float drift. */
const SECOND_STEPS = 10_000;

/**
 * Degrees as EXIF's three rationals (degrees, minutes, seconds), from whole steps of 1/10 000″ so a
 * rounded 59.99995″ carries into the next minute instead of writing 60″.
 */
export function toDegreesMinutesSeconds(degrees: number): [[number, number], [number, number], [number, number]] {
  const steps = Math.round(Math.abs(degrees) * 3600 * SECOND_STEPS);
  const whole = Math.floor(steps / (3600 * SECOND_STEPS));
  const minutes = Math.floor((steps % (3600 * SECOND_STEPS)) / (60 * SECOND_STEPS));
  const seconds = steps % (60 * SECOND_STEPS);
  return [
    [whole, 1],
    [minutes, 1],
    [seconds, SECOND_STEPS],
  ];
}

/** The size of an IFD: count, 12-byte entries, next-IFD offset, then the values that do not fit in 4 bytes. */
function ifdSize(fields: readonly Field[]): number {
  return 2 + fields.length * 12 + 4 + fields.reduce((sum, field) => sum + (field.value.length > 4 ? field.value.length + (field.value.length % 2) : 0), 0);
}

/** Writes one IFD at `start` (offsets count from the TIFF header, TIFF 6.0 §2), entries in tag order. */
function writeIfd(view: DataView, bytes: Uint8Array, start: number, fields: readonly Field[]): void {
  const sorted = [...fields].sort((a, b) => a.tag - b.tag);
  view.setUint16(start, sorted.length);
  let valueAt = start + 2 + sorted.length * 12 + 4;
  sorted.forEach((field, index) => {
    const entry = start + 2 + index * 12;
    view.setUint16(entry, field.tag);
    view.setUint16(entry + 2, field.type);
    view.setUint32(entry + 4, field.count);
    if (field.value.length !== field.count * (TYPE_SIZE[field.type] ?? 1)) throw new Error(`EXIF tag ${field.tag}: value does not match its count`);
    if (field.value.length <= 4) {
      bytes.set(field.value, entry + 8);
    } else {
      view.setUint32(entry + 8, valueAt);
      bytes.set(field.value, valueAt);
      valueAt += field.value.length + (field.value.length % 2);
    }
  });
  view.setUint32(start + 2 + sorted.length * 12, 0);
}

/** The fields worth writing: a well-formed time and offset, a position in range (0,0 is an unset receiver). */
export function cleanMetadata(metadata: CarriedMetadata): CarriedMetadata {
  const clean: CarriedMetadata = {};
  if (metadata.takenAt !== undefined && EXIF_DATE_TIME.test(metadata.takenAt)) {
    clean.takenAt = metadata.takenAt;
    if (metadata.offset !== undefined && EXIF_OFFSET.test(metadata.offset)) clean.offset = metadata.offset;
  }
  const position = metadata.position;
  if (
    position &&
    Number.isFinite(position.lat) &&
    Number.isFinite(position.lon) &&
    Math.abs(position.lat) <= 90 &&
    Math.abs(position.lon) <= 180 &&
    !(position.lat === 0 && position.lon === 0)
  ) {
    clean.position = { lat: position.lat, lon: position.lon };
  }
  return clean;
}

/**
 * The TIFF structure of a minimal EXIF block (big-endian): IFD0 pointing to an Exif IFD with
 * ExifVersion, DateTimeOriginal (and OffsetTimeOriginal) and to a GPS IFD with GPSVersionID and the
 * latitude and longitude with their N/S, E/W references. Tags and types from Exif 2.32 (CIPA
 * DC-008-2019) §4.6.3–4.6.6; layout from TIFF 6.0 §2. `undefined` when there is nothing to carry.
 */
export function buildExifTiff(metadata: CarriedMetadata): Uint8Array | undefined {
  const { takenAt, offset, position } = cleanMetadata(metadata);
  if (takenAt === undefined && position === undefined) return undefined;

  const exifFields: Field[] | undefined =
    takenAt === undefined
      ? undefined
      : [
          { tag: 0x9000, type: UNDEFINED, count: 4, value: new Uint8Array([0x30, 0x32, 0x33, 0x32]) }, // "0232"
          asciiField(0x9003, takenAt),
          ...(offset === undefined ? [] : [asciiField(0x9011, offset)]),
        ];
  const gpsFields: Field[] | undefined =
    position === undefined
      ? undefined
      : [
          { tag: 0x0000, type: BYTE, count: 4, value: new Uint8Array([2, 3, 0, 0]) },
          asciiField(0x0001, position.lat >= 0 ? 'N' : 'S'),
          rationalsField(0x0002, toDegreesMinutesSeconds(position.lat)),
          asciiField(0x0003, position.lon >= 0 ? 'E' : 'W'),
          rationalsField(0x0004, toDegreesMinutesSeconds(position.lon)),
        ];

  // IFD0 holds only the two pointers; their values are known once the sizes before them are.
  const ifd0Count = (exifFields ? 1 : 0) + (gpsFields ? 1 : 0);
  const ifd0At = 8;
  const exifAt = ifd0At + 2 + ifd0Count * 12 + 4;
  const gpsAt = exifAt + (exifFields ? ifdSize(exifFields) : 0);
  const ifd0Fields = [...(exifFields ? [longField(0x8769, exifAt)] : []), ...(gpsFields ? [longField(0x8825, gpsAt)] : [])];
  const total = gpsAt + (gpsFields ? ifdSize(gpsFields) : 0);

  const bytes = new Uint8Array(total);
  const view = new DataView(bytes.buffer);
  bytes.set([0x4d, 0x4d, 0x00, 0x2a]); // "MM", 42
  view.setUint32(4, ifd0At);
  writeIfd(view, bytes, ifd0At, ifd0Fields);
  if (exifFields) writeIfd(view, bytes, exifAt, exifFields);
  if (gpsFields) writeIfd(view, bytes, gpsAt, gpsFields);
  return bytes;
}

const EXIF_HEADER = [0x45, 0x78, 0x69, 0x66, 0x00, 0x00]; // "Exif\0\0"

function isExifApp1(jpeg: Uint8Array, at: number): boolean {
  return jpeg[at + 1] === 0xe1 && EXIF_HEADER.every((byte, index) => jpeg[at + 4 + index] === byte);
}

/**
 * `jpeg` with an APP1 EXIF segment holding `metadata`, placed after SOI and a leading JFIF APP0
 * (JPEG, ITU T.81 Annex B; Exif 2.32 §4.5.4), and any EXIF segment it had before removed. Returns
 * `jpeg` unchanged when there is nothing to carry. Throws when `jpeg` is not a JPEG.
 */
export function withExif(jpeg: Uint8Array, metadata: CarriedMetadata): Uint8Array {
  if (jpeg[0] !== 0xff || jpeg[1] !== 0xd8) throw new Error('not a JPEG');
  const tiff = buildExifTiff(metadata);
  if (!tiff) return jpeg;
  const segmentLength = 2 + EXIF_HEADER.length + tiff.length;
  if (segmentLength > 0xffff) throw new Error('EXIF block too large for one segment');
  const segment = new Uint8Array(2 + segmentLength);
  segment.set([0xff, 0xe1, segmentLength >> 8, segmentLength & 0xff, ...EXIF_HEADER]);
  segment.set(tiff, 2 + 2 + EXIF_HEADER.length);

  // Walk the header segments up to the start of scan: keep all but an old EXIF, note where APP0 ends.
  const kept: Uint8Array[] = [jpeg.subarray(0, 2)];
  let insertAfter = 1;
  let at = 2;
  while (at + 4 <= jpeg.length && jpeg[at] === 0xff) {
    const marker = jpeg[at + 1]!;
    if (marker === 0xda || marker === 0xd9) break; // Start of scan or end of image: the rest is data.
    const length = (jpeg[at + 2]! << 8) | jpeg[at + 3]!;
    const isOldExif = isExifApp1(jpeg, at);
    if (!isOldExif) {
      kept.push(jpeg.subarray(at, at + 2 + length));
      if (marker === 0xe0 && kept.length === 2) insertAfter = 2;
    }
    at += 2 + length;
  }
  const parts = [...kept.slice(0, insertAfter), segment, ...kept.slice(insertAfter), jpeg.subarray(at)];
  const out = new Uint8Array(parts.reduce((sum, part) => sum + part.length, 0));
  let offset = 0;
  for (const part of parts) {
    out.set(part, offset);
    offset += part.length;
  }
  return out;
}
