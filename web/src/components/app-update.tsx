import { Button, makeStyles, MessageBar, MessageBarActions, MessageBarBody, MessageBarTitle, tokens } from '@fluentui/react-components';
import { ArrowClockwise20Regular } from '@fluentui/react-icons';

import { applyUpdate, useAppUpdate } from '../lib/service-worker';

const useStyles = makeStyles({
  root: {
    position: 'fixed',
    insetInlineStart: tokens.spacingHorizontalS,
    insetInlineEnd: tokens.spacingHorizontalS,
    // Clear of the bottom of a form, where the thumb just tapped Save, and of the phone's home bar.
    top: `calc(env(safe-area-inset-top, 0px) + ${tokens.spacingVerticalS})`,
    zIndex: 1000,
    maxWidth: '40rem',
    marginInline: 'auto',
    boxShadow: tokens.shadow16,
  },
  action: { minHeight: '44px' },
});

/**
 * "A new version is ready": shown once the service worker has installed a newer app in the background.
 * Reload switches to it; until then the crew keeps working on the version they have.
 */
export function AppUpdateBar() {
  const styles = useStyles();
  const { updateReady } = useAppUpdate();
  if (!updateReady) return null;
  return (
    <MessageBar className={styles.root} intent="info" layout="multiline" role="status">
      <MessageBarBody>
        <MessageBarTitle>A new version of Loamline is ready</MessageBarTitle>
        Reload to use it. Save what you are typing first; changes waiting to send are kept.
      </MessageBarBody>
      <MessageBarActions>
        <Button appearance="primary" className={styles.action} icon={<ArrowClockwise20Regular />} onClick={applyUpdate}>
          Reload
        </Button>
      </MessageBarActions>
    </MessageBar>
  );
}
