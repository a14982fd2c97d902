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

/**
 * 415 for HEIC when this server's image library cannot decode it (the prebuilt libvips has no HEVC).
 * The web app converts HEIC to JPEG on the device before sending (issue 17), so this answer reaches
 * other clients; `issues` names the multipart field (`files[0]`) as a validation answer does.
 */
export function heicNotSupported(label: string): UnsupportedMediaTypeException {
  const message =
    `${label} is a HEIC photo, which this server cannot read. The Loamline app turns HEIC into JPEG before sending; ` +
    "from anywhere else send JPEG: set the phone's camera to its most compatible format (JPEG) rather than high " +
    'efficiency, or share the photo as JPEG.';
  const path = /^files\[\d+\]/.exec(label)?.[0] ?? 'files';
  return new UnsupportedMediaTypeException({ message, code: 'HEIC_NOT_SUPPORTED', issues: [{ path, message: 'is HEIC; send JPEG, PNG or WebP' }] });
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
