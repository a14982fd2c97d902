import {
  Button,
  Dialog,
  DialogSurface,
  DialogTitle,
  Field,
  makeStyles,
  mergeClasses,
  MessageBar,
  MessageBarBody,
  Spinner,
  Text,
  Textarea,
  tokens,
} from '@fluentui/react-components';
import { ChevronLeft24Regular, ChevronRight24Regular, Delete20Regular, Dismiss24Regular, Edit20Regular } from '@fluentui/react-icons';
import { useEffect, useRef, useState, type KeyboardEvent, type PointerEvent } from 'react';
import type { PhotoTarget } from '@domain/photos/photo.schema';

import { useNotify } from '../../../components/notify';
import { formatDateTime } from '../../../lib/format-date';
import { useDateStyle } from '../../../lib/use-date-style';
import { describeRequestError } from '../../../lib/form-errors';
import { useDeletePhoto } from '../api/delete-photo';
import { useRestorePhoto } from '../api/restore-photo';
import { useUpdatePhoto } from '../api/update-photo';
import type { PhotoResponse } from '../api/get-job-photos';
import { usePhotoUrl } from '../api/get-photo-file';
import { usePhotoActions } from '../hooks/photo-actions';
import { targetLabel } from '../utils/photo-targets';

import { TargetSelect } from './target-select';

const useStyles = makeStyles({
  surface: {
    // Pinned to the viewport's edges rather than 100vw, which includes a desktop scrollbar.
    position: 'fixed',
    inset: 0,
    width: 'auto',
    maxWidth: 'none',
    height: 'auto',
    maxHeight: 'none',
    margin: 0,
    boxSizing: 'border-box',
    overflow: 'hidden',
    padding: 0,
    borderRadius: 0,
    display: 'grid',
    gridTemplateRows: 'auto minmax(0, 1fr) auto',
    backgroundColor: tokens.colorNeutralBackgroundStatic,
    color: tokens.colorNeutralForegroundStaticInverted,
    '@media (min-width: 1024px)': { gridTemplateColumns: 'minmax(0, 1fr) 22rem', gridTemplateRows: 'auto minmax(0, 1fr)' },
  },
  top: {
    display: 'flex',
    alignItems: 'center',
    justifyContent: 'space-between',
    gap: tokens.spacingHorizontalM,
    padding: `${tokens.spacingVerticalS} ${tokens.spacingHorizontalM}`,
    '@media (min-width: 1024px)': { gridColumn: '1 / -1' },
  },
  title: { margin: 0, fontSize: tokens.fontSizeBase400, color: 'inherit' },
  stage: { position: 'relative', minHeight: 0, display: 'flex', alignItems: 'center', justifyContent: 'center', touchAction: 'pan-y' },
  image: { maxWidth: '100%', maxHeight: '100%', objectFit: 'contain', userSelect: 'none' },
  nav: {
    position: 'absolute',
    top: '50%',
    transform: 'translateY(-50%)',
    minWidth: '48px',
    minHeight: '48px',
    backgroundColor: tokens.colorBackgroundOverlay,
    color: tokens.colorNeutralForegroundStaticInverted,
  },
  prev: { left: tokens.spacingHorizontalS },
  next: { right: tokens.spacingHorizontalS },
  panel: {
    display: 'flex',
    flexDirection: 'column',
    gap: tokens.spacingVerticalS,
    padding: tokens.spacingHorizontalM,
    maxHeight: '45dvh',
    overflowY: 'auto',
    backgroundColor: tokens.colorNeutralBackground1,
    color: tokens.colorNeutralForeground1,
    '@media (min-width: 1024px)': { maxHeight: 'none' },
  },
  meta: { color: tokens.colorNeutralForeground2 },
  actions: { display: 'flex', flexWrap: 'wrap', gap: tokens.spacingHorizontalS },
  button: { minHeight: '48px' },
  close: { minWidth: '48px', minHeight: '48px', color: 'inherit' },
});

type PhotoViewerProps = {
  photos: readonly PhotoResponse[];
  photoId: string | undefined;
  onNavigate: (photoId: string) => void;
  onClose: () => void;
};

/**
 * A photo on the whole screen: swipe or the arrow keys for the next one, Escape closes. Shows the
 * caption, when it was taken and what it shows; the crew can change the caption or the target, or
 * delete it (with undo).
 */
export function PhotoViewer({ photos, photoId, onNavigate, onClose }: PhotoViewerProps) {
  const styles = useStyles();
  const index = photos.findIndex((photo) => photo.id === photoId);
  const photo = index >= 0 ? photos[index] : undefined;
  const swipeStart = useRef<number | undefined>(undefined);

  const go = (step: number) => {
    const next = photos[index + step];
    if (next) onNavigate(next.id);
  };
  const onKeyDown = (event: KeyboardEvent) => {
    if ((event.target as HTMLElement).closest('textarea, select, input')) return;
    if (event.key === 'ArrowLeft') go(-1);
    if (event.key === 'ArrowRight') go(1);
  };
  const onPointerDown = (event: PointerEvent) => {
    swipeStart.current = event.clientX;
  };
  const onPointerUp = (event: PointerEvent) => {
    if (swipeStart.current === undefined) return;
    const dx = event.clientX - swipeStart.current;
    swipeStart.current = undefined;
    if (Math.abs(dx) > 50) go(dx < 0 ? 1 : -1);
  };

  return (
    <Dialog open={photo !== undefined} onOpenChange={(_event, data) => !data.open && onClose()}>
      <DialogSurface className={styles.surface} onKeyDown={onKeyDown} aria-label="Photo viewer">
        {photo && (
          <>
            <div className={styles.top}>
              <DialogTitle as="h2" className={styles.title}>
                Photo {index + 1} of {photos.length}
              </DialogTitle>
              <Button appearance="transparent" className={styles.close} icon={<Dismiss24Regular />} aria-label="Close the viewer" onClick={onClose} />
            </div>
            <div className={styles.stage} onPointerDown={onPointerDown} onPointerUp={onPointerUp}>
              <ViewerImage photo={photo} />
              {index > 0 && (
                <Button className={mergeClasses(styles.nav, styles.prev)} shape="circular" icon={<ChevronLeft24Regular />} aria-label="Previous photo" onClick={() => go(-1)} />
              )}
              {index < photos.length - 1 && (
                <Button className={mergeClasses(styles.nav, styles.next)} shape="circular" icon={<ChevronRight24Regular />} aria-label="Next photo" onClick={() => go(1)} />
              )}
            </div>
            <PhotoDetails key={photo.id} photo={photo} onDeleted={() => (photos[index + 1] ? go(1) : photos[index - 1] ? go(-1) : onClose())} />
          </>
        )}
      </DialogSurface>
    </Dialog>
  );
}

function ViewerImage({ photo }: { photo: PhotoResponse }) {
  const styles = useStyles();
  const { url, isError } = usePhotoUrl(photo.id, 'screen');
  if (isError) return <Text>This photo could not be loaded.</Text>;
  if (!url) return <Spinner appearance="inverted" label="Loading the photo" />;
  return <img src={url} alt={photo.caption ?? 'Photo'} className={styles.image} draggable={false} />;
}

function PhotoDetails({ photo, onDeleted }: { photo: PhotoResponse; onDeleted: () => void }) {
  const dateStyle = useDateStyle();
  const styles = useStyles();
  const notify = useNotify();
  const { jobId, canChange, targetOptions } = usePhotoActions();
  const update = useUpdatePhoto(jobId);
  const del = useDeletePhoto(jobId);
  const restore = useRestorePhoto(jobId);
  const isChanging = update.isPending || del.isPending || restore.isPending;
  const [isEditing, setIsEditing] = useState(false);
  const [caption, setCaption] = useState(photo.caption ?? '');
  const [target, setTarget] = useState<PhotoTarget>(photo.target);
  const [error, setError] = useState<string | undefined>();

  useEffect(() => {
    setCaption(photo.caption ?? '');
    setTarget(photo.target);
  }, [photo]);

  const save = async () => {
    setError(undefined);
    try {
      await update.mutateAsync({ photoId: photo.id, caption: caption.trim() === '' ? null : caption, target });
      setIsEditing(false);
      notify.success('Photo changed');
    } catch (caught) {
      setError(describeRequestError(caught));
    }
  };

  const remove = async () => {
    setError(undefined);
    try {
      await del.mutateAsync({ photoId: photo.id });
      onDeleted();
      notify.undoable('Photo deleted', () => {
        restore.mutateAsync({ photoId: photo.id }).then(
          () => notify.success('Photo restored'),
          (caught: unknown) => notify.error('Could not restore the photo', describeRequestError(caught)),
        );
      });
    } catch (caught) {
      setError(describeRequestError(caught));
    }
  };

  const takenAt = photo.takenAt ? formatDateTime(photo.takenAt, dateStyle) : undefined;
  return (
    <section className={styles.panel} aria-label="About this photo">
      {error && (
        <MessageBar intent="error" layout="multiline">
          <MessageBarBody>{error}</MessageBarBody>
        </MessageBar>
      )}
      {isEditing ? (
        <>
          <Field label="Caption">
            <Textarea value={caption} onChange={(_event, data) => setCaption(data.value)} maxLength={500} resize="vertical" />
          </Field>
          <TargetSelect label="The photo shows" options={targetOptions} value={target} onChange={setTarget} />
          <div className={styles.actions}>
            <Button
              appearance="primary"
              className={styles.button}
              disabled={isChanging}
              icon={isChanging ? <Spinner size="tiny" /> : undefined}
              onClick={() => void save()}
            >
              Save
            </Button>
            <Button className={styles.button} onClick={() => setIsEditing(false)}>
              Cancel
            </Button>
          </div>
        </>
      ) : (
        <>
          <Text weight="semibold" size={400}>
            {photo.caption ?? 'No caption'}
          </Text>
          <Text className={styles.meta}>Shows: {targetLabel(photo.target, targetOptions)}</Text>
          <Text className={styles.meta}>
            {takenAt ? `Taken ${takenAt}` : 'No time taken recorded'}
            {photo.uploadedBy ? ` · uploaded by ${photo.uploadedBy.name}` : ''}
          </Text>
          {canChange && (
            <div className={styles.actions}>
              <Button className={styles.button} icon={<Edit20Regular />} onClick={() => setIsEditing(true)}>
                Change caption or target
              </Button>
              <Button className={styles.button} icon={<Delete20Regular />} disabled={isChanging} onClick={() => void remove()}>
                Delete
              </Button>
            </div>
          )}
        </>
      )}
    </section>
  );
}
