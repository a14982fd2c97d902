/**
 * The EXIF of a HEIF/HEIC file, found through its item boxes (ISO/IEC 14496-12 §8.11: `meta` →
 * `iinf`/`infe` names the `Exif` item, `iloc` says where its bytes are), returned as the TIFF structure
 * an EXIF reader takes. Written here because readers that look for the item themselves drop the
 * `base_offset` of `iloc`, which libheif's encoder uses, and then read the wrong bytes.
 */

type Box = { type: string; start: number; end: number };

class Reader {
  constructor(private readonly bytes: Uint8Array) {}

  get length(): number {
    return this.bytes.length;
  }

  uint(at: number, size: number): number {
    if (size === 0) return 0;
    if (at < 0 || at + size > this.bytes.length) throw new RangeError('truncated HEIF box');
    let value = 0;
    // Multiplication, not shifts: 8-byte offsets would overflow 32-bit bit operations.
    for (let index = 0; index < size; index += 1) value = value * 256 + this.bytes[at + index]!;
    return value;
  }

  text(at: number, size: number): string {
    let text = '';
    for (let index = 0; index < size; index += 1) text += String.fromCharCode(this.uint(at + index, 1));
    return text;
  }
}

/** The boxes between `start` and `end` (ISO/IEC 14496-12 §4.2: 32-bit size, 64-bit `largesize`, 0 = to the end). */
function boxesIn(reader: Reader, start: number, end: number): Box[] {
  const found: Box[] = [];
  let at = start;
  while (at + 8 <= end) {
    let size = reader.uint(at, 4);
    const type = reader.text(at + 4, 4);
    let header = 8;
    if (size === 1) {
      size = reader.uint(at + 8, 8);
      header = 16;
    } else if (size === 0) {
      size = end - at;
    }
    if (size < header || at + size > end) break;
    found.push({ type, start: at + header, end: at + size });
    at += size;
  }
  return found;
}

/** The item id of the first `infe` of type `Exif` (ISO/IEC 14496-12 §8.11.6, versions 2 and 3). */
function exifItemId(reader: Reader, iinf: Box): number | undefined {
  const version = reader.uint(iinf.start, 1);
  const entriesAt = iinf.start + 4 + (version === 0 ? 2 : 4);
  for (const infe of boxesIn(reader, entriesAt, iinf.end)) {
    if (infe.type !== 'infe') continue;
    const infeVersion = reader.uint(infe.start, 1);
    if (infeVersion < 2) continue;
    const idSize = infeVersion === 2 ? 2 : 4;
    const id = reader.uint(infe.start + 4, idSize);
    if (reader.text(infe.start + 4 + idSize + 2, 4) === 'Exif') return id;
  }
  return undefined;
}

/** Where item `itemId` lies: its extents as [offset, length] in the file (ISO/IEC 14496-12 §8.11.3). */
function itemExtents(reader: Reader, iloc: Box, itemId: number, idat: Box | undefined): [number, number][] | undefined {
  const version = reader.uint(iloc.start, 1);
  let at = iloc.start + 4;
  const sizes = reader.uint(at, 1);
  const moreSizes = reader.uint(at + 1, 1);
  at += 2;
  const offsetSize = sizes >> 4;
  const lengthSize = sizes & 0x0f;
  const baseOffsetSize = moreSizes >> 4;
  const hasMethod = version === 1 || version === 2;
  const indexSize = hasMethod ? moreSizes & 0x0f : 0;
  const itemCountSize = version < 2 ? 2 : 4;
  let count = reader.uint(at, itemCountSize);
  at += itemCountSize;
  while (count-- > 0) {
    const id = reader.uint(at, version < 2 ? 2 : 4);
    at += version < 2 ? 2 : 4;
    const method = hasMethod ? reader.uint(at, 2) & 0x0f : 0;
    if (hasMethod) at += 2;
    at += 2; // data_reference_index
    const baseOffset = reader.uint(at, baseOffsetSize);
    at += baseOffsetSize;
    const extentCount = reader.uint(at, 2);
    at += 2;
    const extents: [number, number][] = [];
    for (let extent = 0; extent < extentCount; extent += 1) {
      at += indexSize;
      const offset = reader.uint(at, offsetSize);
      const length = reader.uint(at + offsetSize, lengthSize);
      at += offsetSize + lengthSize;
      extents.push([baseOffset + offset, length]);
    }
    if (id !== itemId) continue;
    // Method 0: offsets in the file; 1: in the `idat` box's payload; 2 (item references) is not used for EXIF.
    if (method === 1) {
      if (!idat) return undefined;
      return extents.map(([offset, length]) => [idat.start + offset, length === 0 ? idat.end - idat.start - offset : length]);
    }
    if (method !== 0) return undefined;
    return extents.map(([offset, length]) => [offset, length === 0 ? reader.length - offset : length]);
  }
  return undefined;
}

const isTiffHeader = (bytes: Uint8Array, at: number) =>
  (bytes[at] === 0x49 && bytes[at + 1] === 0x49 && bytes[at + 2] === 0x2a && bytes[at + 3] === 0x00) ||
  (bytes[at] === 0x4d && bytes[at + 1] === 0x4d && bytes[at + 2] === 0x00 && bytes[at + 3] === 0x2a);

/**
 * The TIFF bytes (`II*\0` or `MM\0*` onwards) of the EXIF item of a HEIF file, or `undefined` when it
 * has none or the boxes do not make sense. The item's payload is a 32-bit offset to the TIFF header
 * counted after that field, then the EXIF (HEIF, ISO/IEC 23008-12 Annex A.2.1); phones put `Exif\0\0`
 * in between (offset 6), libheif nothing (offset 0).
 */
export function extractHeifExif(bytes: Uint8Array): Uint8Array | undefined {
  try {
    const reader = new Reader(bytes);
    const meta = boxesIn(reader, 0, bytes.length).find((box) => box.type === 'meta');
    if (!meta) return undefined;
    const children = boxesIn(reader, meta.start + 4, meta.end);
    const iinf = children.find((box) => box.type === 'iinf');
    const iloc = children.find((box) => box.type === 'iloc');
    if (!iinf || !iloc) return undefined;
    const id = exifItemId(reader, iinf);
    if (id === undefined) return undefined;
    const extents = itemExtents(reader, iloc, id, children.find((box) => box.type === 'idat'));
    if (!extents || extents.length === 0) return undefined;
    const total = extents.reduce((sum, [, length]) => sum + length, 0);
    if (extents.some(([offset, length]) => offset + length > bytes.length) || total < 8) return undefined;
    const item = new Uint8Array(total);
    let written = 0;
    for (const [offset, length] of extents) {
      item.set(bytes.subarray(offset, offset + length), written);
      written += length;
    }
    const tiffAt = 4 + new Reader(item).uint(0, 4);
    return tiffAt + 8 <= item.length && isTiffHeader(item, tiffAt) ? item.subarray(tiffAt) : undefined;
  } catch {
    return undefined;
  }
}
