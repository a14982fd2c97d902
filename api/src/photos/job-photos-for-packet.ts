import { Inject, Injectable } from '@nestjs/common';

import type { PacketPhoto } from '../domain/packet/packet-snapshot.js';
import type { PacketPhotoRequest, PacketPhotoSource } from '../packets/packet-photo-source.js';
import { OBJECT_STORAGE, type ObjectStorage } from '../storage/object-storage.js';
import { PhotosRepository } from './photos.repository.js';

/**
 * The packet's photo appendix: the job's photos that are not deleted, in upload order, as their print
 * derivatives (≤ 2400 px JPEG, metadata stripped — never the originals, which may carry GPS).
 */
@Injectable()
export class JobPhotosForPacket implements PacketPhotoSource {
  constructor(
    private readonly repository: PhotosRepository,
    @Inject(OBJECT_STORAGE) private readonly storage: ObjectStorage,
  ) {}

  async photosFor({ companyId, jobId }: PacketPhotoRequest): Promise<PacketPhoto[]> {
    const views = (await this.repository.listByJob(jobId, { includeDeleted: false })).filter(
      (view) => view.photo.companyId === companyId,
    );
    const out: PacketPhoto[] = [];
    // One at a time: a job with many photos must not hold every file in memory twice at once.
    for (const { photo, derivatives } of views) {
      const print = derivatives.find((d) => d.variant === 'print');
      if (!print) continue;
      const bytes = await this.storage.getBuffer(print.key);
      out.push({
        caption: photo.caption?.trim() || 'Photo',
        takenAt: photo.exifTakenAt ? new Date(`${photo.exifTakenAt}Z`).toISOString() : (photo.clientTakenAt ?? photo.createdAt).toISOString(),
        dataUri: `data:${print.contentType};base64,${bytes.toString('base64')}`,
      });
    }
    return out;
  }
}
