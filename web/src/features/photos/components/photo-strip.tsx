import { makeStyles, tokens } from '@fluentui/react-components';
import { useMemo } from 'react';
import type { PhotoTarget } from '@domain/photos/photo.schema';

import { usePhotoActions } from '../hooks/photo-actions';
import { useJobUploads } from '../hooks/use-upload-queue';
import { targetKey } from '../utils/photo-targets';

import { PhotoGrid } from './photo-grid';
import { UploadList } from './upload-list';

const useStyles = makeStyles({ root: { display: 'flex', flexDirection: 'column', gap: tokens.spacingVerticalS } });

/**
 * The photos of one run, item or depth reading, with the uploads still on their way to it. An upload
 * leaves the list once its photo is in the gallery.
 */
export function PhotoStrip({ target, label }: { target: PhotoTarget; label: string }) {
  const styles = useStyles();
  const { jobId, photos } = usePhotoActions();
  const uploads = useJobUploads(jobId);
  const key = targetKey(target);
  const shown = useMemo(() => photos.filter((photo) => targetKey(photo.target) === key), [key, photos]);
  const pending = useMemo(() => {
    const ids = new Set(photos.map((photo) => photo.id));
    return uploads.filter((entry) => targetKey(entry.target) === key && !(entry.status.kind === 'done' && ids.has(entry.status.photoId)));
  }, [key, photos, uploads]);
  if (shown.length === 0 && pending.length === 0) return null;
  return (
    <div className={styles.root}>
      {shown.length > 0 && <PhotoGrid photos={shown} label={`Photos of ${label}`} />}
      <UploadList entries={pending} label={`Uploads to ${label}`} />
    </div>
  );
}
