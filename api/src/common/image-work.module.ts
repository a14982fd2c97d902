import { Module } from '@nestjs/common';

import { ImageWorkQueue, UploadSlotInterceptor, UploadSlots } from './image-work.js';

/** One image queue and one set of per-user upload slots, shared by the photo and site-plan uploads. */
@Module({
  providers: [ImageWorkQueue, UploadSlots, UploadSlotInterceptor],
  exports: [ImageWorkQueue, UploadSlots, UploadSlotInterceptor],
})
export class ImageWorkModule {}
