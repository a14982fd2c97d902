import { Button, FluentProvider } from '@fluentui/react-components';
import { fireEvent, render, screen, waitFor, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { useState } from 'react';
import { describe, expect, it, vi } from 'vitest';
import { z } from 'zod';

import { lightTheme } from '../app/theme';

import { FormDialog, FormFilePicker, FormTextField, type FormDialogView } from './form-dialog';

const NamesSchema = z.object({ first: z.string().min(1, { error: 'is required' }), second: z.string() });
type Names = z.input<typeof NamesSchema>;

/** The dialog by its title (jsdom leaves Fluent's surface aria-hidden for role queries, as in the other dialog tests). */
async function dialogTitled(title: string) {
  const heading = await screen.findByText(title, { selector: 'h2' });
  return within(heading.closest<HTMLElement>('[role="dialog"]')!);
}

function NamesDialog({ values, onSubmit }: { values?: Names; onSubmit: (names: Names) => FormDialogView | undefined }) {
  const [view, setView] = useState<FormDialogView | undefined>();
  return (
    <FormDialog
      trigger={<Button>Open names</Button>}
      title="Names"
      schema={NamesSchema}
      defaultValues={{ first: '', second: '' }}
      values={values}
      onOpenChange={(open) => open && setView(undefined)}
      view={view}
      submitLabel={(current) => (current.first ? `Save ${current.first}` : 'Save')}
      onSubmit={(names) => setView(onSubmit(names))}
    >
      {(form, fieldError) => (
        <>
          <FormTextField form={form} name="first" label="First" error={fieldError('first')} />
          <FormTextField form={form} name="second" label="Second" error={fieldError('second')} />
        </>
      )}
    </FormDialog>
  );
}

const wrap = (ui: React.ReactElement) => <FluentProvider theme={lightTheme}>{ui}</FluentProvider>;

describe('FormDialog', () => {
  it('should take values that arrive after opening without overwriting a field already changed, and start each opening from them', async () => {
    const onSubmit = vi.fn(() => undefined);
    const { rerender } = render(wrap(<NamesDialog onSubmit={onSubmit} />));
    const user = userEvent.setup();
    await user.click(screen.getByRole('button', { name: 'Open names' }));
    let dialog = await dialogTitled('Names');
    await user.type(dialog.getByLabelText('First'), 'Typed');

    rerender(wrap(<NamesDialog onSubmit={onSubmit} values={{ first: 'Loaded first', second: 'Loaded second' }} />));
    await waitFor(() => expect(dialog.getByLabelText('Second')).toHaveValue('Loaded second'));
    expect(dialog.getByLabelText('First')).toHaveValue('Typed');
    // The submit label follows the values as they are.
    expect(dialog.getByRole('button', { name: 'Save Typed', hidden: true })).toBeInTheDocument();

    await user.click(dialog.getByRole('button', { name: 'Cancel', hidden: true }));
    await waitFor(() => expect(screen.queryByText('Names', { selector: 'h2' })).not.toBeInTheDocument());
    await user.click(await screen.findByRole('button', { name: 'Open names' }));
    dialog = await dialogTitled('Names');
    expect(dialog.getByLabelText('First')).toHaveValue('Loaded first');
    expect(dialog.getByLabelText('Second')).toHaveValue('Loaded second');
  });

  it('should refuse an invalid field under it, then show the step without a form that the submit asks for, closed by its one button', async () => {
    const onSubmit = vi.fn((names: Names) => ({ title: `Saved ${names.first}`, content: <p>All done.</p>, closeLabel: 'Done' }));
    render(wrap(<NamesDialog onSubmit={onSubmit} />));
    const user = userEvent.setup();
    await user.click(screen.getByRole('button', { name: 'Open names' }));
    const dialog = await dialogTitled('Names');
    await user.click(dialog.getByRole('button', { name: 'Save', hidden: true }));
    expect(await dialog.findByText('Is required.')).toBeInTheDocument();
    expect(onSubmit).not.toHaveBeenCalled();

    await user.type(dialog.getByLabelText('First'), 'Ada');
    await user.click(dialog.getByRole('button', { name: 'Save Ada', hidden: true }));
    expect(await dialog.findByText('Saved Ada')).toBeInTheDocument();
    expect(dialog.getByText('All done.')).toBeInTheDocument();
    expect(dialog.queryByLabelText('First')).not.toBeInTheDocument();
    await user.click(dialog.getByRole('button', { name: 'Done', hidden: true }));
    await waitFor(() => expect(screen.queryByText('Saved Ada')).not.toBeInTheDocument());
  });

  it('should submit the files picked, opened by its caller and without a submit button', async () => {
    const FilesSchema = z.object({ files: z.array(z.instanceof(File)).min(1) });
    const onSubmit = vi.fn();
    const onOpenChange = vi.fn();
    render(
      wrap(
        <FormDialog
          open
          title="Pick files"
          schema={FilesSchema}
          defaultValues={{ files: [] as File[] }}
          submitLabel={null}
          onOpenChange={onOpenChange}
          onSubmit={(output) => onSubmit(output.files.map((file) => file.name))}
        >
          {(form) => (
            <FormFilePicker form={form} name="files" accept="image/jpeg" isMultiple inputLabel="Choose pictures">
              Choose
            </FormFilePicker>
          )}
        </FormDialog>,
      ),
    );
    const dialog = await dialogTitled('Pick files');
    expect(dialog.queryByRole('button', { name: /Save/, hidden: true })).not.toBeInTheDocument();
    fireEvent.change(dialog.getByLabelText('Choose pictures'), { target: { files: [new File(['a'], 'a.jpg', { type: 'image/jpeg' }), new File(['b'], 'b.jpg', { type: 'image/jpeg' })] } });
    await waitFor(() => expect(onSubmit).toHaveBeenCalledWith(['a.jpg', 'b.jpg']));

    await userEvent.setup().click(dialog.getByRole('button', { name: 'Cancel', hidden: true }));
    expect(onOpenChange).toHaveBeenCalledWith(false);
  });
});
