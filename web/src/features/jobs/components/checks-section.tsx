import { Button, Checkbox, Field, Input, MessageBar, MessageBarBody, Select, Text, Textarea } from '@fluentui/react-components';
import { Add24Regular, CheckmarkCircle20Regular, Delete20Regular, Warning20Filled } from '@fluentui/react-icons';
import { useState, type FormEvent } from 'react';
import { CheckInputSchema } from '@domain/jobs/job-record.schema';

import { useNotify } from '../../../components/notify';
import { usePersistedDraft } from '../../../lib/drafts';
import { fieldErrorsFromZod } from '../../../lib/form-errors';
import type { JobAsBuiltResponse } from '../api/get-job-as-built';
import { useJobWriter } from '../hooks/job-writer';
import { fieldDomId } from '../utils/finding-target';
import { saveErrors } from '../utils/save-errors';

import { useCardStyles } from './card-styles';
import { useFormStyles } from './form-styles';

type CheckDraft = {
  channel: string;
  quantity: 'dc_resistance' | 'impedance';
  measuredOhm: string;
  frequencyHz: string;
  isPolarityOk: boolean;
  isInsulationOk: boolean;
  notes: string;
};

/** Commissioning checks: a reading per channel compared with what the wiring should measure. */
export function ChecksSection({ data, canAddField }: { data: JobAsBuiltResponse; canAddField: boolean }) {
  const styles = useCardStyles();
  const formStyles = useFormStyles();
  const notify = useNotify();
  const writer = useJobWriter();
  const { asBuilt, analysis, job } = data;
  const draftKey = `job:${job.id}:check:new`;
  const [isAdding, setIsAdding] = useState(false);
  const [errors, setErrors] = useState<Record<string, string>>({});
  const [message, setMessage] = useState<string | undefined>();
  const { value: draft, setValue, hasDraft, clear } = usePersistedDraft<CheckDraft>(draftKey, {
    channel: '',
    quantity: 'dc_resistance',
    measuredOhm: '',
    frequencyHz: '',
    isPolarityOk: true,
    isInsulationOk: true,
    notes: '',
  });
  const set = <K extends keyof CheckDraft>(key: K, value: CheckDraft[K]) => setValue((current) => ({ ...current, [key]: value }));
  const channels = asBuilt.items.flatMap((item) =>
    item.kind === 'amplifier' ? item.channels.map((c) => ({ key: `${item.id}|${c.id}`, label: `${item.label} · ${c.name}` })) : [],
  );
  const channelLabel = (ref: { amplifierItemId: string; channelId: string }) =>
    channels.find((c) => c.key === `${ref.amplifierItemId}|${ref.channelId}`)?.label ?? 'Unknown channel';

  const add = async (event: FormEvent) => {
    event.preventDefault();
    const [amplifierItemId = '', channelId = ''] = draft.channel.split('|');
    const body = {
      channel: { amplifierItemId, channelId },
      quantity: draft.quantity,
      measuredOhm: draft.measuredOhm.trim() === '' ? undefined : Number(draft.measuredOhm.replace(',', '.')),
      frequencyHz: draft.quantity === 'impedance' && draft.frequencyHz.trim() !== '' ? Number(draft.frequencyHz) : undefined,
      isPolarityOk: draft.isPolarityOk,
      isInsulationOk: draft.isInsulationOk,
      notes: draft.notes.trim() === '' ? undefined : draft.notes,
    };
    const parsed = CheckInputSchema.safeParse(body);
    const found = parsed.success ? {} : (fieldErrorsFromZod(parsed.error) as Record<string, string>);
    if (draft.channel === '') found.channel = 'Choose the channel you measured.';
    setErrors(found);
    setMessage(undefined);
    if (Object.keys(found).length > 0) return;
    try {
      const outcome = await writer.save({ method: 'POST', path: '/checks', body, draftKey, label: `Check of ${channelLabel(body.channel)}`, isAdditive: true });
      if (outcome === 'saved') notify.success('Check saved');
      setIsAdding(false);
    } catch (failure) {
      const { fields, message: text } = saveErrors(failure);
      setErrors(fields);
      setMessage(text);
    }
  };

  const remove = async (checkId: string) => {
    try {
      await writer.save({ method: 'DELETE', path: `/checks/${checkId}`, label: 'Removing a check' });
    } catch (failure) {
      notify.error('Could not remove the check', saveErrors(failure).message);
    }
  };

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
            <Field label="Channel" required validationMessage={errors.channel}>
              <Select className={formStyles.control} value={draft.channel} onChange={(_e, d) => set('channel', d.value)}>
                <option value="">Choose…</option>
                {channels.map((c) => (
                  <option key={c.key} value={c.key}>
                    {c.label}
                  </option>
                ))}
              </Select>
            </Field>
            <Field label="Measured">
              <Select className={formStyles.control} value={draft.quantity} onChange={(_e, d) => set('quantity', d.value as CheckDraft['quantity'])}>
                <option value="dc_resistance">DC resistance (meter)</option>
                <option value="impedance">Impedance (impedance meter)</option>
              </Select>
            </Field>
            <Field label="Reading (Ω)" required validationMessage={errors.measuredOhm}>
              <Input className={formStyles.control} inputMode="decimal" value={draft.measuredOhm} onChange={(_e, d) => set('measuredOhm', d.value)} />
            </Field>
            {draft.quantity === 'impedance' && (
              <Field label="At (Hz)" validationMessage={errors.frequencyHz}>
                <Input className={formStyles.control} inputMode="decimal" value={draft.frequencyHz} placeholder="1000" onChange={(_e, d) => set('frequencyHz', d.value)} />
              </Field>
            )}
            <Checkbox className={formStyles.control} checked={draft.isPolarityOk} onChange={(_e, d) => set('isPolarityOk', d.checked === true)} label="Polarity correct at every speaker" />
            <Checkbox className={formStyles.control} checked={draft.isInsulationOk} onChange={(_e, d) => set('isInsulationOk', d.checked === true)} label="No short to ground or between pairs" />
            <Field label="Notes" className={formStyles.wide}>
              <Textarea value={draft.notes} onChange={(_e, d) => set('notes', d.value)} resize="vertical" />
            </Field>
          </div>
          <div className={formStyles.actions}>
            <Button type="submit" appearance="primary" className={formStyles.bigButton}>
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
                    <Button appearance="subtle" className={formStyles.button} icon={<Delete20Regular />} aria-label="Remove this check" onClick={() => void remove(check.id)} />
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
    </section>
  );
}
