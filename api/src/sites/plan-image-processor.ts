import { HttpException, HttpStatus, Injectable, Logger, UnsupportedMediaTypeException } from '@nestjs/common';
import { ConfigService } from '@nestjs/config';
import sharp, { type Metadata } from 'sharp';

import { type ImageLimits, imageLimitProblem, imageLimitsOf } from '../common/image-limits.js';
import { ImageWorkQueue } from '../common/image-work.js';
import type { Env } from '../config/env.schema.js';
import { sniffImageType } from '../domain/photos/photo-rules.js';
import { PLAN_IMAGE_MAX_SIDE_PX, PLAN_IMAGE_SCREEN_SIDE_PX } from '../domain/sites/site.schema.js';

const ACCEPTED = 'Send the site plan as a JPEG, PNG or WebP image (a scan, a photo of the drawing, or an export).';

/** 415 naming the multipart field, for bytes that are not an image we read (whatever the name claims). */
export function planImageUnsupported(message: string, code: string): UnsupportedMediaTypeException {
  return new UnsupportedMediaTypeException({ message: `file: ${message}`, code, issues: [{ path: 'file', message }] });
}

/** 413 (or 422 for a shape no plan has) naming the field and the limit. */
export function planImageTooLarge(message: string, code: string, status: 413 | 422 = HttpStatus.PAYLOAD_TOO_LARGE): HttpException {
  return new HttpException({ message: `file: ${message}`, code, issues: [{ path: 'file', message }] }, status);
}

export interface ProcessedPlanImage {
  /** The stored copy: upright, no metadata, longest side ≤ 4000 px; PNG stays PNG, anything else is JPEG. */
  image: { body: Buffer; width: number; height: number; contentType: 'image/png' | 'image/jpeg'; extension: 'png' | 'jpg' };
  /** The copy drawings embed as a data: URL: same picture, longest side ≤ 2000 px, JPEG on white. */
  screen: { body: Buffer; width: number; height: number; contentType: 'image/jpeg'; extension: 'jpg' };
}

/**
 * Turns an uploaded site plan into the two stored copies. The calibration points the office picks are
 * in the stored copy's pixels, so its size is what the site records. Like photos, the type comes from
 * the bytes, the header is read first so that a decompression bomb is refused (413) before decoding,
 * and no EXIF/XMP/GPS survives (sharp writes none unless asked). The header must also pass the
 * longest-side and aspect-ratio limits photos have (image-limits.ts), and the decoding waits its turn
 * in the process's ImageWorkQueue with the photos.
 */
@Injectable()
export class PlanImageProcessor {
  private readonly logger = new Logger(PlanImageProcessor.name);
  private readonly maxInputPixels: number;
  private readonly limits: ImageLimits;

  constructor(
    config: ConfigService<Env, true>,
    private readonly queue: ImageWorkQueue,
  ) {
    this.maxInputPixels = config.get('UPLOAD_MAX_INPUT_PIXELS', { infer: true });
    this.limits = imageLimitsOf(config);
  }

  async process(bytes: Buffer): Promise<ProcessedPlanImage> {
    const type = sniffImageType(bytes);
    if (type === 'heic') {
      throw planImageUnsupported(`this is a HEIC image, which this server does not read. ${ACCEPTED}`, 'HEIC_NOT_SUPPORTED');
    }
    if (type === undefined || type === 'avif') throw planImageUnsupported(`this is not a JPEG, PNG or WebP image. ${ACCEPTED}`, 'UNSUPPORTED_IMAGE_TYPE');

    let metadata: Metadata;
    try {
      // The header alone, without the pixel limit, so that a bomb is reported as too large (413).
      metadata = await sharp(bytes, { limitInputPixels: false, failOn: 'error' }).metadata();
    } catch {
      throw planImageUnsupported(`the image could not be read. ${ACCEPTED}`, 'UNREADABLE_IMAGE');
    }
    const problem = imageLimitProblem(metadata.width ?? 0, metadata.height ?? 0, this.limits);
    if (problem) throw planImageTooLarge(`the image ${problem.message}`, problem.code, problem.status);

    return this.queue.run(() => this.derive(bytes, type === 'png'));
  }

  private async derive(bytes: Buffer, isPng: boolean): Promise<ProcessedPlanImage> {
    const options = { limitInputPixels: this.maxInputPixels, failOn: 'error' as const };
    try {
      const upright = sharp(bytes, options)
        .rotate()
        .resize(PLAN_IMAGE_MAX_SIDE_PX, PLAN_IMAGE_MAX_SIDE_PX, { fit: 'inside', withoutEnlargement: true })
        .toColourspace('srgb');
      const stored = isPng
        ? await upright.png({ compressionLevel: 9 }).toBuffer({ resolveWithObject: true })
        : await upright.flatten({ background: '#ffffff' }).jpeg({ quality: 88 }).toBuffer({ resolveWithObject: true });
      const screen = await sharp(stored.data, options)
        .resize(PLAN_IMAGE_SCREEN_SIDE_PX, PLAN_IMAGE_SCREEN_SIDE_PX, { fit: 'inside', withoutEnlargement: true })
        .flatten({ background: '#ffffff' })
        .jpeg({ quality: 80 })
        .toBuffer({ resolveWithObject: true });
      return {
        image: {
          body: stored.data,
          width: stored.info.width,
          height: stored.info.height,
          contentType: isPng ? 'image/png' : 'image/jpeg',
          extension: isPng ? 'png' : 'jpg',
        },
        screen: { body: screen.data, width: screen.info.width, height: screen.info.height, contentType: 'image/jpeg', extension: 'jpg' },
      };
    } catch (error) {
      this.logger.warn(`decoding a site plan failed: ${(error as Error).message}`);
      throw planImageUnsupported(`the image could not be decoded. ${ACCEPTED}`, 'UNREADABLE_IMAGE');
    }
  }
}
