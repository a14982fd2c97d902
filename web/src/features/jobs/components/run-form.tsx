import {
  Button,
  Checkbox,
  Field,
  Input,
  MessageBar,
  MessageBarBody,
  Select,
  Spinner,
  Text,
  Textarea,
} from '@fluentui/react-components';
import { useEffect, useRef, useState, type FormEvent } from 'react';
import type { AsBuilt } from '@domain/as-built/as-built.schema';
import { BurialLocationSchema, InstallMethodSchema, RunSchema, type Run } from '@domain/as-built/run.schema';

import { useNotify } from '../../../components/notify';
import { usePersistedDraft } from '../../../lib/drafts';
import { fieldErrorsFromZod } from '../../../lib/form-errors';
import { gaugeInputValue, lengthInputValue, parseGauge } from '../../../lib/units';
import { useUnitPreferences } from '../../../lib/use-unit-preferences';
import { useJobWriter } from '../hooks/job-writer';
import { fieldDomId } from '../utils/finding-target';
import { ITEM_KIND_LABELS, LOCATION_LABELS, METHOD_LABELS } from '../utils/record-labels';
import { saveErrors } from '../utils/save-errors';

import { useFormStyles } from './form-styles';
import { LengthInput, readLength } from './length-input';

type RunDraft = {
  label: string;
  fromItemId: string;
  toItemId: string;
  cableType: string;
  gauge: string;
  conductors: string;
  /** Pair number → `ampId|channelId`, or '' for a spare pair. */
  pairs: Record<string, string>;
  measuredLength: string;
  method: string;
  location: string;
  isSpare: boolean;
  isAbandoned: boolean;
  notes: string;
};

type RunFormProps = {
  jobId: string;
  asBuilt: AsBuilt;
  /** The run being changed; a new run without. */
  run?: Run;
  /** The field to put the cursor in when the form opens (from a finding link). */
  focusField?: string;
  onDone: () => void;
};

/** Add or change a run: ends, cable, pairs → channels, length, how and where it is buried. */
export function RunForm({ jobId, asBuilt, run, focusField, onDone }: RunFormProps) {
  const styles = useFormStyles();
  const notify = useNotify();
  const writer = useJobWriter();
  const [units] = useUnitPreferences();
  const draftKey = `job:${jobId}:run:${run?.id ?? 'new'}`;
  const recordId = run?.id ?? 'new-run';
  const channelKey = (c: { amplifierItemId: string; channelId: string } | null) => (c ? `${c.amplifierItemId}|${c.channelId}` : '');
  const { value: draft, setValue, hasDraft, clear } = usePersistedDraft<RunDraft>(draftKey, {
    label: run?.label ?? '',
    fromItemId: run?.fromItemId ?? '',
    toItemId: run?.toItemId ?? '',
    cableType: run?.cableType ?? '',
    gauge: run ? gaugeInputValue(run.gauge) : '',
    conductors: String(run?.conductors ?? 2),
    pairs: Object.fromEntries((run?.pairs ?? []).map((pair) => [String(pair.pairIndex), channelKey(pair.channel)])),
    measuredLength: run ? lengthInputValue(run.measuredLengthM, units.length, 'long') : '',
    method: run?.method ?? 'direct_burial',
    location: run?.location ?? 'general',
    isSpare: run?.isSpare ?? false,
    isAbandoned: run?.isAbandoned ?? false,
    notes: run?.notes ?? '',
  });
  const [errors, setErrors] = useState<Record<string, string>>({});
  const [message, setMessage] = useState<string | undefined>();
  const [isSaving, setIsSaving] = useState(false);
  const formRef = useRef<HTMLFormElement>(null);
  const set = <K extends keyof RunDraft>(key: K, value: RunDraft[K]) => setValue((current) => ({ ...current, [key]: value }));

  useEffect(() => {
    if (!focusField) return;
    formRef.current?.querySelector<HTMLElement>(`#${CSS.escape(fieldDomId(recordId, focusField))}`)?.focus();
  }, [focusField, recordId]);

  const channels = asBuilt.items.flatMap((item) =>
    item.kind === 'amplifier' ? item.channels.map((channel) => ({ key: `${item.id}|${channel.id}`, label: `${item.label} · ${channel.name}` })) : [],
  );
  const pairCount = Math.max(1, Math.floor((Number(draft.conductors) || 2) / 2));

  const handleSubmit = async (event: FormEvent) => {
    event.preventDefault();
    const found: Record<string, string> = {};
    const gauge = parseGauge(draft.gauge, units.gauge);
    if (!gauge.ok) found.gauge = gauge.message;
    const length = readLength(draft.measuredLength, units, 'long');
    if (length.error) found.measuredLengthM = length.error;
    const pairs = Array.from({ length: pairCount }, (_, i) => {
      const key = draft.pairs[String(i + 1)] ?? '';
      const [amplifierItemId, channelId] = key.split('|');
      return { pairIndex: i + 1, channel: amplifierItemId && channelId ? { amplifierItemId, channelId } : null };
    });
    const body = {
      label: draft.label,
      fromItemId: draft.fromItemId,
      toItemId: draft.toItemId,
      cableType: draft.cableType,
      gauge: gauge.ok ? gauge.gauge : undefined,
      conductors: Number(draft.conductors),
      pairs,
      measuredLengthM: length.metres,
      method: draft.method,
      location: draft.method === 'indoor' ? undefined : draft.location,
      ...(run?.route ? { route: run.route } : {}),
      isSpare: draft.isSpare || undefined,
      isAbandoned: draft.isAbandoned || undefined,
      notes: draft.notes.trim() === '' ? undefined : draft.notes,
    };
    const parsed = RunSchema.safeParse({ ...body, id: 'new' });
    if (!parsed.success) Object.assign(found, { ...fieldErrorsFromZod(parsed.error), ...found });
    if (draft.fromItemId === '') found.fromItemId = 'Choose where the run starts.';
    if (draft.toItemId === '') found.toItemId = 'Choose where the run ends.';
    setErrors(found);
    setMessage(undefined);
    if (Object.keys(found).length > 0 || !parsed.success) return;
    const { id: _id, ...input } = parsed.data;
    setIsSaving(true);
    try {
      const outcome = await writer.save({
        method: run ? 'PUT' : 'POST',
        path: run ? `/runs/${run.id}` : '/runs',
        body: input,
        draftKey,
        label: run ? `Changes to run "${input.label}"` : `New run "${input.label}"`,
      });
      if (outcome === 'saved') notify.success(run ? 'Run saved' : 'Run added', input.label);
      if (outcome === 'queued') notify.success('Saved on this phone', 'It is sent as soon as there is a connection.');
      onDone();
    } catch (error) {
      const { fields, message: text } = saveErrors(error);
      setErrors(fields);
      setMessage(text);
    } finally {
      setIsSaving(false);
    }
  };

  const itemOptions = asBuilt.items.map((item) => (
    <option key={item.id} value={item.id}>
      {item.label} ({ITEM_KIND_LABELS[item.kind].toLowerCase()})
    </option>
  ));
  const id = (field: string) => fieldDomId(recordId, field);

  return (
    <form ref={formRef} className={styles.form} onSubmit={(event) => void handleSubmit(event)} noValidate aria-label={run ? `Change run ${run.label}` : 'New run'}>
      {message && (
        <MessageBar intent="error" layout="multiline">
          <MessageBarBody>{message}</MessageBarBody>
        </MessageBar>
      )}
      {hasDraft && <Text className={styles.unsaved}>Not saved yet: your input is kept on this device until you save.</Text>}
      <div className={styles.grid}>
        <Field label="Name" required validationMessage={errors.label} className={styles.wide}>
          <Input id={id('label')} className={styles.control} value={draft.label} onChange={(_e, d) => set('label', d.value)} placeholder="Patio trunk" />
        </Field>
        <Field label="From (amplifier side)" required validationMessage={errors.fromItemId}>
          <Select id={id('fromItemId')} className={styles.control} value={draft.fromItemId} onChange={(_e, d) => set('fromItemId', d.value)}>
            <option value="">Choose…</option>
            {itemOptions}
          </Select>
        </Field>
        <Field label="To" required validationMessage={errors.toItemId}>
          <Select id={id('toItemId')} className={styles.control} value={draft.toItemId} onChange={(_e, d) => set('toItemId', d.value)}>
            <option value="">Choose…</option>
            {itemOptions}
          </Select>
        </Field>
        <Field label="Cable type" required validationMessage={errors.cableType}>
          <Input id={id('cableType')} className={styles.control} value={draft.cableType} onChange={(_e, d) => set('cableType', d.value)} placeholder="14/4 direct burial" />
        </Field>
        <Field label={`Gauge (${units.gauge === 'awg' ? 'AWG' : 'mm²'})`} required validationMessage={errors.gauge}>
          <Input
            id={id('gauge')}
            className={styles.control}
            inputMode="decimal"
            value={draft.gauge}
            onChange={(_e, d) => set('gauge', d.value)}
            placeholder={units.gauge === 'awg' ? '14' : '2.5'}
          />
        </Field>
        <Field label="Conductors" required validationMessage={errors.conductors}>
          <Select id={id('conductors')} className={styles.control} value={draft.conductors} onChange={(_e, d) => set('conductors', d.value)}>
            {[2, 4, 6, 8, 12, 16].map((n) => (
              <option key={n} value={String(n)}>
                {n}
              </option>
            ))}
          </Select>
        </Field>
        <LengthInput
          id={id('measuredLengthM')}
          label="Measured length"
          scale="long"
          required
          value={draft.measuredLength}
          onChange={(value) => set('measuredLength', value)}
          error={errors.measuredLengthM}
        />
        {Array.from({ length: pairCount }, (_, i) => (
          <Field key={i} label={`Pair ${i + 1} carries`} validationMessage={i === 0 ? errors.pairs : undefined}>
            <Select
              id={id(i === 0 ? 'pairs' : `pairs-${i + 1}`)}
              className={styles.control}
              value={draft.pairs[String(i + 1)] ?? ''}
              onChange={(_e, d) => set('pairs', { ...draft.pairs, [String(i + 1)]: d.value })}
            >
              <option value="">Nothing (spare pair)</option>
              {channels.map((channel) => (
                <option key={channel.key} value={channel.key}>
                  {channel.label}
                </option>
              ))}
            </Select>
          </Field>
        ))}
        <Field label="How it is laid" validationMessage={errors.method}>
          <Select id={id('method')} className={styles.control} value={draft.method} onChange={(_e, d) => set('method', d.value)}>
            {InstallMethodSchema.options.map((method) => (
              <option key={method} value={method}>
                {METHOD_LABELS[method]}
              </option>
            ))}
          </Select>
        </Field>
        {draft.method !== 'indoor' && (
          <Field label="Where it is buried" validationMessage={errors.location}>
            <Select id={id('location')} className={styles.control} value={draft.location} onChange={(_e, d) => set('location', d.value)}>
              {BurialLocationSchema.options.map((location) => (
                <option key={location} value={location}>
                  {LOCATION_LABELS[location]}
                </option>
              ))}
            </Select>
          </Field>
        )}
        <Checkbox
          id={id('isSpare')}
          className={styles.control}
          checked={draft.isSpare}
          onChange={(_e, d) => set('isSpare', d.checked === true)}
          label="Spare run (laid for later, not connected)"
        />
        <Checkbox
          id={id('isAbandoned')}
          className={styles.control}
          checked={draft.isAbandoned}
          onChange={(_e, d) => set('isAbandoned', d.checked === true)}
          label="Abandoned (left in the ground, not used)"
        />
        <Field label="Notes" validationMessage={errors.notes} className={styles.wide}>
          <Textarea id={id('notes')} value={draft.notes} onChange={(_e, d) => set('notes', d.value)} resize="vertical" />
        </Field>
      </div>
      <div className={styles.actions}>
        <Button type="submit" appearance="primary" className={styles.bigButton} disabled={isSaving} icon={isSaving ? <Spinner size="tiny" /> : undefined}>
          {run ? 'Save run' : 'Add run'}
        </Button>
        <Button
          className={styles.bigButton}
          disabled={isSaving}
          onClick={() => {
            clear();
            onDone();
          }}
        >
          {hasDraft ? 'Discard changes' : 'Cancel'}
        </Button>
      </div>
    </form>
  );
}
