import { Button, Checkbox, Field, Input, makeStyles, MessageBar, MessageBarBody, Radio, RadioGroup, Spinner, Text, Textarea, tokens } from '@fluentui/react-components';
import { Add20Regular, Mail20Regular } from '@fluentui/react-icons';
import { zodResolver } from '@hookform/resolvers/zod';
import { useMemo, useState } from 'react';
import { Controller, useForm, type UseFormReturn } from 'react-hook-form';
import { z } from 'zod';
import { EmailSchema } from '@domain/auth/auth.schema';
import {
  MAX_SEND_RECIPIENTS,
  PdfDeliveryModeSchema,
  SendPacketSchema,
  type SendOptionsResponse,
  type SendPacketInput,
  type SendPacketParsed,
} from '@domain/delivery/delivery.schema';

import { FormDialog, type FormDialogHelpers } from '../../../components/form-dialog';
import { useNotify } from '../../../components/notify';
import { isApiError } from '../../../lib/api-client';
import { describeRequestError } from '../../../lib/form-errors';
import { useSendOptions } from '../api/get-send-options';
import { useSendPacket } from '../api/send-packet';

const MESSAGE_MAX = 1000;

const useStyles = makeStyles({
  control: { minHeight: '44px' },
  surface: { maxWidth: '34rem' },
  fieldset: { border: 'none', margin: 0, padding: 0, display: 'flex', flexDirection: 'column', gap: tokens.spacingVerticalXS, minWidth: 0 },
  legend: { padding: 0, marginBottom: tokens.spacingVerticalXS, fontWeight: tokens.fontWeightSemibold },
  recipient: { display: 'flex', flexDirection: 'column', minWidth: 0, overflowWrap: 'anywhere' },
  muted: { color: tokens.colorNeutralForeground2 },
  addRow: { display: 'flex', gap: tokens.spacingHorizontalS, alignItems: 'flex-end', flexWrap: 'wrap' },
  addInput: { flexGrow: 1, minWidth: '12rem' },
});

/**
 * The form: every recipient offered (the site's homeowners, then added addresses) with its tick, the note
 * and the PDF choice; parsed into the shared SendPacketSchema with the ticked addresses as `to`.
 */
const SendPacketFormSchema = z
  .object({
    recipients: z.array(z.object({ email: z.string(), name: z.string().nullable(), hasAccount: z.boolean().nullable(), isChecked: z.boolean() })),
    message: z.string(),
    pdf: PdfDeliveryModeSchema,
  })
  .transform(({ recipients, message, pdf }): SendPacketInput => {
    const trimmed = message.trim();
    return { to: recipients.filter((r) => r.isChecked).map((r) => r.email), pdf, ...(trimmed ? { message: trimmed } : {}) };
  })
  .pipe(SendPacketSchema);
type SendPacketForm = z.input<typeof SendPacketFormSchema>;
type Recipient = SendPacketForm['recipients'][number];

const EMPTY: SendPacketForm = { recipients: [], message: '', pdf: 'attached' };

/** The site's homeowners come ticked; the PDF is attached when it can be. */
function valuesFrom(options: SendOptionsResponse): SendPacketForm {
  return { recipients: options.homeowners.map((h) => ({ ...h, isChecked: true })), message: '', pdf: options.canAttachPdf ? 'attached' : 'link' };
}

const checkedCount = (values: SendPacketForm) => values.recipients.filter((r) => r.isChecked).length;

function megabytes(bytes: number): string {
  return `${(bytes / 1_048_576).toFixed(1)} MB`;
}

type SendPacketDialogProps = {
  revisionId: string;
  revision: number;
  /** Where the packet is for, in the dialog's title (the site's label). */
  siteLabel?: string;
};

/**
 * "Send to homeowner": the site's homeowners ticked, other addresses addable, an optional note, and
 * the PDF attached or a link only. Recipients without an account are invited to the portal in the
 * same e-mail. The e-mails are queued; their progress shows in the delivery list.
 */
export function SendPacketDialog({ revisionId, revision, siteLabel }: SendPacketDialogProps) {
  const styles = useStyles();
  const notify = useNotify();
  const [open, setOpen] = useState(false);
  const options = useSendOptions(revisionId, { enabled: open });
  const send = useSendPacket();
  const values = useMemo(() => (options.data ? valuesFrom(options.data) : undefined), [options.data]);
  const canAttach = options.data?.canAttachPdf ?? true;

  const submit = async (input: SendPacketParsed, { close, showFieldErrors, showMessage }: FormDialogHelpers<SendPacketForm, SendPacketParsed>) => {
    try {
      const result = await send.mutateAsync({ revisionId, input });
      const count = result.deliveries.length;
      notify.success('Packet on its way', `${count} e-mail${count === 1 ? '' : 's'} queued. Their progress shows under “E-mails to the homeowner”.`);
      close();
    } catch (error) {
      // A refused address is named by its place in the list (`to.1`): say which one.
      const issue = isApiError(error) ? error.issues.find((i) => /^to(\.\d+)?$/.test(i.path)) : undefined;
      const address = issue ? input.to?.[Number(issue.path.split('.')[1])] : undefined;
      if (issue && address) showMessage(`${address} ${issue.message.replace(/\.$/, '')}: untick it to send to the others.`);
      else if (!showFieldErrors(error)) showMessage(describeRequestError(error));
    }
  };

  return (
    <FormDialog
      trigger={
        <Button className={styles.control} icon={<Mail20Regular />}>
          Send to homeowner
        </Button>
      }
      title={`Send revision ${revision}${siteLabel ? ` of ${siteLabel}` : ''}`}
      formLabel="Send the packet"
      schema={SendPacketFormSchema}
      defaultValues={EMPTY}
      values={values}
      submitLabel={(current) => (checkedCount(current) > 1 ? `Send to ${checkedCount(current)} recipients` : 'Send')}
      isSubmitDisabled={(current) => !options.data || checkedCount(current) === 0 || current.message.length > MESSAGE_MAX}
      surfaceClassName={styles.surface}
      onOpenChange={setOpen}
      onSubmit={submit}
    >
      {(form, fieldError) => {
        const recipients = form.watch('recipients');
        const message = form.watch('message');
        return (
          <>
            {options.isPending && <Spinner size="small" label="Loading the site’s homeowners" />}
            {options.isError && (
              <MessageBar intent="error" layout="multiline">
                <MessageBarBody>{describeRequestError(options.error)}</MessageBarBody>
              </MessageBar>
            )}
            {options.data && (
              <>
                <fieldset className={styles.fieldset}>
                  <legend className={styles.legend}>Recipients</legend>
                  {recipients.length === 0 && <Text className={styles.muted}>This site has no homeowner yet: add their e-mail below.</Text>}
                  {recipients.map((r, index) => (
                    <Controller
                      key={r.email}
                      control={form.control}
                      name={`recipients.${index}.isChecked`}
                      render={({ field }) => (
                        <Checkbox
                          ref={field.ref}
                          className={styles.control}
                          checked={field.value}
                          onChange={(_event, data) => field.onChange(data.checked === true)}
                          label={<RecipientLabel recipient={r} />}
                        />
                      )}
                    />
                  ))}
                </fieldset>
                <AddressAdder onAdd={(email) => addRecipient(form, email)} />
                <Controller
                  control={form.control}
                  name="message"
                  render={({ field }) => (
                    <Field
                      label="Message"
                      hint={`Optional, printed in the e-mail. ${MESSAGE_MAX - message.length} characters left.`}
                      validationMessage={fieldError('message') ?? (message.length > MESSAGE_MAX ? `At most ${MESSAGE_MAX} characters.` : undefined)}
                    >
                      <Textarea ref={field.ref} name={field.name} value={field.value} onChange={(_event, data) => field.onChange(data.value)} onBlur={field.onBlur} resize="vertical" />
                    </Field>
                  )}
                />
                <Controller
                  control={form.control}
                  name="pdf"
                  render={({ field }) => (
                    <Field label="The PDF" validationMessage={fieldError('pdf')}>
                      <RadioGroup value={field.value} onChange={(_event, data) => field.onChange(data.value)}>
                        <Radio value="attached" label="Attach the PDF, with a link to the portal" disabled={!canAttach} />
                        <Radio value="link" label="Link to the portal only" />
                      </RadioGroup>
                    </Field>
                  )}
                />
                {!canAttach && (
                  <MessageBar intent="info" layout="multiline">
                    <MessageBarBody>
                      {options.data.pdfBytes !== null
                        ? `This PDF (${megabytes(options.data.pdfBytes)}) is over the ${megabytes(options.data.maxAttachmentBytes)} attachment limit, so the e-mail carries a link to it instead.`
                        : 'This PDF cannot be attached, so the e-mail carries a link to it instead.'}
                    </MessageBarBody>
                  </MessageBar>
                )}
              </>
            )}
          </>
        );
      }}
    </FormDialog>
  );
}

function RecipientLabel({ recipient: r }: { recipient: Recipient }) {
  const styles = useStyles();
  return (
    <span className={styles.recipient}>
      <Text>{r.name ? `${r.name} (${r.email})` : r.email}</Text>
      <Text size={200} className={styles.muted}>
        {r.hasAccount === true
          ? 'Homeowner of this site'
          : r.hasAccount === false
            ? 'Invited, no account yet: the e-mail carries their invitation to the portal'
            : 'Added: linked to this site, or invited to the portal if they have no account'}
      </Text>
    </span>
  );
}

/** Ticks an address already listed, or adds it ticked; a problem to show under the address otherwise. */
function addRecipient(form: UseFormReturn<SendPacketForm, unknown, SendPacketParsed>, email: string): string | undefined {
  const recipients = form.getValues('recipients');
  const at = recipients.findIndex((r) => r.email === email);
  if (at >= 0) {
    form.setValue(`recipients.${at}.isChecked`, true, { shouldDirty: true });
    return undefined;
  }
  if (recipients.length >= MAX_SEND_RECIPIENTS) return `At most ${MAX_SEND_RECIPIENTS} recipients at a time.`;
  form.setValue('recipients', [...recipients, { email, name: null, hasAccount: null, isChecked: true }], { shouldDirty: true });
  return undefined;
}

const NewAddressSchema = z.object({ address: EmailSchema });
const ADDRESS_HINT = 'Enter an e-mail address, like name@example.com.';

/**
 * "Another address" with its Add button: a small form of its own inside the dialog's (no nested <form>:
 * Add and Enter run it), checked with the shared EmailSchema before the address joins the list.
 */
function AddressAdder({ onAdd }: { onAdd: (email: string) => string | undefined }) {
  const styles = useStyles();
  const { control, handleSubmit, setError, clearErrors, reset, formState } = useForm<z.input<typeof NewAddressSchema>, unknown, z.output<typeof NewAddressSchema>>({
    resolver: zodResolver(NewAddressSchema),
    defaultValues: { address: '' },
  });
  const add = handleSubmit(({ address }) => {
    const problem = onAdd(address);
    if (problem) setError('address', { type: 'tooMany', message: problem });
    else reset();
  });
  const error = formState.errors.address;
  return (
    <div className={styles.addRow}>
      <Controller
        control={control}
        name="address"
        render={({ field }) => (
          <Field label="Another address" validationMessage={error && (error.type === 'tooMany' ? error.message : ADDRESS_HINT)} className={styles.addInput}>
            <Input
              ref={field.ref}
              className={styles.control}
              type="email"
              autoComplete="off"
              value={field.value}
              onChange={(_event, data) => {
                field.onChange(data.value);
                clearErrors('address');
              }}
              onBlur={field.onBlur}
              onKeyDown={(event) => {
                if (event.key === 'Enter') {
                  event.preventDefault();
                  void add();
                }
              }}
            />
          </Field>
        )}
      />
      <Button className={styles.control} icon={<Add20Regular />} onClick={() => void add()}>
        Add
      </Button>
    </div>
  );
}
