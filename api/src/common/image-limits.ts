import type { ConfigService } from '@nestjs/config';

import type { Env } from '../config/env.schema.js';

/**
 * What an uploaded image may be, read from its header before anything is decoded. The area limit
 * stops decompression bombs; the side and aspect-ratio limits stop the thin ones (1 × 20,000,000
 * pixels is only 20 MP, yet resizing it costs seconds). Photos and site plans share them.
 */
export interface ImageLimits {
  /** UPLOAD_MAX_INPUT_PIXELS */
  maxPixels: number;
  /** UPLOAD_MAX_IMAGE_SIDE_PX */
  maxSidePx: number;
  /** UPLOAD_MAX_ASPECT_RATIO: long side over short side. */
  maxAspectRatio: number;
}

export interface ImageLimitProblem {
  /** 413 for "too big" (area, side), 422 for a shape no photo or plan has. */
  status: 413 | 422;
  code: 'IMAGE_TOO_MANY_PIXELS' | 'IMAGE_SIDE_TOO_LONG' | 'IMAGE_TOO_ELONGATED';
  /** Names the size, the limit and its setting; the caller puts the file's name in front. */
  message: string;
}

export function imageLimitsOf(config: ConfigService<Env, true>): ImageLimits {
  return {
    maxPixels: config.get('UPLOAD_MAX_INPUT_PIXELS', { infer: true }),
    maxSidePx: config.get('UPLOAD_MAX_IMAGE_SIDE_PX', { infer: true }),
    maxAspectRatio: config.get('UPLOAD_MAX_ASPECT_RATIO', { infer: true }),
  };
}

const plain = (n: number) => n.toLocaleString('en-US');

/** The first limit a `width` × `height` image breaks, or undefined when it is acceptable. */
export function imageLimitProblem(width: number, height: number, limits: ImageLimits): ImageLimitProblem | undefined {
  const size = `${plain(width)}×${plain(height)} pixels`;
  if (width * height > limits.maxPixels) {
    return {
      status: 413,
      code: 'IMAGE_TOO_MANY_PIXELS',
      message: `is ${size}; at most ${(limits.maxPixels / 1e6).toFixed(0)} megapixels are accepted (UPLOAD_MAX_INPUT_PIXELS).`,
    };
  }
  const long = Math.max(width, height);
  const short = Math.min(width, height);
  if (long > limits.maxSidePx) {
    return {
      status: 413,
      code: 'IMAGE_SIDE_TOO_LONG',
      message: `is ${size}; no side may be longer than ${plain(limits.maxSidePx)} pixels (UPLOAD_MAX_IMAGE_SIDE_PX).`,
    };
  }
  if (short === 0 || long / short > limits.maxAspectRatio) {
    const ratio = short === 0 ? '∞' : String(Math.round((long / short) * 10) / 10);
    return {
      status: 422,
      code: 'IMAGE_TOO_ELONGATED',
      message: `is ${size}, ${ratio} times as long as it is wide; at most ${plain(limits.maxAspectRatio)}:1 is accepted (UPLOAD_MAX_ASPECT_RATIO).`,
    };
  }
  return undefined;
}
