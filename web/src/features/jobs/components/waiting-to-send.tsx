import { makeStyles, shorthands, tokens } from '@fluentui/react-components';
import { CloudArrowUp20Regular } from '@fluentui/react-icons';
import { useSyncExternalStore } from 'react';
import { Link } from 'react-router';

import { paths } from '../../../config/paths';
import { readPendingUploads, subscribePendingUploads } from '../../../lib/pending-uploads';
import { readAllPendingWrites, subscribePendingWrites } from '../utils/pending-writes';

const useStyles = makeStyles({
  link: {
    display: 'inline-flex',
    alignItems: 'center',
    gap: tokens.spacingHorizontalXS,
    minHeight: '44px',
    paddingInline: tokens.spacingHorizontalS,
    marginInlineEnd: tokens.spacingHorizontalXS,
    borderRadius: tokens.borderRadiusMedium,
    backgroundColor: tokens.colorStatusWarningBackground1,
    ...shorthands.border(tokens.strokeWidthThin, 'solid', tokens.colorStatusWarningBorder1),
    color: tokens.colorNeutralForeground1,
    fontWeight: tokens.fontWeightSemibold,
    fontSize: tokens.fontSizeBase200,
    whiteSpace: 'nowrap',
    textDecorationLine: 'none',
  },
});

/**
 * "Waiting to send (n)" in the header on every page while changes and photos made with no signal are
 * kept on this device (they go out from any page when the signal returns); it opens the job of the
 * oldest one, where they are listed.
 */
export function WaitingToSend() {
  const styles = useStyles();
  const writes = useSyncExternalStore(subscribePendingWrites, readAllPendingWrites, readAllPendingWrites);
  const photos = useSyncExternalStore(subscribePendingUploads, readPendingUploads, readPendingUploads);
  const count = writes.length + photos.length;
  if (count === 0) return null;
  const oldestWrite = writes[0];
  const oldestPhoto = photos[0];
  const jobId =
    oldestWrite && (!oldestPhoto || oldestWrite.queuedAt <= oldestPhoto.queuedAt) ? oldestWrite.jobId : (oldestPhoto ?? oldestWrite)!.jobId;
  const parts = [writes.length > 0 ? `${writes.length} ${writes.length === 1 ? 'change' : 'changes'}` : '', photos.length > 0 ? `${photos.length} ${photos.length === 1 ? 'photo' : 'photos'}` : '']
    .filter(Boolean)
    .join(' and ');
  return (
    <Link
      className={styles.link}
      to={paths.job.getHref(jobId)}
      role="status"
      aria-live="polite"
      title={`${parts} kept on this device, sent when the signal returns`}
    >
      <CloudArrowUp20Regular aria-hidden />
      Waiting to send ({count})
    </Link>
  );
}
