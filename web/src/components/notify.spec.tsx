import { FluentProvider } from '@fluentui/react-components';
import { render, screen, waitFor, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { useEffect } from 'react';
import { describe, expect, it, vi } from 'vitest';

import { lightTheme } from '../app/theme';

import { AppToaster, useNotify } from './notify';

/** Asks for toasts as soon as it is on the page: before the toaster's own chunk has loaded. */
function NotifyOnMount({ onUndo }: { onUndo: () => void }) {
  const notify = useNotify();
  useEffect(() => {
    notify.success('Run saved', 'Patio trunk');
    notify.undoable('Speaker deleted', onUndo);
  }, [notify, onUndo]);
  return null;
}

function ThreeReadings() {
  const notify = useNotify();
  return (
    <button
      type="button"
      onClick={() => {
        notify.success('Reading saved', 'Station 1');
        notify.success('Reading saved', 'Station 2');
        notify.success('Reading saved', 'Station 3');
      }}
    >
      Save three
    </button>
  );
}

describe('useNotify', () => {
  it('should show a toast asked for before the toaster has loaded, one at a time, with a working Undo', async () => {
    const onUndo = vi.fn();
    const user = userEvent.setup();
    render(
      <FluentProvider theme={lightTheme}>
        <NotifyOnMount onUndo={onUndo} />
        <AppToaster />
      </FluentProvider>,
    );

    const undoToast = (await screen.findByText('Speaker deleted')).closest('.fui-Toast');
    expect(undoToast).not.toBeNull();
    await waitFor(() => expect(screen.queryByText('Run saved')).not.toBeInTheDocument());
    await user.click(within(undoToast as HTMLElement).getByText('Undo'));
    expect(onUndo).toHaveBeenCalledOnce();
  });

  it('should leave one message after three quick saves, not three stacked', async () => {
    const user = userEvent.setup();
    render(
      <FluentProvider theme={lightTheme}>
        <ThreeReadings />
        <AppToaster />
      </FluentProvider>,
    );
    await user.click(screen.getByRole('button', { name: 'Save three' }));
    expect(await screen.findByText('Station 3')).toBeInTheDocument();
    await waitFor(() => expect(screen.getAllByText('Reading saved')).toHaveLength(1));
    expect(screen.queryByText('Station 1')).not.toBeInTheDocument();
  });
});
