import {
  Button,
  Dialog,
  DialogActions,
  DialogBody,
  DialogContent,
  DialogSurface,
  DialogTitle,
  makeStyles,
  Spinner,
} from '@fluentui/react-components';
import type { ReactNode } from 'react';

const useStyles = makeStyles({
  action: { minHeight: '44px' },
});

type ConfirmDialogProps = {
  open: boolean;
  title: string;
  children: ReactNode;
  confirmLabel: string;
  /** The button that backs out ("Cancel" unless said). */
  cancelLabel?: string;
  /** While the confirmed action runs: the buttons wait and the dialog stays open. */
  isPending?: boolean;
  onConfirm: () => void;
  onCancel: () => void;
};

/** Asks before an action that is hard to undo; stays open until the action finishes. */
export function ConfirmDialog({
  open,
  title,
  children,
  confirmLabel,
  cancelLabel = 'Cancel',
  isPending = false,
  onConfirm,
  onCancel,
}: ConfirmDialogProps) {
  const styles = useStyles();
  return (
    <Dialog
      open={open}
      modalType="alert"
      onOpenChange={(_event, data) => {
        if (!data.open && !isPending) onCancel();
      }}
    >
      <DialogSurface>
        <DialogBody>
          <DialogTitle>{title}</DialogTitle>
          <DialogContent>{children}</DialogContent>
          <DialogActions fluid>
            <Button className={styles.action} disabled={isPending} onClick={onCancel}>
              {cancelLabel}
            </Button>
            <Button
              appearance="primary"
              className={styles.action}
              disabled={isPending}
              icon={isPending ? <Spinner size="tiny" /> : undefined}
              onClick={onConfirm}
            >
              {confirmLabel}
            </Button>
          </DialogActions>
        </DialogBody>
      </DialogSurface>
    </Dialog>
  );
}
