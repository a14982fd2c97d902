import { Button, Checkbox, Field, Input, MessageBar, MessageBarBody, Select, Text, Textarea } from '@fluentui/react-components';
import { Add24Regular, CheckmarkCircle20Regular, Delete20Regular, Warning20Filled } from '@fluentui/react-icons';
import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { Controller } from 'react-hook-form';
import { z } from 'zod';
import { CheckInputSchema, type CheckInput } from '@domain/jobs/job-record.schema';

import { useNotify } from '../../../components/notify';
import { useDraftForm } from '../../../lib/drafts';
import { toSentence } from '../../../lib/form-errors';
import type { JobAsBuiltResponse } from '../../job-record';
import { useJobWriter } from '../hooks/job-writer';
import { checkDeleteRequest } from '../utils/delete-requests';
import { fieldDomId } from '../utils/finding-target';
import { saveErrors } from '../utils/save-errors';

import { useCardStyles } from '../../../components/card-styles';
import { useDeleteRecord } from './delete-record';
import { useFormStyles } from '../../../components/form-styles';

/** The check as typed: the channel as "amplifier|channel", numbers as text. */
type CheckDraft = {
  channel: string;
  quantity: 'dc_resistance' | 'impedance';
  measuredOhm: string;
  frequencyHz: string;
  isPolarityOk: boolean;
  isInsulationOk: boolean;
  notes: string;
};

const EMPTY_CHECK: CheckDraft = {
  channel: '',
  quantity: 'dc_resistance',
  measuredOhm: '',
  frequencyHz: '',
  // Nothing is ticked for the lead: a pass is recorded only when it was looked at.
  isPolarityOk: false,
  isInsulationOk: false,
  notes: '',
};
type CheckBody = Omit<CheckInput, 'id'>;
const CHECK_FIELDS = ['channel', 'quantity', 'measuredOhm', 'frequencyHz', 'notes'] as const;

/** Reads the typed check into the shared domain shape and checks it against the shared schema; problems land under their field. */
const CheckFormSchema = z
  .object({
    channel: z.string(),
    quantity: z.enum(['dc_resistance', 'impedance']),
    measuredOhm: z.string(),
    frequencyHz: z.string(),
    isPolarityOk: z.boolean(),
    isInsulationOk: z.boolean(),
    notes: z.string(),
  })
  .transform((draft, ctx): CheckBody => {
    if (draft.channel === '') {
      ctx.addIssue({ code: 'custom', path: ['channel'], message: 'Choose the channel you measured.' });
      return z.NEVER;
    }
    const [amplifierItemId = '', channelId = ''] = draft.channel.split('|');
    const parsed = CheckInputSchema.safeParse({
      channel: { amplifierItemId, channelId },
      quantity: draft.quantity,
      measuredOhm: draft.measuredOhm.trim() === '' ? undefined : Number(draft.measuredOhm.replace(',', '.')),
      frequencyHz: draft.quantity === 'impedance' && draft.frequencyHz.trim() !== '' ? Number(draft.frequencyHz) : undefined,
      isPolarityOk: draft.isPolarityOk,
      isInsulationOk: draft.isInsulationOk,
      notes: draft.notes.trim() === '' ? undefined : draft.notes,
    });
    if (parsed.success) {
      // The server assigns the id; the schema's placeholder is not sent.
      const { id: _id, ...body } = parsed.data;
      return body;
    }
    for (const issue of parsed.error.issues) {
      const field = String(issue.path[0] ?? 'channel');
      ctx.addIssue({ code: 'custom', path: [(CHECK_FIELDS as readonly string[]).includes(field) ? field : 'channel'], message: toSentence(issue.message) });
    }
    return z.NEVER;
  });

/** Commissioning checks: a reading per channel compared with what the wiring should measure. */
export function ChecksSection({ data, canAddField }: { data: JobAsBuiltResponse; canAddField: boolean }) {
  const styles = useCardStyles();
  const formStyles = useFormStyles();
  const notify = useNotify();
  const writer = useJobWriter();
  const deletion = useDeleteRecord();
  const { asBuilt, analysis, job } = data;
  const draftKey = `job:${job.id}:check:new`;
  const [isAdding, setIsAdding] = useState(false);
  const [message, setMessage] = useState<string | undefined>();
  const { form, hasDraft, clear } = useDraftForm<CheckDraft, CheckBody>(draftKey, EMPTY_CHECK, zodResolver(CheckFormSchema));
  const quantity = form.watch('quantity');
  const channels = asBuilt.items.flatMap((item) =>
    item.kind === 'amplifier' ? item.channels.map((c) => ({ key: `${item.id}|${c.id}`, label: `${item.label} · ${c.name}` })) : [],
  );
  const channelLabel = (ref: { amplifierItemId: string; channelId: string }) =>
    channels.find((c) => c.key === `${ref.amplifierItemId}|${ref.channelId}`)?.label ?? 'Unknown channel';

  const add = form.handleSubmit(async (body) => {
    setMessage(undefined);
    try {
      const outcome = await writer.save({ endpoint: 'createCheck', params: {}, body, draftKey, label: `Check of ${channelLabel(body.channel)}` });
      if (outcome === 'saved') notify.success('Check saved');
      setIsAdding(false);
    } catch (failure) {
      const { fields, message: text } = saveErrors(failure);
      for (const [field, fieldMessage] of Object.entries(fields)) {
        if ((CHECK_FIELDS as readonly string[]).includes(field)) form.setError(field as (typeof CHECK_FIELDS)[number], { message: fieldMessage });
      }
      setMessage(text);
    }
  });

  return (
    <section aria-labelledby="section-checks" className={formStyles.form}>
      <div className={styles.sectionHead}>
        <Text as="h3" id="section-checks" size={500} weight="semibold" className={styles.title}>
          Commissioning checks ({asBuilt.checks.length})
        </Text>
        {canAddField && !isAdding && channels.length > 0 && (
          <Button appearance="primary" className={formStyles.bigButton} icon={<Add24Regular />} onClick={() => setIsAdding(true)}>
            Add check
          </Button>
        )}
      </div>
      {(isAdding || hasDraft) && canAddField && (
        <form className={`${styles.card}`} onSubmit={(event) => void add(event)} noValidate aria-label="New check">
          {message && (
            <MessageBar intent="error">
              <MessageBarBody>{message}</MessageBarBody>
            </MessageBar>
          )}
          <div className={formStyles.grid}>
            <Controller
              control={form.control}
              name="channel"
              render={({ field, fieldState }) => (
                <Field label="Channel" required validationMessage={fieldState.error?.message}>
                  <Select ref={field.ref} className={formStyles.control} value={field.value} onChange={(_e, d) => field.onChange(d.value)} onBlur={field.onBlur}>
                    <option value="">Choose…</option>
                    {channels.map((c) => (
                      <option key={c.key} value={c.key}>
                        {c.label}
                      </option>
                    ))}
                  </Select>
                </Field>
              )}
            />
            <Controller
              control={form.control}
              name="quantity"
              render={({ field }) => (
                <Field label="Measured">
                  <Select className={formStyles.control} value={field.value} onChange={(_e, d) => field.onChange(d.value)} onBlur={field.onBlur}>
                    <option value="dc_resistance">DC resistance (meter)</option>
                    <option value="impedance">Impedance (impedance meter)</option>
                  </Select>
                </Field>
              )}
            />
            <Controller
              control={form.control}
              name="measuredOhm"
              render={({ field, fieldState }) => (
                <Field label="Reading (Ω)" required validationMessage={fieldState.error?.message}>
                  <Input ref={field.ref} className={formStyles.control} inputMode="decimal" value={field.value} onChange={(_e, d) => field.onChange(d.value)} onBlur={field.onBlur} />
                </Field>
              )}
            />
            {quantity === 'impedance' && (
              <Controller
                control={form.control}
                name="frequencyHz"
                render={({ field, fieldState }) => (
                  <Field label="At (Hz)" validationMessage={fieldState.error?.message}>
                    <Input className={formStyles.control} inputMode="decimal" value={field.value} placeholder="e.g. 1000" onChange={(_e, d) => field.onChange(d.value)} onBlur={field.onBlur} />
                  </Field>
                )}
              />
            )}
            <Controller
              control={form.control}
              name="isPolarityOk"
              render={({ field }) => (
                <Checkbox className={formStyles.control} checked={field.value} onChange={(_e, d) => field.onChange(d.checked === true)} label="Polarity correct at every speaker" />
              )}
            />
            <Controller
              control={form.control}
              name="isInsulationOk"
              render={({ field }) => (
                <Checkbox className={formStyles.control} checked={field.value} onChange={(_e, d) => field.onChange(d.checked === true)} label="No short to ground or between pairs" />
              )}
            />
            <Controller
              control={form.control}
              name="notes"
              render={({ field, fieldState }) => (
                <Field label="Notes" className={formStyles.wide} validationMessage={fieldState.error?.message}>
                  <Textarea value={field.value} onChange={(_e, d) => field.onChange(d.value)} onBlur={field.onBlur} resize="vertical" />
                </Field>
              )}
            />
          </div>
          <div className={formStyles.actions}>
            <Button type="submit" appearance="primary" className={formStyles.bigButton} disabled={form.formState.isSubmitting}>
              Save check
            </Button>
            <Button
              className={formStyles.bigButton}
              onClick={() => {
                clear();
                setIsAdding(false);
              }}
            >
              {hasDraft ? 'Discard' : 'Cancel'}
            </Button>
          </div>
        </form>
      )}
      {asBuilt.checks.length === 0 ? (
        <Text as="p" className={styles.empty}>
          No checks yet. Measure each channel at the amplifier end with the amplifier disconnected.
        </Text>
      ) : (
        <ul className={styles.list} aria-label="Checks">
          {asBuilt.checks.map((check) => {
            const result = analysis.checks.find((r) => r.checkId === check.id);
            return (
              <li key={check.id} className={styles.card} id={fieldDomId(check.id, 'measuredOhm')} tabIndex={-1}>
                <div className={styles.header}>
                  <Text weight="semibold" size={400}>
                    {channelLabel(check.channel)}: {check.measuredOhm} Ω {check.quantity === 'impedance' ? 'impedance' : 'DC'}
                  </Text>
                  {canAddField && (
                    <Button
                      appearance="subtle"
                      className={formStyles.button}
                      icon={<Delete20Regular />}
                      aria-label={`Delete the check of ${channelLabel(check.channel)}`}
                      onClick={() => deletion.ask(checkDeleteRequest(check, `of ${channelLabel(check.channel)} (${check.measuredOhm} Ω)`))}
                    />
                  )}
                </div>
                {result && (
                  <Text className={result.status === 'ok' ? styles.ok : result.status === 'not_comparable' ? undefined : styles.warn}>
                    {result.status === 'ok' ? <CheckmarkCircle20Regular aria-hidden /> : result.status === 'not_comparable' ? null : <Warning20Filled aria-hidden />}{' '}
                    {result.explanation}
                  </Text>
                )}
              </li>
            );
          })}
        </ul>
      )}
      {deletion.dialog}
    </section>
  );
}
