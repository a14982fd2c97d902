import { useCallback, useMemo, useState, type ReactNode } from 'react';
import type { JobAsBuiltResponse } from '@domain/jobs/job.schema';
import type { PhotoTarget } from '@domain/photos/photo.schema';

import { useUnitPreferences } from '../../../lib/use-unit-preferences';
import { useJobPhotos, type PhotoResponse } from '../api/get-job-photos';
import { PhotoActionsContext, type PhotoActions } from '../hooks/photo-actions';
import { photoTargetOptions } from '../utils/photo-targets';

import { AddPhotosDialog } from './add-photos-dialog';
import { PhotoViewer } from './photo-viewer';

type PhotosProviderProps = { data: JobAsBuiltResponse; canChange: boolean; children: ReactNode };

/** Gives the job workspace its photos, the "Add photos" dialog and the full-screen viewer. */
export function PhotosProvider({ data, canChange, children }: PhotosProviderProps) {
  const jobId = data.job.id;
  const [units] = useUnitPreferences();
  const { data: list, isLoading } = useJobPhotos(jobId);
  const [addTarget, setAddTarget] = useState<PhotoTarget | undefined>();
  const [viewing, setViewing] = useState<{ photoIds: readonly string[]; photoId: string } | undefined>();
  const photos = list?.items ?? NO_PHOTOS;
  const targetOptions = useMemo(() => photoTargetOptions(data, units.length), [data, units.length]);

  const view = useCallback((shown: readonly PhotoResponse[], photoId: string) => setViewing({ photoIds: shown.map((photo) => photo.id), photoId }), []);
  const value = useMemo<PhotoActions>(
    () => ({ jobId, canChange, photos, isLoading, targetOptions, addPhotos: setAddTarget, view }),
    [canChange, isLoading, jobId, photos, targetOptions, view],
  );
  // The viewer browses the photos it was opened on that still exist (a deleted one drops out).
  const viewerPhotos = useMemo(
    () => (viewing ? viewing.photoIds.flatMap((id) => photos.find((photo) => photo.id === id) ?? []) : NO_PHOTOS),
    [photos, viewing],
  );

  return (
    <PhotoActionsContext.Provider value={value}>
      {children}
      {canChange && <AddPhotosDialog jobId={jobId} target={addTarget} options={targetOptions} onClose={() => setAddTarget(undefined)} />}
      <PhotoViewer
        photos={viewerPhotos}
        photoId={viewing?.photoId}
        onNavigate={(photoId) => setViewing((current) => (current ? { ...current, photoId } : current))}
        onClose={() => setViewing(undefined)}
      />
    </PhotoActionsContext.Provider>
  );
}

const NO_PHOTOS: readonly PhotoResponse[] = [];
