import {
  Button,
  Dialog,
  DialogActions,
  DialogBody,
  DialogContent,
  DialogSurface,
  DialogTitle,
  DialogTrigger,
  Field,
  Input,
  type InputProps,
  makeStyles,
  MessageBar,
  MessageBarBody,
  Spinner,
  Textarea,
  tokens,
} from '@fluentui/react-components';
import { zodResolver } from '@hookform/resolvers/zod';
import { useState, type ReactElement, type ReactNode } from 'react';
import { Controller, useForm, type DefaultValues, type FieldValues, type Path, type UseFormReturn } from 'react-hook-form';
import type { z } from 'zod';

import { fieldErrorsFromApi, toSentence } from '../lib/form-errors';

const useStyles = makeStyles({
  form: { display: 'flex', flexDirection: 'column', gap: tokens.spacingVerticalL },
  action: { minHeight: '48px' },
  control: { minHeight: '48px' },
});

/** What a submit handler may do with the dialog. */
export type FormDialogHelpers<TValues extends FieldValues, TOutput> = {
  /** Closes the dialog (after a save); the next open starts from the default values again. */
  close: () => void;
  /** Puts the API's validation issues under their fields; false when the error named no field of the form. */
  showFieldErrors: (error: unknown) => boolean;
  /** A message about the whole form, shown above the fields (a failed request no field explains). */
  showMessage: (message: string) => void;
  /** Validates and submits the form again as it is now (e.g. to keep one's change after an edit conflict). */
  submitAgain: () => void;
  form: UseFormReturn<TValues, unknown, TOutput>;
};

type FormDialogProps<TValues extends FieldValues, TOutput> = {
  /** The button that opens the dialog. */
  trigger: ReactElement;
  title: ReactNode;
  /**
   * Parses the form's values into the request: the shared schema from `@domain/*`, piped after whatever
   * turns the form's strings into it ('' → null) and words the usual mistakes for people.
   */
  schema: z.ZodType<TOutput, TValues>;
  defaultValues: TValues;
  /** Called with the parsed request once every field is valid. */
  onSubmit: (output: TOutput, helpers: FormDialogHelpers<TValues, TOutput>) => void;
  /** While the request runs: the buttons are disabled and the dialog cannot be closed. */
  isPending: boolean;
  submitLabel?: string;
  surfaceClassName?: string;
  /** Inside the surface, after the form: e.g. the dialog that resolves an edit conflict. */
  after?: ReactNode;
  /** When the dialog opens or closes (saved or cancelled): e.g. to load choices only while open. */
  onOpenChange?: (open: boolean) => void;
  /** The fields. `fieldError(name)` is the message to show under that field, as a sentence. */
  children: (form: UseFormReturn<TValues, unknown, TOutput>, fieldError: (name: Path<TValues>) => string | undefined) => ReactNode;
};

/**
 * The create/edit dialog of a record: a trigger button, a title, fields on react-hook-form validated by
 * a zod schema, Cancel and a submit button. One skeleton for every such dialog, so they look, validate
 * and report errors (field issues under the fields, anything else above them) the same way.
 */
export function FormDialog<TValues extends FieldValues, TOutput>({
  trigger,
  title,
  schema,
  defaultValues,
  onSubmit,
  isPending,
  submitLabel = 'Save',
  surfaceClassName,
  after,
  onOpenChange,
  children,
}: FormDialogProps<TValues, TOutput>) {
  const styles = useStyles();
  const [open, setOpen] = useState(false);
  const [message, setMessage] = useState<string | undefined>();
  const form = useForm<TValues, unknown, TOutput>({
    resolver: zodResolver(schema),
    defaultValues: defaultValues as DefaultValues<TValues>,
  });

  const setOpenState = (next: boolean) => {
    if (next) {
      // Each opening starts from the record as it is now, not from an earlier cancelled edit.
      form.reset(defaultValues);
      setMessage(undefined);
    }
    setOpen(next);
    onOpenChange?.(next);
  };

  const helpers: FormDialogHelpers<TValues, TOutput> = {
    close: () => setOpenState(false),
    showFieldErrors: (error) => {
      const found = Object.entries(fieldErrorsFromApi<string>(error)).filter(([name]) => name in defaultValues);
      for (const [name, text] of found) form.setError(name as Path<TValues>, { message: text });
      return found.length > 0;
    },
    showMessage: setMessage,
    submitAgain: () => void submit(),
    form,
  };

  const submit = form.handleSubmit((output) => {
    setMessage(undefined);
    onSubmit(output, helpers);
  });

  const fieldError = (name: Path<TValues>): string | undefined => {
    const error = form.formState.errors[name];
    const text = typeof error?.message === 'string' ? error.message : undefined;
    return text ? toSentence(text) : undefined;
  };

  return (
    <Dialog open={open} onOpenChange={(_event, data) => !isPending && setOpenState(data.open)}>
      <DialogTrigger disableButtonEnhancement>{trigger}</DialogTrigger>
      <DialogSurface className={surfaceClassName}>
        <form onSubmit={(event) => void submit(event)} noValidate>
          <DialogBody>
            <DialogTitle>{title}</DialogTitle>
            <DialogContent className={styles.form}>
              {message && (
                <MessageBar intent="error" layout="multiline">
                  <MessageBarBody>{message}</MessageBarBody>
                </MessageBar>
              )}
              {children(form, fieldError)}
            </DialogContent>
            <DialogActions fluid>
              <DialogTrigger disableButtonEnhancement>
                <Button className={styles.action} disabled={isPending}>
                  Cancel
                </Button>
              </DialogTrigger>
              <Button
                type="submit"
                appearance="primary"
                className={styles.action}
                disabled={isPending}
                icon={isPending ? <Spinner size="tiny" /> : undefined}
              >
                {submitLabel}
              </Button>
            </DialogActions>
          </DialogBody>
        </form>
        {after}
      </DialogSurface>
    </Dialog>
  );
}

type FormTextFieldProps<TValues extends FieldValues, TOutput> = {
  form: UseFormReturn<TValues, unknown, TOutput>;
  name: Path<TValues>;
  label: string;
  /** From FormDialog's `fieldError(name)`. */
  error: string | undefined;
  required?: boolean;
  hint?: string;
  /** A Textarea instead of a one-line Input. */
  isMultiline?: boolean;
} & Pick<InputProps, 'type' | 'inputMode' | 'placeholder' | 'autoComplete' | 'autoCapitalize' | 'spellCheck'>;

/** A labelled text field of a FormDialog, bound to the form by name. */
export function FormTextField<TValues extends FieldValues, TOutput>({
  form,
  name,
  label,
  error,
  required,
  hint,
  isMultiline,
  ...inputProps
}: FormTextFieldProps<TValues, TOutput>) {
  const styles = useStyles();
  return (
    <Controller
      control={form.control}
      name={name}
      render={({ field }) => (
        <Field label={label} required={required} hint={error ? undefined : hint} validationMessage={error}>
          {isMultiline ? (
            <Textarea ref={field.ref} name={name} value={field.value} onChange={(_e, d) => field.onChange(d.value)} onBlur={field.onBlur} />
          ) : (
            <Input
              ref={field.ref}
              name={name}
              className={styles.control}
              value={field.value}
              onChange={(_e, d) => field.onChange(d.value)}
              onBlur={field.onBlur}
              {...inputProps}
            />
          )}
        </Field>
      )}
    />
  );
}
