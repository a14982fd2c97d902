import { FluentProvider } from '@fluentui/react-components';
import { render, screen, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { useEffect } from 'react';
import { describe, expect, it, vi } from 'vitest';

import { lightTheme } from '../app/theme';

import { AppToaster, useNotify } from './notify';

/** Asks for a toast as soon as it is on the page: before the toaster's own chunk has loaded. */
function NotifyOnMount({ onUndo }: { onUndo: () => void }) {
  const notify = useNotify();
  useEffect(() => {
    notify.success('Run saved', 'Patio trunk');
    notify.undoable('Speaker deleted', onUndo);
  }, [notify, onUndo]);
  return null;
}

describe('useNotify', () => {
  it('should show toasts asked for before the toaster has loaded, with a working Undo', async () => {
    const onUndo = vi.fn();
    const user = userEvent.setup();
    render(
      <FluentProvider theme={lightTheme}>
        <NotifyOnMount onUndo={onUndo} />
        <AppToaster />
      </FluentProvider>,
    );

    expect(await screen.findByText('Run saved')).toBeInTheDocument();
    expect(screen.getByText('Patio trunk')).toBeInTheDocument();
    const undoToast = (await screen.findByText('Speaker deleted')).closest('.fui-Toast');
    expect(undoToast).not.toBeNull();
    await user.click(within(undoToast as HTMLElement).getByText('Undo'));
    expect(onUndo).toHaveBeenCalledOnce();
  });
});
