import {
  Button,
  Checkbox,
  Dialog,
  DialogActions,
  DialogBody,
  DialogContent,
  DialogSurface,
  DialogTitle,
  DialogTrigger,
  Field,
  Input,
  makeStyles,
  MessageBar,
  MessageBarBody,
  Radio,
  RadioGroup,
  Spinner,
  Text,
  Textarea,
  tokens,
} from '@fluentui/react-components';
import { Add20Regular, Mail20Regular } from '@fluentui/react-icons';
import { useState } from 'react';
import { EmailSchema } from '@domain/auth/auth.schema';
import { MAX_SEND_RECIPIENTS, type PdfDeliveryMode } from '@domain/delivery/delivery.schema';

import { useNotify } from '../../../components/notify';
import { isApiError } from '../../../lib/api-client';
import { describeRequestError } from '../../../lib/form-errors';
import { useSendOptions, useSendPacket } from '../api/deliveries';

const MESSAGE_MAX = 1000;

const useStyles = makeStyles({
  control: { minHeight: '44px' },
  surface: { maxWidth: '34rem' },
  form: { display: 'flex', flexDirection: 'column', gap: tokens.spacingVerticalL },
  fieldset: { border: 'none', margin: 0, padding: 0, display: 'flex', flexDirection: 'column', gap: tokens.spacingVerticalXS, minWidth: 0 },
  legend: { padding: 0, marginBottom: tokens.spacingVerticalXS, fontWeight: tokens.fontWeightSemibold },
  recipient: { display: 'flex', flexDirection: 'column', minWidth: 0, overflowWrap: 'anywhere' },
  muted: { color: tokens.colorNeutralForeground2 },
  addRow: { display: 'flex', gap: tokens.spacingHorizontalS, alignItems: 'flex-end', flexWrap: 'wrap' },
  addInput: { flexGrow: 1, minWidth: '12rem' },
});

type Recipient = { email: string; name: string | null; hasAccount: boolean | null; isChecked: boolean };

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
  const [open, setOpen] = useState(false);
  return (
    <Dialog open={open} onOpenChange={(_event, data) => setOpen(data.open)}>
      <DialogTrigger disableButtonEnhancement>
        <Button className={styles.control} icon={<Mail20Regular />}>
          Send to homeowner
        </Button>
      </DialogTrigger>
      <DialogSurface className={styles.surface}>
        {open && <SendPacketForm revisionId={revisionId} revision={revision} siteLabel={siteLabel} onDone={() => setOpen(false)} />}
      </DialogSurface>
    </Dialog>
  );
}

function SendPacketForm({ revisionId, revision, siteLabel, onDone }: SendPacketDialogProps & { onDone: () => void }) {
  const styles = useStyles();
  const notify = useNotify();
  const options = useSendOptions(revisionId);
  const send = useSendPacket();
  // The site's homeowners come ticked; the list is built once, when the options arrive.
  const [added, setAdded] = useState<Recipient[]>([]);
  const [unticked, setUnticked] = useState<ReadonlySet<string>>(new Set());
  const [newAddress, setNewAddress] = useState('');
  const [addressError, setAddressError] = useState<string | undefined>();
  const [message, setMessage] = useState('');
  const [pdfChoice, setPdfChoice] = useState<PdfDeliveryMode>('attached');
  const [failure, setFailure] = useState<string | undefined>();

  const homeowners: Recipient[] = (options.data?.homeowners ?? []).map((h) => ({ ...h, isChecked: !unticked.has(h.email) }));
  const recipients = [...homeowners, ...added];
  const chosen = recipients.filter((r) => r.isChecked).map((r) => r.email);
  const canAttach = options.data?.canAttachPdf ?? true;
  const pdf: PdfDeliveryMode = canAttach ? pdfChoice : 'link';

  const toggle = (email: string, isChecked: boolean) => {
    if (added.some((r) => r.email === email)) {
      setAdded((list) => list.map((r) => (r.email === email ? { ...r, isChecked } : r)));
      return;
    }
    setUnticked((set) => {
      const next = new Set(set);
      if (isChecked) next.delete(email);
      else next.add(email);
      return next;
    });
  };

  const addAddress = () => {
    const parsed = EmailSchema.safeParse(newAddress);
    if (!parsed.success) {
      setAddressError('Enter an e-mail address, like name@example.com.');
      return;
    }
    const email = parsed.data;
    if (recipients.some((r) => r.email === email)) {
      toggle(email, true);
    } else if (recipients.length >= MAX_SEND_RECIPIENTS) {
      setAddressError(`At most ${MAX_SEND_RECIPIENTS} recipients at a time.`);
      return;
    } else {
      setAdded((list) => [...list, { email, name: null, hasAccount: null, isChecked: true }]);
    }
    setNewAddress('');
    setAddressError(undefined);
  };

  const submit = async () => {
    setFailure(undefined);
    try {
      const trimmed = message.trim();
      const result = await send.mutateAsync({ revisionId, input: { to: chosen, pdf, ...(trimmed ? { message: trimmed } : {}) } });
      const count = result.deliveries.length;
      notify.success('Packet on its way', `${count} e-mail${count === 1 ? '' : 's'} queued. Their progress shows under “E-mails to the homeowner”.`);
      onDone();
    } catch (error) {
      // A refused address is named by its place in the list (`to.1`): say which one.
      const issue = isApiError(error) ? error.issues.find((i) => /^to(\.\d+)?$/.test(i.path)) : undefined;
      const index = issue ? Number(issue.path.split('.')[1]) : Number.NaN;
      setFailure(issue && !Number.isNaN(index) && chosen[index] ? `${chosen[index]} ${issue.message.replace(/\.$/, '')}: untick it to send to the others.` : describeRequestError(error));
    }
  };

  return (
    <form
      aria-label="Send the packet"
      noValidate
      onSubmit={(event) => {
        event.preventDefault();
        void submit();
      }}
    >
      <DialogBody>
        <DialogTitle>
          Send revision {revision}
          {siteLabel ? ` of ${siteLabel}` : ''}
        </DialogTitle>
        <DialogContent className={styles.form}>
          {failure && (
            <MessageBar intent="error" layout="multiline">
              <MessageBarBody>{failure}</MessageBarBody>
            </MessageBar>
          )}
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
                {recipients.map((r) => (
                  <Checkbox
                    key={r.email}
                    className={styles.control}
                    checked={r.isChecked}
                    onChange={(_event, data) => toggle(r.email, data.checked === true)}
                    label={
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
                    }
                  />
                ))}
              </fieldset>
              <div className={styles.addRow}>
                <Field label="Another address" validationMessage={addressError} className={styles.addInput}>
                  <Input
                    className={styles.control}
                    type="email"
                    autoComplete="off"
                    value={newAddress}
                    onChange={(_event, data) => {
                      setNewAddress(data.value);
                      setAddressError(undefined);
                    }}
                    onKeyDown={(event) => {
                      if (event.key === 'Enter') {
                        event.preventDefault();
                        addAddress();
                      }
                    }}
                  />
                </Field>
                <Button className={styles.control} icon={<Add20Regular />} onClick={addAddress}>
                  Add
                </Button>
              </div>
              <Field
                label="Message"
                hint={`Optional, printed in the e-mail. ${MESSAGE_MAX - message.length} characters left.`}
                validationMessage={message.length > MESSAGE_MAX ? `At most ${MESSAGE_MAX} characters.` : undefined}
              >
                <Textarea value={message} onChange={(_event, data) => setMessage(data.value)} resize="vertical" />
              </Field>
              <Field label="The PDF">
                <RadioGroup value={pdf} onChange={(_event, data) => setPdfChoice(data.value as PdfDeliveryMode)}>
                  <Radio value="attached" label="Attach the PDF, with a link to the portal" disabled={!canAttach} />
                  <Radio value="link" label="Link to the portal only" />
                </RadioGroup>
              </Field>
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
        </DialogContent>
        <DialogActions fluid>
          <Button className={styles.control} disabled={send.isPending} onClick={onDone}>
            Cancel
          </Button>
          <Button
            type="submit"
            appearance="primary"
            className={styles.control}
            disabled={send.isPending || !options.data || chosen.length === 0 || message.length > MESSAGE_MAX}
            icon={send.isPending ? <Spinner size="tiny" /> : undefined}
          >
            {chosen.length > 1 ? `Send to ${chosen.length} recipients` : 'Send'}
          </Button>
        </DialogActions>
      </DialogBody>
    </form>
  );
}
