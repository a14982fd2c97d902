import { z } from 'zod';

/**
 * The jobs, customers and sites endpoints describe their answers as TypeScript interfaces in
 * `@domain` (no response schemas), so the client checks only that it got an object and trusts the type.
 */
export function responseOf<T>() {
  return z.custom<T>((value) => typeof value === 'object' && value !== null);
}
