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
  type ButtonProps,
  type InputProps,
  makeStyles,
  MessageBar,
  MessageBarBody,
  Spinner,
  Textarea,
  tokens,
} from '@fluentui/react-components';
import { zodResolver } from '@hookform/resolvers/zod';
import { createContext, useContext, useLayoutEffect, useRef, useState, type ChangeEvent, type ReactElement, type ReactNode } from 'react';
import { Controller, get, useForm, type DefaultValues, type FieldValues, type Path, type PathValue, type UseFormReturn } from 'react-hook-form';
import type { z } from 'zod';

import { fieldErrorsFromApi, toSentence } from '../lib/form-errors';

const useStyles = makeStyles({
  form: { display: 'flex', flexDirection: 'column', gap: tokens.spacingVerticalL },
  action: { minHeight: '48px' },
  control: { minHeight: '48px' },
  hidden: { position: 'absolute', width: '1px', height: '1px', opacity: 0, overflow: 'hidden', pointerEvents: 'none' },
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

/**
 * A step of the dialog without a form, shown in place of the fields: the record read-only (someone who
 * may not change it), or what a submit made (an issued revision's warnings, a link shown once).
 */
export type FormDialogView = {
  title: ReactNode;
  content: ReactNode;
  /** The one button, which closes the dialog. */
  closeLabel?: string;
};

type FormDialogProps<TValues extends FieldValues, TOutput> = {
  /** The button that opens the dialog; none when the caller opens it (`open`). */
  trigger?: ReactElement;
  /** Opened by the caller instead of a trigger: each opening starts from the default values again. */
  open?: boolean;
  title: ReactNode;
  /**
   * Parses the form's values into the request: the shared schema from `@domain/*`, piped after whatever
   * turns the form's strings into it ('' → null) and words the usual mistakes for people.
   */
  schema: z.ZodType<TOutput, TValues>;
  defaultValues: TValues;
  /**
   * Values known only after opening (a list the dialog loads): the form takes them when they arrive,
   * keeping any field the person already changed; each later opening starts from them.
   */
  values?: TValues;
  /**
   * Called with the parsed request once every field is valid. A promise keeps the dialog busy (buttons
   * disabled, not closable) until it settles.
   */
  onSubmit: (output: TOutput, helpers: FormDialogHelpers<TValues, TOutput>) => void | Promise<void>;
  /** While the request runs: the buttons are disabled and the dialog cannot be closed. */
  isPending?: boolean;
  /**
   * The submit button's label, or a label from the values as they are (a count); `null` for no submit
   * button, when a field submits the form itself (`FormFilePicker`).
   */
  submitLabel?: string | ((values: TValues) => string) | null;
  /** Holds the submit button back while the values say the request cannot go yet (nobody chosen). */
  isSubmitDisabled?: (values: TValues) => boolean;
  cancelLabel?: string;
  /** The form's accessible name, when the title is not a plain string. */
  formLabel?: string;
  /** A step without a form shown instead of the fields (see `FormDialogView`). */
  view?: FormDialogView;
  surfaceClassName?: string;
  /** Inside the surface, after the form: e.g. the dialog that resolves an edit conflict. */
  after?: ReactNode;
  /** When the dialog opens or closes (saved or cancelled): e.g. to load choices only while open. */
  onOpenChange?: (open: boolean) => void;
  /** The fields. `fieldError(name)` is the message to show under that field, as a sentence. */
  children: (form: UseFormReturn<TValues, unknown, TOutput>, fieldError: (name: Path<TValues>) => string | undefined) => ReactNode;
};

/** What a field inside a FormDialog may do with the dialog itself (a file picker submits on its own). */
type FormDialogContextValue = { submit: () => void; isPending: boolean };
const FormDialogContext = createContext<FormDialogContextValue | undefined>(undefined);

/**
 * The create/edit dialog of a record: a trigger button, a title, fields on react-hook-form validated by
 * a zod schema, Cancel and a submit button. One skeleton for every such dialog, so they look, validate
 * and report errors (field issues under the fields, anything else above them) the same way.
 */
export function FormDialog<TValues extends FieldValues, TOutput>({
  trigger,
  open: openProp,
  title,
  schema,
  defaultValues,
  values,
  onSubmit,
  isPending: isRequestPending = false,
  submitLabel = 'Save',
  isSubmitDisabled,
  cancelLabel = 'Cancel',
  formLabel,
  view,
  surfaceClassName,
  after,
  onOpenChange,
  children,
}: FormDialogProps<TValues, TOutput>) {
  const styles = useStyles();
  const [ownOpen, setOwnOpen] = useState(false);
  const isControlled = openProp !== undefined;
  const open = openProp ?? ownOpen;
  const [message, setMessage] = useState<string | undefined>();
  const form = useForm<TValues, unknown, TOutput>({
    resolver: zodResolver(schema),
    defaultValues: defaultValues as DefaultValues<TValues>,
    values,
    // Values that arrive later keep what the person already changed (an opening still starts fresh).
    resetOptions: values ? { keepDirtyValues: true } : undefined,
  });
  const isPending = isRequestPending || form.formState.isSubmitting;

  // Each opening starts from the record as it is now, not from an earlier cancelled edit.
  const startFresh = () => {
    form.reset(values ?? defaultValues, { keepDirtyValues: false });
    setMessage(undefined);
  };
  const startFreshRef = useRef(startFresh);
  startFreshRef.current = startFresh;
  // Opened by the caller: start fresh before the first paint of the opened dialog.
  useLayoutEffect(() => {
    if (isControlled && open) startFreshRef.current();
  }, [isControlled, open]);

  const setOpenState = (next: boolean) => {
    if (!isControlled) {
      if (next) startFresh();
      setOwnOpen(next);
    }
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

  const submit = form.handleSubmit(async (output) => {
    setMessage(undefined);
    await onSubmit(output, helpers);
  });

  const fieldError = (name: Path<TValues>): string | undefined => {
    // A nested field (`findings.1.reason`) has its error nested the same way.
    const error: unknown = get(form.formState.errors, name);
    const text = error && typeof error === 'object' && 'message' in error && typeof error.message === 'string' ? error.message : undefined;
    return text ? toSentence(text) : undefined;
  };

  // The values as they are now, only for a label or a hold that depends on them (re-renders on each change).
  const current = typeof submitLabel === 'function' || isSubmitDisabled ? form.watch() : undefined;
  const label = typeof submitLabel === 'function' ? submitLabel(current as TValues) : submitLabel;

  const surface = (
    <DialogSurface className={surfaceClassName}>
      {view ? (
        <DialogBody>
          <DialogTitle>{view.title}</DialogTitle>
          <DialogContent className={styles.form}>{view.content}</DialogContent>
          <DialogActions fluid>
            <DialogTrigger disableButtonEnhancement>
              <Button appearance="primary" className={styles.action}>
                {view.closeLabel ?? 'Close'}
              </Button>
            </DialogTrigger>
          </DialogActions>
        </DialogBody>
      ) : (
        <form onSubmit={(event) => void submit(event)} noValidate aria-label={formLabel}>
          <DialogBody>
            <DialogTitle>{title}</DialogTitle>
            <DialogContent className={styles.form}>
              {message && (
                <MessageBar intent="error" layout="multiline">
                  <MessageBarBody>{message}</MessageBarBody>
                </MessageBar>
              )}
              <FormDialogContext.Provider value={{ submit: () => void submit(), isPending }}>{children(form, fieldError)}</FormDialogContext.Provider>
            </DialogContent>
            <DialogActions fluid>
              <DialogTrigger disableButtonEnhancement>
                <Button className={styles.action} disabled={isPending}>
                  {cancelLabel}
                </Button>
              </DialogTrigger>
              {label !== null && (
                <Button
                  type="submit"
                  appearance="primary"
                  className={styles.action}
                  disabled={isPending || (isSubmitDisabled?.(current as TValues) ?? false)}
                  icon={isPending ? <Spinner size="tiny" /> : undefined}
                >
                  {label}
                </Button>
              )}
            </DialogActions>
          </DialogBody>
        </form>
      )}
      {after}
    </DialogSurface>
  );
  const onDialogOpenChange = (_event: unknown, data: { open: boolean }) => !isPending && setOpenState(data.open);

  // Fluent's Dialog takes the trigger and the surface, or the surface alone when the caller opens it.
  return trigger ? (
    <Dialog open={open} onOpenChange={onDialogOpenChange}>
      <DialogTrigger disableButtonEnhancement>{trigger}</DialogTrigger>
      {surface}
    </Dialog>
  ) : (
    <Dialog open={open} onOpenChange={onDialogOpenChange}>
      {surface}
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
} & Pick<InputProps, 'type' | 'inputMode' | 'placeholder' | 'autoComplete' | 'autoCapitalize' | 'spellCheck' | 'min' | 'max' | 'maxLength'>;

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
            <Textarea
              ref={field.ref}
              name={name}
              value={field.value}
              maxLength={inputProps.maxLength}
              onChange={(_e, d) => field.onChange(d.value)}
              onBlur={field.onBlur}
            />
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

type FormFilePickerProps<TValues extends FieldValues, TOutput> = {
  form: UseFormReturn<TValues, unknown, TOutput>;
  /** The field that holds the picked files (`File[]`). */
  name: Path<TValues>;
  /** The visible button's text. */
  children: ReactNode;
  /** The hidden file input's accessible name (what the button does). */
  inputLabel: string;
  accept: string;
  /** Opens the camera on a phone instead of the library. */
  capture?: 'environment' | 'user';
  isMultiple?: boolean;
} & Pick<ButtonProps, 'appearance' | 'icon' | 'className'>;

/**
 * A file field of a FormDialog: a big button that opens the device's picker (or camera); picking files
 * puts them in the field and submits the form at once, so the dialog needs no submit button
 * (`submitLabel={null}`). Disabled while the dialog is busy with the previous pick.
 */
export function FormFilePicker<TValues extends FieldValues, TOutput>({
  form,
  name,
  children,
  inputLabel,
  accept,
  capture,
  isMultiple,
  ...buttonProps
}: FormFilePickerProps<TValues, TOutput>) {
  const styles = useStyles();
  const dialog = useContext(FormDialogContext);
  const inputRef = useRef<HTMLInputElement>(null);
  const onChange = (event: ChangeEvent<HTMLInputElement>) => {
    const picked = [...(event.target.files ?? [])];
    // The same file may be picked again later (after a problem with it).
    event.target.value = '';
    if (picked.length === 0) return;
    form.setValue(name, picked as PathValue<TValues, Path<TValues>>, { shouldDirty: true });
    dialog?.submit();
  };
  return (
    <>
      <Button {...buttonProps} disabled={dialog?.isPending} onClick={() => inputRef.current?.click()}>
        {children}
      </Button>
      <input
        ref={inputRef}
        className={styles.hidden}
        type="file"
        name={name}
        accept={accept}
        capture={capture}
        multiple={isMultiple}
        tabIndex={-1}
        aria-label={inputLabel}
        onChange={onChange}
      />
    </>
  );
}
