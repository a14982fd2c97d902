import type { PacketPhoto } from '../domain/packet/packet-snapshot.js';

/** Injection token of the PacketPhotoSource the render worker uses. */
export const PACKET_PHOTO_SOURCE = Symbol('PACKET_PHOTO_SOURCE');

export interface PacketPhotoRequest {
  companyId: string;
  jobId: string;
  revisionId: string;
}

/**
 * Where the photo appendix comes from: the job's photos at print size, inlined as data URIs, in the
 * order they should print (implemented by the photo module's JobPhotosForPacket).
 */
export interface PacketPhotoSource {
  photosFor(request: PacketPhotoRequest): Promise<PacketPhoto[]>;
}
