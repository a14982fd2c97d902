import { Button, makeStyles, MessageBar, MessageBarActions, MessageBarBody, MessageBarTitle, Spinner } from '@fluentui/react-components';

import { useDraftKeys } from '../../../lib/drafts';
import { useOnline } from '../../../lib/use-online';
import { useJobWriter } from '../hooks/job-writer';

const useStyles = makeStyles({ button: { minHeight: '44px' } });

/** Tells the crew what is not on the server yet: changes waiting for a connection, forms not saved. */
export function SaveStateBar({ jobId }: { jobId: string }) {
  const styles = useStyles();
  const isOnline = useOnline();
  const { pending, retryPending, isSending } = useJobWriter();
  const drafts = useDraftKeys(`job:${jobId}:`);

  if (pending.length > 0) {
    return (
      <MessageBar intent="warning" layout="multiline">
        <MessageBarBody>
          <MessageBarTitle>
            {pending.length === 1 ? '1 change is' : `${pending.length} changes are`} kept on this device, not yet saved
          </MessageBarTitle>
          {isOnline ? 'Sending them now and again every few seconds.' : 'No connection. They are sent as soon as the phone is back online.'}{' '}
          ({pending.map((entry) => entry.write.label).join('; ')})
        </MessageBarBody>
        <MessageBarActions>
          <Button className={styles.button} disabled={isSending} icon={isSending ? <Spinner size="tiny" /> : undefined} onClick={retryPending}>
            Send now
          </Button>
        </MessageBarActions>
      </MessageBar>
    );
  }
  if (!isOnline) {
    return (
      <MessageBar intent="warning">
        <MessageBarBody>No connection. Keep recording: what you save is kept on this device and sent later.</MessageBarBody>
      </MessageBar>
    );
  }
  if (drafts.length > 0) {
    return (
      <MessageBar intent="info">
        <MessageBarBody>
          {drafts.length === 1 ? 'One form has' : `${drafts.length} forms have`} input that is not saved yet. It is kept on this device until you save or
          discard it.
        </MessageBarBody>
      </MessageBar>
    );
  }
  return null;
}
