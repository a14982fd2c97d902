import { HttpException, HttpStatus, UnsupportedMediaTypeException } from '@nestjs/common';

import { NotFoundError, ValidationError } from '../domain/errors.js';

export function photoNotFound(): NotFoundError {
  return new NotFoundError('PHOTO_NOT_FOUND', 'No such photo.');
}

const ACCEPTED = 'Send photos as JPEG, PNG or WebP.';

/** 415 for bytes that are not an accepted image, whatever the file is called or claims to be. */
export function unsupportedImage(label: string): UnsupportedMediaTypeException {
  return new UnsupportedMediaTypeException({ message: `${label} is not a JPEG, PNG or WebP image. ${ACCEPTED}`, code: 'UNSUPPORTED_IMAGE_TYPE' });
}

/** 415 for HEIC when this server's image library cannot decode it (the prebuilt libvips has no HEVC). */
export function heicNotSupported(label: string): UnsupportedMediaTypeException {
  return new UnsupportedMediaTypeException({
    message:
      `${label} is a HEIC photo, which this server cannot read. Send JPEG instead: set the phone's camera to its ` +
      'most compatible format (JPEG) rather than high efficiency, or share the photo as JPEG.',
    code: 'HEIC_NOT_SUPPORTED',
  });
}

export function unreadableImage(label: string): UnsupportedMediaTypeException {
  return new UnsupportedMediaTypeException({ message: `${label} looks like an image but could not be decoded. ${ACCEPTED}`, code: 'UNREADABLE_IMAGE' });
}

/** 413 (too big) or 422 (a shape no photo has) naming the image limit that was broken and its setting. */
export function imageRefused(status: 413 | 422, message: string, code: string): HttpException {
  return new HttpException({ message, code }, status);
}

/** 413 naming the limit that was exceeded, so the client can say what to do. */
export function uploadTooLarge(message: string, code: string): HttpException {
  return new HttpException({ message, code }, HttpStatus.PAYLOAD_TOO_LARGE);
}

export function badUpload(message: string, path: string): ValidationError {
  return new ValidationError([{ path, message }]);
}
