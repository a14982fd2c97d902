import { Button, Dialog, DialogActions, DialogBody, DialogContent, DialogSurface, DialogTitle, makeStyles } from '@fluentui/react-components';
import { useCallback, useState, type ReactNode } from 'react';

import { useNotify } from '../../../components/notify';
import { isApiError } from '../../../lib/api-client';
import { isSiteConflict } from '../api/site-write';

const useStyles = makeStyles({ action: { minHeight: '48px' } });

type Pending = { label: string; currentVersion: number | undefined; retry: () => void };

export type SiteConflict = {
  /**
   * When `error` is a site version conflict (someone changed the site first; the latest site has been
   * fetched), asks — as job writes do — whether to keep the change and send it again on top of the
   * latest version (`retry`), or drop it; returns true. Any other error: returns false, for the caller.
   */
  handle: (error: unknown, label: string, retry: () => void) => boolean;
  /** The dialog that asks: render it once beside the form or editor. */
  dialog: ReactNode;
};

/** "Someone changed this site first": the site-write counterpart of the job writer's conflict dialog. */
export function useSiteConflict(): SiteConflict {
  const styles = useStyles();
  const notify = useNotify();
  const [pending, setPending] = useState<Pending | undefined>();

  const handle = useCallback((error: unknown, label: string, retry: () => void) => {
    if (!isSiteConflict(error)) return false;
    setPending({ label, currentVersion: isApiError(error) ? error.currentVersion : undefined, retry });
    return true;
  }, []);

  const choose = (choice: 'reload' | 'keep') => {
    const current = pending;
    setPending(undefined);
    if (!current) return;
    if (choice === 'keep') current.retry();
    else notify.success('Showing the latest version of the site', 'Your change was discarded.');
  };

  const dialog = (
    <Dialog open={pending !== undefined} modalType="alert">
      <DialogSurface>
        <DialogBody>
          <DialogTitle>Someone changed this site first</DialogTitle>
          <DialogContent>
            {pending?.currentVersion !== undefined
              ? `The site changed (it is now at version ${pending.currentVersion}) while you were working on: ${pending.label}. `
              : `The site changed while you were working on: ${pending?.label ?? ''}. `}
            The latest version is shown now. Keep your change and save it on top of it, or drop it.
          </DialogContent>
          <DialogActions fluid>
            <Button className={styles.action} onClick={() => choose('reload')}>
              Discard mine
            </Button>
            <Button appearance="primary" className={styles.action} onClick={() => choose('keep')}>
              Keep mine and save
            </Button>
          </DialogActions>
        </DialogBody>
      </DialogSurface>
    </Dialog>
  );

  return { handle, dialog };
}
