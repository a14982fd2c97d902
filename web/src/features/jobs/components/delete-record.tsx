import { MessageBar, MessageBarBody, Text } from '@fluentui/react-components';
import { useCallback, useState, type ReactNode } from 'react';

import { ConfirmDialog } from '../../../components/confirm-dialog';
import { useNotify } from '../../../components/notify';
import { describeRequestError } from '../../../lib/form-errors';
import { useJobWriter } from '../hooks/job-writer';
import type { DeleteRequest } from '../utils/delete-requests';

/**
 * Asks before deleting a record of the job, sends the DELETE through the job writer and offers Undo.
 * A refusal (e.g. 409 IN_USE: a run still ends at this item) stays in the dialog with the API's words.
 */
export function useDeleteRecord(): { ask: (request: DeleteRequest) => void; dialog: ReactNode } {
  const writer = useJobWriter();
  const notify = useNotify();
  const [request, setRequest] = useState<DeleteRequest | undefined>();
  const [error, setError] = useState<string | undefined>();
  const [isPending, setIsPending] = useState(false);

  const ask = useCallback((next: DeleteRequest) => {
    setError(undefined);
    setRequest(next);
  }, []);

  const confirm = async () => {
    if (!request) return;
    setIsPending(true);
    setError(undefined);
    try {
      const outcome = await writer.save(request.write);
      setRequest(undefined);
      if (outcome === 'queued') {
        notify.success('Kept on this phone', `${request.write.label}: sent when the connection returns.`);
      } else if (outcome === 'saved') {
        const { undo } = request;
        if (undo) {
          notify.undoable(request.doneTitle, () => {
            writer.save(undo).then(
              (result) => {
                if (result === 'saved') notify.success('Put back');
              },
              (caught: unknown) => notify.error('Could not put it back', describeRequestError(caught)),
            );
          });
        } else {
          notify.success(request.doneTitle);
        }
      }
    } catch (caught) {
      setError(describeRequestError(caught));
    } finally {
      setIsPending(false);
    }
  };

  const dialog = (
    <ConfirmDialog
      open={request !== undefined}
      title={request?.title ?? ''}
      confirmLabel="Delete"
      isPending={isPending}
      onConfirm={() => void confirm()}
      onCancel={() => setRequest(undefined)}
    >
      {error && (
        <MessageBar intent="error" layout="multiline">
          <MessageBarBody>{error}</MessageBarBody>
        </MessageBar>
      )}
      <Text as="p" block>
        {request?.consequences}
      </Text>
    </ConfirmDialog>
  );

  return { ask, dialog };
}
