import { describe, expect, it, vi } from 'vitest';

import { readFixture } from '../../../testing/read-fixture';

import { cannotConvertMessage, isHeicFile, jpegNameFor, preparePhotos, type HeicConverter } from './heic-conversion';
import { readCarriedMetadata } from './heic-metadata';
import { withExif } from './jpeg-exif';

/** A real HEIC (HEVC in HEIF) with EXIF time and GPS, made with heif-enc: test/fixtures/photos/README.md. */
const HEIC = await readFixture('photos/field-photo.heic');
/** The start of a JPEG: SOI, then a JFIF APP0 and end of image (enough for the sniffing and the EXIF writer). */
const JPEG = new Uint8Array([0xff, 0xd8, 0xff, 0xe0, 0x00, 0x10, 0x4a, 0x46, 0x49, 0x46, 0x00, 0x01, 0x01, 0x00, 0x00, 0x01, 0x00, 0x01, 0x00, 0x00, 0xff, 0xd9]);

const heicFile = (name = 'IMG_0042.HEIC', type = 'image/heic') => new File([HEIC], name, { type });
const jpegFile = (name = 'trench.jpg') => new File([JPEG], name, { type: 'image/jpeg' });

/** A converter that does what the worker does after decoding: the HEIC's metadata written into a JPEG. */
function fakeConverter(): HeicConverter & { converted: string[]; isClosed: boolean } {
  const fake = {
    converted: [] as string[],
    isClosed: false,
    async convert(file: File) {
      fake.converted.push(file.name);
      const metadata = await readCarriedMetadata(new Uint8Array(await file.arrayBuffer()));
      return new File([new Uint8Array(withExif(JPEG, metadata))], jpegNameFor(file.name), { type: 'image/jpeg' });
    },
    close() {
      fake.isClosed = true;
    },
  };
  return fake;
}

describe('isHeicFile', () => {
  it('should know HEIC by its content, whatever the file is called or claims to be', async () => {
    expect(await isHeicFile(heicFile('photo.jpg', 'image/jpeg'))).toBe(true);
    expect(await isHeicFile(heicFile('IMG_0042.HEIC', ''))).toBe(true);
    expect(await isHeicFile(jpegFile('IMG_0042.HEIC'))).toBe(false);
    expect(await isHeicFile(new File(['not a photo'], 'notes.heic'))).toBe(false);
  });
});

describe('jpegNameFor', () => {
  it.each([
    ['IMG_0042.HEIC', 'IMG_0042.jpg'],
    ['trench.heif', 'trench.jpg'],
    ['from-camera.hif', 'from-camera.jpg'],
    ['shared', 'shared.jpg'],
    ['.heic', 'photo.jpg'],
  ])('should name %s as %s', (name, expected) => {
    expect(jpegNameFor(name)).toBe(expected);
  });
});

describe('readCarriedMetadata', () => {
  it('should read the capture time and position from a real HEIC', async () => {
    const metadata = await readCarriedMetadata(HEIC);
    expect(metadata.takenAt).toBe('2024:05:01 10:11:12');
    expect(metadata.position?.lat).toBeCloseTo(40.0003, 8);
    expect(metadata.position?.lon).toBeCloseTo(-105.0004, 8);
  });

  it('should give nothing for a file without EXIF rather than fail', async () => {
    expect(await readCarriedMetadata(JPEG)).toEqual({});
    expect(await readCarriedMetadata(new TextEncoder().encode('not an image'))).toEqual({});
  });
});

describe('preparePhotos', () => {
  it('should send JPEG, PNG and WebP as they are and not start a converter', async () => {
    const createConverter = vi.fn(fakeConverter);
    const onConverting = vi.fn();
    const files = [jpegFile(), new File(['…'], 'plan.png', { type: 'image/png' })];

    const sut = await preparePhotos(files, { createConverter, isSupported: () => true, onConverting });

    expect(sut).toEqual({ files, problems: [] });
    expect(sut.files[0]).toBe(files[0]);
    expect(createConverter).not.toHaveBeenCalled();
    expect(onConverting).toHaveBeenCalledWith(0);
  });

  it('should turn a HEIC into a JPEG named after it, keeping when and where it was taken, in the order picked', async () => {
    const converter = fakeConverter();
    const onConverting = vi.fn();

    const sut = await preparePhotos([jpegFile('first.jpg'), heicFile('IMG_0042.HEIC'), jpegFile('last.jpg')], {
      createConverter: () => converter,
      isSupported: () => true,
      onConverting,
    });

    expect(sut.problems).toEqual([]);
    expect(sut.files.map((file) => [file.name, file.type])).toEqual([
      ['first.jpg', 'image/jpeg'],
      ['IMG_0042.jpg', 'image/jpeg'],
      ['last.jpg', 'image/jpeg'],
    ]);
    expect(onConverting).toHaveBeenCalledWith(1);
    expect(converter.converted).toEqual(['IMG_0042.HEIC']);
    expect(converter.isClosed).toBe(true);
    const carried = await readCarriedMetadata(new Uint8Array(await sut.files[1]!.arrayBuffer()));
    expect(carried.takenAt).toBe('2024:05:01 10:11:12');
    expect(carried.position?.lat).toBeCloseTo(40.0003, 8);
    expect(carried.position?.lon).toBeCloseTo(-105.0004, 8);
  });

  it('should leave out a HEIC the converter fails on, with a plain reason, and still send the others', async () => {
    const converter = fakeConverter();
    converter.convert = () => Promise.reject(new Error('the image could not be decoded'));

    const sut = await preparePhotos([heicFile('IMG_0001.HEIC'), jpegFile('trench.jpg')], { createConverter: () => converter, isSupported: () => true });

    expect(sut.files.map((file) => file.name)).toEqual(['trench.jpg']);
    expect(sut.problems).toEqual([cannotConvertMessage('IMG_0001.HEIC')]);
    expect(sut.problems[0]).toMatch(/^IMG_0001\.HEIC is a HEIC photo that this browser could not turn into a JPEG\. .*most compatible format \(JPEG\)/);
    expect(converter.isClosed).toBe(true);
  });

  it('should say so for every HEIC when this browser cannot run the converter at all', async () => {
    const createConverter = vi.fn(fakeConverter);

    const sut = await preparePhotos([heicFile('a.heic'), heicFile('b.heic'), jpegFile()], { createConverter, isSupported: () => false });

    expect(sut.files.map((file) => file.name)).toEqual(['trench.jpg']);
    expect(sut.problems).toEqual([cannotConvertMessage('a.heic'), cannotConvertMessage('b.heic')]);
    expect(createConverter).not.toHaveBeenCalled();
  });
});
