import { makeStyles, shorthands, tokens } from '@fluentui/react-components';
import { CloudArrowUp20Regular } from '@fluentui/react-icons';
import { useSyncExternalStore } from 'react';
import { Link } from 'react-router';

import { paths } from '../../../config/paths';
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
 * "Waiting to send (n)" in the header on every page while changes made with no signal are kept on this
 * device; it opens the job of the oldest one, where they are listed and sent.
 */
export function WaitingToSend() {
  const styles = useStyles();
  const pending = useSyncExternalStore(subscribePendingWrites, readAllPendingWrites, readAllPendingWrites);
  if (pending.length === 0) return null;
  return (
    <Link className={styles.link} to={paths.job.getHref(pending[0]!.jobId)} role="status" aria-live="polite">
      <CloudArrowUp20Regular aria-hidden />
      Waiting to send ({pending.length})
    </Link>
  );
}
