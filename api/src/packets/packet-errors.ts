import { NotFoundError } from '../domain/errors.js';

export function packetNotFound(): NotFoundError {
  return new NotFoundError('PACKET_NOT_FOUND', 'No such packet revision.');
}
