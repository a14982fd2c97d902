import {
  Checkbox,
  Field,
  Input,
  MessageBar,
  MessageBarBody,
  Select,
  Text,
  Textarea,
} from '@fluentui/react-components';
import { zodResolver } from '@hookform/resolvers/zod';
import { useEffect, useMemo, useRef, useState, type ReactNode } from 'react';
import { Controller } from 'react-hook-form';
import { z } from 'zod';
import type { AsBuilt } from '@domain/as-built/as-built.schema';
import { BurialLocationSchema, InstallMethodSchema, RunSchema, type Run } from '@domain/as-built/run.schema';

import { useNotify } from '../../../components/notify';
import { useDraftForm } from '../../../lib/drafts';
import { toSentence } from '../../../lib/form-errors';
import { gaugeInputValue, lengthInputValue, parseGauge, type UnitPreferences } from '../../../lib/units';
import { useUnitPreferences } from '../../../lib/use-unit-preferences';
import { useJobWriter } from '../hooks/job-writer';
import { fieldDomId } from '../utils/finding-target';
import { ITEM_KIND_LABELS, LOCATION_LABELS, METHOD_LABELS } from '../../job-record';
import { saveErrors } from '../utils/save-errors';

import { FormActions } from './form-actions';
import { useFormStyles } from '../../../components/form-styles';
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

/** The run as the shared domain schema has it, without the id the server assigns. */
type RunBody = Omit<Run, 'id'>;
const RUN_FIELDS = ['label', 'fromItemId', 'toItemId', 'cableType', 'gauge', 'conductors', 'pairs', 'measuredLength', 'method', 'location', 'notes'] as const;
type RunField = (typeof RUN_FIELDS)[number];

/** The form field a domain path (`measuredLengthM`, `pairs.1.channel`) is shown under. */
function runFieldOf(path: string): RunField {
  const head = path.split('.')[0] ?? '';
  if (head === 'measuredLengthM') return 'measuredLength';
  return (RUN_FIELDS as readonly string[]).includes(head) ? (head as RunField) : 'label';
}

/**
 * Reads the typed run (lengths and gauge in the person's units, converted in lib/units) into the shared
 * RunSchema shape and checks it there; each problem lands under the field it is about.
 */
function runFormSchema(units: UnitPreferences, route: Run['route']) {
  return z
    .object({
      label: z.string(),
      fromItemId: z.string(),
      toItemId: z.string(),
      cableType: z.string(),
      gauge: z.string(),
      conductors: z.string(),
      pairs: z.record(z.string(), z.string()),
      measuredLength: z.string(),
      method: z.string(),
      location: z.string(),
      isSpare: z.boolean(),
      isAbandoned: z.boolean(),
      notes: z.string(),
    })
    .transform((draft, ctx): RunBody => {
      const issue = (field: RunField, message: string) => ctx.addIssue({ code: 'custom', path: [field], message });
      const gauge = parseGauge(draft.gauge, units.gauge);
      const length = readLength(draft.measuredLength, units, 'long', 'Measured length');
      const pairCount = Math.max(1, Math.floor((Number(draft.conductors) || 2) / 2));
      const pairs = Array.from({ length: pairCount }, (_, i) => {
        const [amplifierItemId, channelId] = (draft.pairs[String(i + 1)] ?? '').split('|');
        return { pairIndex: i + 1, channel: amplifierItemId && channelId ? { amplifierItemId, channelId } : null };
      });
      const parsed = RunSchema.safeParse({
        id: 'new',
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
        ...(route ? { route } : {}),
        isSpare: draft.isSpare || undefined,
        isAbandoned: draft.isAbandoned || undefined,
        notes: draft.notes.trim() === '' ? undefined : draft.notes,
      });
      // Our own words first; then the shared schema's, for every field that has no message yet.
      const named = new Set<RunField>();
      const first = (field: RunField, message: string) => {
        if (named.has(field)) return;
        named.add(field);
        issue(field, message);
      };
      if (!gauge.ok) first('gauge', gauge.message);
      if (length.error) first('measuredLength', length.error);
      if (draft.fromItemId === '') first('fromItemId', 'Choose where the run starts.');
      if (draft.toItemId === '') first('toItemId', 'Choose where the run ends.');
      if (!parsed.success) for (const problem of parsed.error.issues) first(runFieldOf(problem.path.map(String).join('.')), toSentence(problem.message));
      if (named.size > 0 || !parsed.success) return z.NEVER;
      const { id: _id, ...body } = parsed.data;
      return body;
    });
}

/** Add or change a run: ends, cable, pairs → channels, length, how and where it is buried. */
export function RunForm({ jobId, asBuilt, run, focusField, onDone }: RunFormProps) {
  const styles = useFormStyles();
  const notify = useNotify();
  const writer = useJobWriter();
  const [units] = useUnitPreferences();
  const draftKey = `job:${jobId}:run:${run?.id ?? 'new'}`;
  const recordId = run?.id ?? 'new-run';
  const channelKey = (c: { amplifierItemId: string; channelId: string } | null) => (c ? `${c.amplifierItemId}|${c.channelId}` : '');
  const initial: RunDraft = {
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
  };
  const schema = useMemo(() => runFormSchema(units, run?.route), [run?.route, units]);
  const { form, hasDraft, clear } = useDraftForm<RunDraft, RunBody>(draftKey, initial, zodResolver(schema));
  const [message, setMessage] = useState<string | undefined>();
  const formRef = useRef<HTMLFormElement>(null);
  const [conductors, method] = form.watch(['conductors', 'method']);
  const errors = form.formState.errors;

  useEffect(() => {
    if (!focusField) return;
    formRef.current?.querySelector<HTMLElement>(`#${CSS.escape(fieldDomId(recordId, focusField))}`)?.focus();
  }, [focusField, recordId]);

  const channels = asBuilt.items.flatMap((item) =>
    item.kind === 'amplifier' ? item.channels.map((channel) => ({ key: `${item.id}|${channel.id}`, label: `${item.label} · ${channel.name}` })) : [],
  );
  const pairCount = Math.max(1, Math.floor((Number(conductors) || 2) / 2));

  const save = form.handleSubmit(async (input) => {
    setMessage(undefined);
    try {
      const outcome = await writer.save({
        ...(run ? { endpoint: 'replaceRun' as const, params: { runId: run.id } } : { endpoint: 'createRun' as const, params: {} }),
        body: input,
        draftKey,
        label: run ? `Changes to run "${input.label}"` : `New run "${input.label}"`,
      });
      if (outcome === 'saved') notify.success(run ? 'Run saved' : 'Run added', input.label);
      if (outcome === 'queued') notify.success('Saved on this phone', 'It is sent as soon as there is a connection.');
      onDone();
    } catch (error) {
      const { fields, message: text } = saveErrors(error);
      for (const [field, fieldMessage] of Object.entries(fields)) form.setError(runFieldOf(field), { message: fieldMessage });
      setMessage(text);
    }
  });
  const isSaving = form.formState.isSubmitting;
  const text = (name: 'label' | 'cableType' | 'gauge', placeholder: string, inputMode?: 'decimal') => (
    <Controller
      control={form.control}
      name={name}
      render={({ field }) => (
        <Input
          id={id(name)}
          ref={field.ref}
          className={styles.control}
          inputMode={inputMode}
          value={field.value}
          onChange={(_e, d) => field.onChange(d.value)}
          onBlur={field.onBlur}
          placeholder={`e.g. ${placeholder}`}
        />
      )}
    />
  );
  const select = (name: 'fromItemId' | 'toItemId' | 'conductors' | 'method' | 'location', options: ReactNode) => (
    <Controller
      control={form.control}
      name={name}
      render={({ field }) => (
        <Select id={id(name)} ref={field.ref} className={styles.control} value={field.value} onChange={(_e, d) => field.onChange(d.value)} onBlur={field.onBlur}>
          {options}
        </Select>
      )}
    />
  );

  const itemOptions = asBuilt.items.map((item) => (
    <option key={item.id} value={item.id}>
      {item.label} ({ITEM_KIND_LABELS[item.kind].toLowerCase()})
    </option>
  ));
  const id = (field: string) => fieldDomId(recordId, field);

  return (
    <form ref={formRef} className={styles.form} onSubmit={(event) => void save(event)} noValidate aria-label={run ? `Change run ${run.label}` : 'New run'}>
      {message && (
        <MessageBar intent="error" layout="multiline">
          <MessageBarBody>{message}</MessageBarBody>
        </MessageBar>
      )}
      {hasDraft && <Text className={styles.unsaved}>Not saved yet: your input is kept on this device until you save.</Text>}
      <div className={styles.grid}>
        <Field label="Name" required validationMessage={errors.label?.message} className={styles.wide}>
          {text('label', 'Patio trunk')}
        </Field>
        <Field label="From (amplifier side)" required validationMessage={errors.fromItemId?.message}>
          {select(
            'fromItemId',
            <>
              <option value="">Choose…</option>
              {itemOptions}
            </>,
          )}
        </Field>
        <Field label="To" required validationMessage={errors.toItemId?.message}>
          {select(
            'toItemId',
            <>
              <option value="">Choose…</option>
              {itemOptions}
            </>,
          )}
        </Field>
        <Field label="Cable type" required validationMessage={errors.cableType?.message}>
          {text('cableType', '14/4 direct burial')}
        </Field>
        <Field label={`Gauge (${units.gauge === 'awg' ? 'AWG' : 'mm²'})`} required validationMessage={errors.gauge?.message}>
          {text('gauge', units.gauge === 'awg' ? '14' : '2.5', 'decimal')}
        </Field>
        <Field label="Conductors" required validationMessage={errors.conductors?.message}>
          {select(
            'conductors',
            [2, 4, 6, 8, 12, 16].map((n) => (
              <option key={n} value={String(n)}>
                {n}
              </option>
            )),
          )}
        </Field>
        <Controller
          control={form.control}
          name="measuredLength"
          render={({ field, fieldState }) => (
            <LengthInput
              id={id('measuredLengthM')}
              inputRef={field.ref}
              label="Measured length"
              scale="long"
              required
              value={field.value}
              onChange={field.onChange}
              error={fieldState.error?.message}
            />
          )}
        />
        <Controller
          control={form.control}
          name="pairs"
          render={({ field, fieldState }) => (
            <>
              {Array.from({ length: pairCount }, (_, i) => (
                <Field key={i} label={`Pair ${i + 1} carries`} validationMessage={i === 0 ? fieldState.error?.message : undefined}>
                  <Select
                    id={id(i === 0 ? 'pairs' : `pairs-${i + 1}`)}
                    className={styles.control}
                    value={field.value[String(i + 1)] ?? ''}
                    onChange={(_e, d) => field.onChange({ ...field.value, [String(i + 1)]: d.value })}
                    onBlur={field.onBlur}
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
            </>
          )}
        />
        <Field label="How it is laid" validationMessage={errors.method?.message}>
          {select(
            'method',
            InstallMethodSchema.options.map((option) => (
              <option key={option} value={option}>
                {METHOD_LABELS[option]}
              </option>
            )),
          )}
        </Field>
        {method !== 'indoor' && (
          <Field label="Where it is buried" validationMessage={errors.location?.message}>
            {select(
              'location',
              BurialLocationSchema.options.map((location) => (
                <option key={location} value={location}>
                  {LOCATION_LABELS[location]}
                </option>
              )),
            )}
          </Field>
        )}
        <Controller
          control={form.control}
          name="isSpare"
          render={({ field }) => (
            <Checkbox
              id={id('isSpare')}
              className={styles.control}
              checked={field.value}
              onChange={(_e, d) => field.onChange(d.checked === true)}
              label="Spare run (laid for later, not connected)"
            />
          )}
        />
        <Controller
          control={form.control}
          name="isAbandoned"
          render={({ field }) => (
            <Checkbox
              id={id('isAbandoned')}
              className={styles.control}
              checked={field.value}
              onChange={(_e, d) => field.onChange(d.checked === true)}
              label="Abandoned (left in the ground, not used)"
            />
          )}
        />
        <Controller
          control={form.control}
          name="notes"
          render={({ field, fieldState }) => (
            <Field label="Notes" validationMessage={fieldState.error?.message} className={styles.wide}>
              <Textarea id={id('notes')} value={field.value} onChange={(_e, d) => field.onChange(d.value)} onBlur={field.onBlur} resize="vertical" />
            </Field>
          )}
        />
      </div>
      <FormActions
        submitLabel={run ? 'Save run' : 'Add run'}
        isSaving={isSaving}
        hasDraft={hasDraft}
        onCancel={() => {
          clear();
          onDone();
        }}
      />
    </form>
  );
}
