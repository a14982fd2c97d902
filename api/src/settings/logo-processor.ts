import { HttpException, HttpStatus, Injectable, Logger, UnsupportedMediaTypeException } from '@nestjs/common';
import { ConfigService } from '@nestjs/config';
import sharp, { type Metadata } from 'sharp';

import type { Env } from '../config/env.schema.js';
import { LOGO_MAX_SIDE_PX } from '../domain/company/company-profile.schema.js';
import { sniffImageType } from '../domain/photos/photo-rules.js';

const ACCEPTED = 'Send the logo as a PNG, JPEG or WebP image.';

/** 415 naming the multipart field `file`. */
export function logoUnsupported(message: string, code: string): UnsupportedMediaTypeException {
  return new UnsupportedMediaTypeException({ message: `file: ${message}`, code, issues: [{ path: 'file', message }] });
}

/** 413 naming the multipart field `file`. */
export function logoTooLarge(message: string, code: string): HttpException {
  return new HttpException({ message: `file: ${message}`, code, issues: [{ path: 'file', message }] }, HttpStatus.PAYLOAD_TOO_LARGE);
}

export interface ProcessedLogo {
  body: Buffer;
  width: number;
  height: number;
}

/**
 * Turns an uploaded logo into the one stored form: a PNG (transparency kept), upright, without metadata,
 * longest side at most LOGO_MAX_SIDE_PX. The type comes from the bytes (the site-plan image's sniffing
 * helper); SVG and anything else is refused with 415, and the header is read before decoding so that a
 * decompression bomb is refused with 413.
 */
@Injectable()
export class LogoProcessor {
  private readonly logger = new Logger(LogoProcessor.name);
  private readonly maxInputPixels: number;

  constructor(config: ConfigService<Env, true>) {
    this.maxInputPixels = config.get('UPLOAD_MAX_INPUT_PIXELS', { infer: true });
  }

  async process(bytes: Buffer): Promise<ProcessedLogo> {
    const type = sniffImageType(bytes);
    if (type === undefined || type === 'heic' || type === 'avif') {
      throw logoUnsupported(`this is not a PNG, JPEG or WebP image. ${ACCEPTED}`, 'UNSUPPORTED_IMAGE_TYPE');
    }
    let metadata: Metadata;
    try {
      metadata = await sharp(bytes, { limitInputPixels: false, failOn: 'error' }).metadata();
    } catch {
      throw logoUnsupported(`the image could not be read. ${ACCEPTED}`, 'UNREADABLE_IMAGE');
    }
    const pixels = (metadata.width ?? 0) * (metadata.height ?? 0);
    if (pixels > this.maxInputPixels) {
      throw logoTooLarge(
        `the image is ${metadata.width}×${metadata.height} pixels; at most ${(this.maxInputPixels / 1e6).toFixed(0)} megapixels are accepted.`,
        'IMAGE_TOO_MANY_PIXELS',
      );
    }
    try {
      const { data, info } = await sharp(bytes, { limitInputPixels: this.maxInputPixels, failOn: 'error' })
        .rotate()
        .resize(LOGO_MAX_SIDE_PX, LOGO_MAX_SIDE_PX, { fit: 'inside', withoutEnlargement: true })
        .toColourspace('srgb')
        .png({ compressionLevel: 9 })
        .toBuffer({ resolveWithObject: true });
      return { body: data, width: info.width, height: info.height };
    } catch (error) {
      this.logger.warn(`decoding a logo failed: ${(error as Error).message}`);
      throw logoUnsupported(`the image could not be decoded. ${ACCEPTED}`, 'UNREADABLE_IMAGE');
    }
  }
}
