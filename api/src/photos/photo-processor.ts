import { Injectable, Logger } from '@nestjs/common';
import { ConfigService } from '@nestjs/config';
import exifr from 'exifr';
import sharp, { type Metadata, type OutputInfo, type Sharp } from 'sharp';

import { type ImageLimits, imageLimitProblem, imageLimitsOf } from '../common/image-limits.js';
import { ImageWorkQueue } from '../common/image-work.js';
import type { Env } from '../config/env.schema.js';
import {
  DERIVATIVE_SIZES,
  EXIF_READ_OPTIONS,
  IMAGE_CONTENT_TYPES,
  IMAGE_EXTENSIONS,
  parseExifDateTime,
  type SniffedImageType,
  sniffImageType,
  validGpsPosition,
} from '../domain/photos/photo-rules.js';
import type { PhotoDerivativeVariant } from '../domain/photos/photo.schema.js';
import { heicNotSupported, imageRefused, unreadableImage, unsupportedImage } from './photo-errors.js';

export interface ProcessedDerivative {
  variant: PhotoDerivativeVariant;
  body: Buffer;
  width: number;
  height: number;
  contentType: string;
  extension: string;
}

export interface ProcessedPhoto {
  type: SniffedImageType;
  contentType: string;
  extension: string;
  /** Upright size of the original (EXIF orientation applied). */
  width: number;
  height: number;
  exifTakenAt: string | undefined;
  location: { lat: number; lon: number } | undefined;
  derivatives: ProcessedDerivative[];
}

/** A file whose header passed the checks: its sniffed type and its header's metadata. */
export interface InspectedImage {
  type: SniffedImageType;
  metadata: Metadata;
}

/**
 * True when libvips here decodes HEVC-coded HEIF (phones' high-efficiency photos). The prebuilt sharp binaries ship
 * libheif with the AV1 decoder only (AVIF), for patent reasons, and then list just `.avif`.
 */
export function canDecodeHeic(): boolean {
  const heif = sharp.format.heif as { input?: { buffer?: boolean; fileSuffix?: string[] } } | undefined;
  return Boolean(heif?.input?.buffer && heif.input.fileSuffix?.includes('.heic'));
}

/**
 * Turns an uploaded file into the photo's derivatives. One file at a time, one libvips thread, no
 * operation cache: the API's resident memory then grows by roughly one decoded print-sized image
 * (2400 px, ~17 MB) plus the encoders, not by the 12 MP originals (JPEG shrink-on-load decodes at 1/2).
 *
 * The header is checked first (type, area, longest side, aspect ratio: image-limits.ts), so a hostile
 * file is refused in milliseconds without waiting; the decoding then waits its turn in the process's
 * ImageWorkQueue. Every step after the first resize works on at most the print size, and nothing is
 * enlarged, so the cost is bounded by the output (issue 18 §1: a 1×2400 PNG was scaled up to ~245 MP
 * to crop its thumbnail).
 */
@Injectable()
export class PhotoProcessor {
  private readonly logger = new Logger(PhotoProcessor.name);
  private readonly maxInputPixels: number;
  private readonly limits: ImageLimits;
  readonly isHeicDecodable: boolean;

  constructor(
    config: ConfigService<Env, true>,
    private readonly queue: ImageWorkQueue,
  ) {
    this.maxInputPixels = config.get('UPLOAD_MAX_INPUT_PIXELS', { infer: true });
    this.limits = imageLimitsOf(config);
    sharp.concurrency(1);
    sharp.cache(false);
    this.isHeicDecodable = canDecodeHeic();
  }

  /** `label` names the file in error messages (e.g. `files[2] "IMG_0042.JPG"`). */
  async process(bytes: Buffer, label: string, inspected?: InspectedImage): Promise<ProcessedPhoto> {
    const { type, metadata } = inspected ?? (await this.inspect(bytes, label));
    return this.queue.run(() => this.derive(bytes, label, type, metadata));
  }

  /**
   * The checks that need only the file's header: its type from the bytes, then the image limits.
   * Milliseconds per file and no queue, so a hostile file is refused at once (415, 413 or 422).
   */
  async inspect(bytes: Buffer, label: string): Promise<InspectedImage> {
    const type = sniffImageType(bytes);
    if (type === 'heic' && !this.isHeicDecodable) throw heicNotSupported(label);
    if (type === undefined || type === 'avif') throw unsupportedImage(label);

    let metadata: Metadata;
    try {
      // The header alone, without the pixel limit, so that a bomb is reported as too large (413).
      metadata = await sharp(bytes, { limitInputPixels: false, failOn: 'error' }).metadata();
    } catch {
      throw unreadableImage(label);
    }
    const problem = imageLimitProblem(metadata.width ?? 0, metadata.height ?? 0, this.limits);
    if (problem) throw imageRefused(problem.status, `${label} ${problem.message}`, problem.code);
    return { type, metadata };
  }

  private async derive(bytes: Buffer, label: string, type: SniffedImageType, metadata: Metadata): Promise<ProcessedPhoto> {
    const options = { limitInputPixels: this.maxInputPixels, failOn: 'error' as const };
    // Decode once: upright, sRGB, at most print size. Every derivative is encoded from this raw image.
    let base: { data: Buffer; info: OutputInfo };
    try {
      base = await sharp(bytes, options)
        .rotate()
        .resize(DERIVATIVE_SIZES.print.width, DERIVATIVE_SIZES.print.height, { fit: 'inside', withoutEnlargement: true })
        .toColourspace('srgb')
        .raw()
        .toBuffer({ resolveWithObject: true });
    } catch (error) {
      this.logger.warn(`decoding ${label} failed: ${(error as Error).message}`);
      throw unreadableImage(label);
    }
    const raw = { raw: { width: base.info.width, height: base.info.height, channels: base.info.channels } } as const;
    const derivatives: ProcessedDerivative[] = [];
    const encode = async (
      variant: PhotoDerivativeVariant,
      pipeline: Sharp,
      contentType: string,
      extension: string,
    ): Promise<void> => {
      // No withMetadata()/keepExif(): sharp writes no EXIF, XMP, GPS or ICC profile (sRGB is assumed).
      const { data, info } = await pipeline.toBuffer({ resolveWithObject: true });
      derivatives.push({ variant, body: data, width: info.width, height: info.height, contentType, extension });
    };
    await encode('print', sharp(base.data, raw).flatten({ background: '#ffffff' }).jpeg({ quality: 85, mozjpeg: false }), 'image/jpeg', 'jpg');
    await encode(
      'screen',
      sharp(base.data, raw).resize(DERIVATIVE_SIZES.screen.width, DERIVATIVE_SIZES.screen.height, { fit: 'inside', withoutEnlargement: true }).webp({ quality: 80 }),
      'image/webp',
      'webp',
    );
    await encode(
      'thumb',
      // Cover-fit without enlargement: the crop is chosen on an image whose short side is at most the
      // thumbnail's and whose long side is at most UPLOAD_MAX_ASPECT_RATIO times that (≤ 320 × 3200).
      sharp(base.data, raw)
        .resize(DERIVATIVE_SIZES.thumb.width, DERIVATIVE_SIZES.thumb.height, { fit: 'cover', position: 'attention', withoutEnlargement: true })
        .webp({ quality: 75 }),
      'image/webp',
      'webp',
    );

    const { width, height } = metadata.autoOrient ?? { width: metadata.width ?? 0, height: metadata.height ?? 0 };
    return {
      type,
      contentType: IMAGE_CONTENT_TYPES[type],
      extension: IMAGE_EXTENSIONS[type],
      width,
      height,
      ...(await this.readExif(bytes, label)),
      derivatives,
    };
  }

  private async readExif(bytes: Buffer, label: string): Promise<Pick<ProcessedPhoto, 'exifTakenAt' | 'location'>> {
    try {
      const exif = (await exifr.parse(bytes, EXIF_READ_OPTIONS)) as Record<string, unknown> | undefined;
      if (!exif) return { exifTakenAt: undefined, location: undefined };
      return {
        exifTakenAt: parseExifDateTime(exif.DateTimeOriginal) ?? parseExifDateTime(exif.CreateDate),
        location: validGpsPosition(exif.latitude, exif.longitude),
      };
    } catch (error) {
      // A photo with broken EXIF is still evidence: keep it, without time and position from the file.
      this.logger.warn(`reading EXIF of ${label} failed: ${(error as Error).message}`);
      return { exifTakenAt: undefined, location: undefined };
    }
  }
}
