import { Button, makeStyles, mergeClasses, Spinner, Text, tokens } from '@fluentui/react-components';
import { Camera24Regular } from '@fluentui/react-icons';
import { useMemo } from 'react';

import { useCardStyles } from '../../../components/card-styles';
import { useFormStyles } from '../../../components/form-styles';
import { usePhotoActions } from '../hooks/photo-actions';
import { getUploadQueue, useJobUploads } from '../hooks/use-upload-queue';
import { targetKey } from '../utils/photo-targets';

import { PhotoGrid } from './photo-grid';
import { UploadList } from './upload-list';

const useStyles = makeStyles({
  group: { display: 'flex', flexDirection: 'column', gap: tokens.spacingVerticalS },
  groupTitle: { margin: 0 },
  queueHead: { display: 'flex', alignItems: 'center', justifyContent: 'space-between', gap: tokens.spacingHorizontalM, flexWrap: 'wrap' },
});

/** Every photo of the job, grouped by what it shows, and the uploads still on their way. */
export function PhotosSection() {
  const styles = useStyles();
  const cardStyles = useCardStyles();
  const formStyles = useFormStyles();
  const { jobId, photos, isLoading, targetOptions, canChange, addPhotos } = usePhotoActions();
  const uploads = useJobUploads(jobId);
  const active = uploads.filter((entry) => entry.status.kind !== 'done');
  const hasDone = uploads.some((entry) => entry.status.kind === 'done');

  // Groups in the order of the targets (job, runs, readings, items); photos of removed records last.
  const groups = useMemo(() => {
    const byKey = new Map<string, typeof photos>();
    for (const photo of photos) {
      const key = targetKey(photo.target);
      byKey.set(key, [...(byKey.get(key) ?? []), photo]);
    }
    const known = targetOptions.filter((option) => byKey.has(option.key)).map((option) => ({ key: option.key, label: option.label, photos: byKey.get(option.key)! }));
    const orphaned = [...byKey.entries()].filter(([key]) => !targetOptions.some((option) => option.key === key)).flatMap(([, list]) => list);
    return orphaned.length > 0 ? [...known, { key: 'orphaned', label: 'Records no longer on the job', photos: orphaned }] : known;
  }, [photos, targetOptions]);

  return (
    <section aria-labelledby="section-photos" className={formStyles.form}>
      <div className={cardStyles.sectionHead}>
        <Text as="h3" id="section-photos" size={500} weight="semibold" className={cardStyles.title}>
          Photos ({photos.length})
        </Text>
        {canChange && (
          <Button appearance="primary" className={formStyles.bigButton} icon={<Camera24Regular />} onClick={() => addPhotos({ type: 'job' })}>
            Add photos
          </Button>
        )}
      </div>
      {uploads.length > 0 && (
        <div className={cardStyles.card}>
          <div className={styles.queueHead}>
            <Text as="h4" size={400} weight="semibold" className={cardStyles.title}>
              {active.length === 0 ? 'All photos sent' : `Sending ${active.length} ${active.length === 1 ? 'photo' : 'photos'}`}
            </Text>
            {hasDone && (
              <Button className={formStyles.button} onClick={() => getUploadQueue().clearDone(jobId)}>
                Clear finished
              </Button>
            )}
          </div>
          <UploadList entries={uploads} label="Uploads" />
        </div>
      )}
      {isLoading ? (
        <Spinner label="Loading photos" />
      ) : groups.length === 0 ? (
        <Text as="p" className={cardStyles.empty}>
          No photos yet. Photos of the open trench with a tape in it, wall entries before sealing and the amplifier rack are the evidence behind the
          as-built.
        </Text>
      ) : (
        groups.map((group) => (
          <div key={group.key} className={mergeClasses(cardStyles.card, styles.group)}>
            <Text as="h4" size={400} weight="semibold" className={styles.groupTitle}>
              {group.label} ({group.photos.length})
            </Text>
            <PhotoGrid photos={group.photos} label={`Photos of ${group.label}`} />
          </div>
        ))
      )}
    </section>
  );
}
