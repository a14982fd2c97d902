import { createContext, useContext } from 'react';
import type { PhotoTarget } from '@domain/photos/photo.schema';

import type { PhotoResponse } from '../api/get-job-photos';
import type { TargetOption } from '../utils/photo-targets';

/** What the job workspace's sections can do with photos; provided by `PhotosProvider`. */
export type PhotoActions = {
  jobId: string;
  /** May this person add, change and delete photos on this job now. */
  canChange: boolean;
  /** The job's photos (not deleted), oldest first; empty while loading. */
  photos: readonly PhotoResponse[];
  isLoading: boolean;
  targetOptions: readonly TargetOption[];
  /** Opens "Add photos" with `target` chosen. */
  addPhotos: (target: PhotoTarget) => void;
  /** Opens the full-screen viewer on `photoId`, browsing through `photos`. */
  view: (photos: readonly PhotoResponse[], photoId: string) => void;
};

export const PhotoActionsContext = createContext<PhotoActions | undefined>(undefined);

export function usePhotoActions(): PhotoActions {
  const actions = useContext(PhotoActionsContext);
  if (!actions) throw new Error('usePhotoActions needs a PhotosProvider');
  return actions;
}
