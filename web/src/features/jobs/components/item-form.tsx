import { Button, Checkbox, Field, Input, MessageBar, MessageBarBody, Select, Text, Textarea } from '@fluentui/react-components';
import { Add20Regular, Delete20Regular } from '@fluentui/react-icons';
import { zodResolver } from '@hookform/resolvers/zod';
import { useQueryClient } from '@tanstack/react-query';
import { useEffect, useMemo, useRef, useState, type ReactNode } from 'react';
import { Controller } from 'react-hook-form';
import { z } from 'zod';
import type { AsBuilt } from '@domain/as-built/as-built.schema';
import type { Item, ItemKind } from '@domain/as-built/item.schema';
import { ItemInputSchema } from '@domain/jobs/job-record.schema';

import { ConfirmDialog } from '../../../components/confirm-dialog';
import { useNotify } from '../../../components/notify';
import { useDraftForm } from '../../../lib/drafts';
import { toSentence } from '../../../lib/form-errors';
import { lengthInputValue, parseLength } from '../../../lib/units';
import { useUnitPreferences } from '../../../lib/use-unit-preferences';
import { useJobWriter } from '../hooks/job-writer';
import { fieldDomId } from '../utils/finding-target';
import { getJobAsBuiltQueryOptions, ITEM_KIND_LABELS, type JobAsBuiltResponse } from '../../job-record';
import { saveErrors } from '../utils/save-errors';

import { FormActions } from './form-actions';
import { useFormStyles } from '../../../components/form-styles';
import { LengthInput } from './length-input';
import { GpsPosition, type GpsFix } from './gps-position';
import { solveTieDrafts, TiesEditor, type TieDraft } from './ties-editor';

type ItemDraft = {
  kind: ItemKind;
  label: string;
  model: string;
  serial: string;
  zoneId: string;
  installDate: string;
  warrantyEnd: string;
  notes: string;
  ties: TieDraft[];
  sideHint: '' | 'left' | 'right';
  /** "Use my position": the phone's fix on the plan, stored with source `gps`. */
  gps: GpsFix | null;
  channels: { id?: string; name: string }[];
  ratedWatts8Ohm: string;
  ratedWatts4Ohm: string;
  minimumImpedanceOhm: string;
  speakerType: 'lowz' | 'cv';
  nominalImpedanceOhm: string;
  cvLine: '25V' | '70V' | '100V';
  tapWatts: string;
  dcResistanceOhm: string;
  onwardWiring: '' | 'parallel' | 'series';
  voiceCoils: 'single' | 'dual';
  coilImpedanceOhm: string;
  coilWiring: '' | 'series' | 'parallel' | 'separate_channels';
  spliceType: string;
  isAccessible: boolean;
  isCapped: boolean;
  marker: string;
  wallMaterial: string;
  holeDiameter: string;
  sleeve: string;
  sealant: string;
  insideLocation: string;
  outsideLocation: string;
};

const str = (value: number | string | undefined) => (value === undefined ? '' : String(value));
const num = (value: string) => (value.trim() === '' ? undefined : Number(value.replace(',', '.')));
const text = (value: string) => (value.trim() === '' ? undefined : value.trim());

function draftOf(item: Item | undefined, kind: ItemKind, units: { length: 'imperial' | 'metric' }): ItemDraft {
  const a = item?.kind === 'amplifier' ? item : undefined;
  const s = item?.kind === 'speaker' ? item : undefined;
  const w = item?.kind === 'subwoofer' ? item : undefined;
  const j = item?.kind === 'junction' ? item : undefined;
  const e = item?.kind === 'spare_end' ? item : undefined;
  const wall = item?.kind === 'wall_entry' ? item : undefined;
  return {
    kind: item?.kind ?? kind,
    label: item?.label ?? '',
    model: item?.model ?? '',
    serial: item?.serial ?? '',
    zoneId: item?.zoneId ?? '',
    // A new item is usually installed the day it is recorded.
    installDate: item ? (item.installDate ?? '') : todayLocalIso(),
    warrantyEnd: item?.warrantyEnd ?? '',
    notes: item?.notes ?? '',
    ties: (item?.ties ?? []).map((tie) => ({ referencePointId: tie.referencePointId, distance: lengthInputValue(tie.distanceM, units.length, 'long') })),
    sideHint: item?.sideHint ?? '',
    gps: item?.position?.source === 'gps' ? { x: item.position.x, y: item.position.y, accuracyM: item.position.accuracyM ?? 0 } : null,
    channels: a?.channels.map((c) => ({ id: c.id, name: c.name })) ?? [{ name: 'Channel 1' }, { name: 'Channel 2' }],
    ratedWatts8Ohm: str(a?.ratedWatts8Ohm),
    ratedWatts4Ohm: str(a?.ratedWatts4Ohm),
    minimumImpedanceOhm: str(a?.minimumImpedanceOhm ?? 4),
    speakerType: s?.constantVoltage ? 'cv' : 'lowz',
    nominalImpedanceOhm: str(s?.nominalImpedanceOhm ?? 8),
    cvLine: s?.constantVoltage?.lineVoltage ?? '70V',
    tapWatts: str(s?.constantVoltage?.tapWatts),
    dcResistanceOhm: str(s?.dcResistanceOhm ?? w?.dcResistanceOhmPerCoil),
    onwardWiring: s?.onwardWiring ?? w?.onwardWiring ?? '',
    voiceCoils: w?.voiceCoils ?? 'single',
    coilImpedanceOhm: str(w?.coilImpedanceOhm ?? 8),
    coilWiring: w?.coilWiring ?? '',
    spliceType: j?.spliceType ?? '',
    isAccessible: j?.isAccessible ?? false,
    isCapped: e?.isCapped ?? true,
    marker: e?.marker ?? '',
    wallMaterial: wall?.wallMaterial ?? '',
    holeDiameter: wall?.holeDiameterM === undefined ? '' : lengthInputValue(wall.holeDiameterM, units.length, 'short'),
    sleeve: wall?.sleeve ?? '',
    sealant: wall?.sealant ?? '',
    insideLocation: wall?.insideLocation ?? '',
    outsideLocation: wall?.outsideLocation ?? '',
  };
}

/** The body of an item write from the draft (numbers in SI); `undefined` fields are left out. */
function bodyOf(draft: ItemDraft, item: Item | undefined, units: { length: 'imperial' | 'metric' }): Record<string, unknown> {
  const ties = draft.ties
    .filter((tie) => tie.referencePointId !== '' || tie.distance.trim() !== '')
    .map((tie) => {
      const distance = parseLength(tie.distance, units.length, 'long');
      return { referencePointId: tie.referencePointId, distanceM: distance.ok ? distance.metres : Number.NaN };
    });
  const base = {
    kind: draft.kind,
    label: draft.label,
    model: text(draft.model),
    serial: text(draft.serial),
    zoneId: text(draft.zoneId),
    installDate: text(draft.installDate),
    warrantyEnd: text(draft.warrantyEnd),
    notes: text(draft.notes),
    // A phone fix replaces the recorded position; forgetting one leaves none (ties still place the item).
    position: draft.gps
      ? { x: draft.gps.x, y: draft.gps.y, source: 'gps', accuracyM: draft.gps.accuracyM }
      : item?.position?.source === 'gps'
        ? undefined
        : item?.position,
    ties: ties.length > 0 ? ties : undefined,
    sideHint: draft.sideHint || undefined,
  };
  switch (draft.kind) {
    case 'amplifier':
      return {
        ...base,
        channels: draft.channels.map((c) => (c.id ? { id: c.id, name: c.name } : { name: c.name })),
        ratedWatts8Ohm: num(draft.ratedWatts8Ohm),
        ratedWatts4Ohm: num(draft.ratedWatts4Ohm),
        minimumImpedanceOhm: num(draft.minimumImpedanceOhm),
      };
    case 'speaker':
      return {
        ...base,
        ...(draft.speakerType === 'cv'
          ? { constantVoltage: { lineVoltage: draft.cvLine, tapWatts: num(draft.tapWatts) } }
          : { nominalImpedanceOhm: num(draft.nominalImpedanceOhm) }),
        dcResistanceOhm: num(draft.dcResistanceOhm),
        onwardWiring: draft.onwardWiring || undefined,
      };
    case 'subwoofer':
      return {
        ...base,
        voiceCoils: draft.voiceCoils,
        coilImpedanceOhm: num(draft.coilImpedanceOhm),
        coilWiring: draft.voiceCoils === 'dual' ? draft.coilWiring || undefined : undefined,
        dcResistanceOhmPerCoil: num(draft.dcResistanceOhm),
        onwardWiring: draft.onwardWiring || undefined,
      };
    case 'junction':
      return { ...base, spliceType: text(draft.spliceType), isAccessible: draft.isAccessible };
    case 'spare_end':
      return { ...base, isCapped: draft.isCapped, marker: text(draft.marker) };
    case 'wall_entry': {
      const hole = draft.holeDiameter.trim() === '' ? undefined : parseLength(draft.holeDiameter, units.length, 'short');
      return {
        ...base,
        wallMaterial: text(draft.wallMaterial),
        holeDiameterM: hole === undefined ? undefined : hole.ok ? hole.metres : Number.NaN,
        sleeve: text(draft.sleeve),
        sealant: text(draft.sealant),
        insideLocation: text(draft.insideLocation),
        outsideLocation: text(draft.outsideLocation),
      };
    }
  }
}

/** A domain path of an item body (`constantVoltage.tapWatts`, `ties.1.distanceM`) → the form field it is typed in. */
const FIELD_OF_PATH: Record<string, keyof ItemDraft> = {
  constantVoltage: 'tapWatts',
  dcResistanceOhmPerCoil: 'dcResistanceOhm',
  holeDiameterM: 'holeDiameter',
};

function itemFieldOf(path: string, draft: ItemDraft): keyof ItemDraft {
  const head = path.split('.')[0] ?? '';
  if (FIELD_OF_PATH[head]) return FIELD_OF_PATH[head];
  return head in draft ? (head as keyof ItemDraft) : 'label';
}

/** The DOM id (for focus from a finding) of a form field: the domain name where they differ. */
const DOM_NAME: Partial<Record<keyof ItemDraft, string>> = { tapWatts: 'constantVoltage', holeDiameter: 'holeDiameterM' };

/**
 * Reads the typed item (lengths in the person's units, converted in lib/units) into the item body and
 * checks it against the shared ItemInputSchema; each problem lands under the field it is about.
 */
function itemFormSchema(units: { length: 'imperial' | 'metric' }, item: Item | undefined) {
  return z.custom<ItemDraft>((value) => typeof value === 'object' && value !== null).transform((draft, ctx) => {
    const body = bodyOf(draft, item, units);
    const parsed = ItemInputSchema.safeParse(body);
    if (parsed.success) return body;
    const named = new Set<keyof ItemDraft>();
    for (const problem of parsed.error.issues) {
      const field = itemFieldOf(problem.path.map(String).join('.'), draft);
      if (named.has(field)) continue;
      named.add(field);
      ctx.addIssue({ code: 'custom', path: [field], message: toSentence(problem.message) });
    }
    return z.NEVER;
  });
}

type ItemFormProps = {
  jobId: string;
  asBuilt: AsBuilt;
  item?: Item;
  /** For a new item: the kind to start with. */
  kind: ItemKind;
  /** Which kinds may be chosen for a new item. */
  kinds: readonly ItemKind[];
  focusField?: string;
  onDone: () => void;
};

/** Add or change a piece of equipment or a wall entry, with the fields of its kind and its ties. */
export function ItemForm({ jobId, asBuilt, item, kind, kinds, focusField, onDone }: ItemFormProps) {
  const styles = useFormStyles();
  const notify = useNotify();
  const writer = useJobWriter();
  const [units] = useUnitPreferences();
  const siteId = useQueryClient().getQueryData<JobAsBuiltResponse>(getJobAsBuiltQueryOptions(jobId).queryKey)?.job.site.id;
  const draftKey = `job:${jobId}:item:${item?.id ?? `new-${kinds.join('-')}`}`;
  const recordId = item?.id ?? 'new-item';
  const schema = useMemo(() => itemFormSchema(units, item), [item, units]);
  const { form, hasDraft, clear } = useDraftForm<ItemDraft, Record<string, unknown>>(draftKey, draftOf(item, kind, units), zodResolver(schema));
  const [message, setMessage] = useState<string | undefined>();
  const formRef = useRef<HTMLFormElement>(null);
  const errors = form.formState.errors;
  const [currentKind, speakerType, voiceCoils, channels, ties, sideHint, label, gps] = form.watch([
    'kind',
    'speakerType',
    'voiceCoils',
    'channels',
    'ties',
    'sideHint',
    'label',
    'gps',
  ]);
  /** Composite values (channels, ties) change as a whole; a change is an edit like any other. */
  const change = <K extends keyof ItemDraft>(key: K, value: ItemDraft[K]) =>
    form.setValue(key as never, value as never, { shouldDirty: true });
  const id = (field: string) => fieldDomId(recordId, field);

  useEffect(() => {
    if (!focusField) return;
    formRef.current?.querySelector<HTMLElement>(`#${CSS.escape(fieldDomId(recordId, focusField))}`)?.focus();
  }, [focusField, recordId]);

  // Ties that cannot meet are asked about before saving: such an item is stored with no position.
  const [unsolved, setUnsolved] = useState<{ body: Record<string, unknown>; reason: string } | undefined>();
  const [isSavingAnyway, setIsSavingAnyway] = useState(false);

  const save = form.handleSubmit(async (body) => {
    setMessage(undefined);
    const solution = currentKind === 'amplifier' ? undefined : solveTieDrafts(ties, asBuilt.referencePoints, sideHint, units.length);
    if (solution && !solution.ok) {
      setUnsolved({ body, reason: solution.message });
      return;
    }
    await send(body);
  });

  const send = async (body: Record<string, unknown>) => {
    const name = String(body.label ?? label);
    try {
      const outcome = await writer.save({
        ...(item ? { endpoint: 'replaceItem' as const, params: { itemId: item.id } } : { endpoint: 'createItem' as const, params: {} }),
        body,
        draftKey,
        label: item ? `Changes to "${name}"` : `New ${ITEM_KIND_LABELS[currentKind].toLowerCase()} "${name}"`,
      });
      if (outcome === 'saved') notify.success(item ? 'Saved' : 'Added', name);
      onDone();
    } catch (error) {
      const { fields, message: problem } = saveErrors(error);
      for (const [path, text] of Object.entries(fields)) form.setError(itemFieldOf(path, form.getValues()), { message: text });
      setMessage(problem);
    }
  };

  const saveAnyway = async () => {
    if (!unsolved) return;
    setIsSavingAnyway(true);
    try {
      await send(unsolved.body);
    } finally {
      setIsSavingAnyway(false);
      setUnsolved(undefined);
    }
  };

  const fixTies = () => {
    setUnsolved(undefined);
    formRef.current?.querySelector<HTMLElement>(`#${CSS.escape(fieldDomId(recordId, 'ties'))}`)?.focus();
  };
  const isSaving = form.formState.isSubmitting;
  const errorOf = (field: keyof ItemDraft) => errors[field]?.message as string | undefined;

  type StringField = { [K in keyof ItemDraft]: ItemDraft[K] extends string ? K : never }[keyof ItemDraft];
  const numberField = (field: StringField, fieldLabel: string, domName: string = DOM_NAME[field] ?? field) => (
    <Controller
      control={form.control}
      name={field}
      render={({ field: input, fieldState }) => (
        <Field label={fieldLabel} validationMessage={fieldState.error?.message}>
          <Input
            id={id(domName)}
            ref={input.ref}
            className={styles.control}
            inputMode="decimal"
            value={String(input.value)}
            onChange={(_e, d) => input.onChange(d.value)}
            onBlur={input.onBlur}
          />
        </Field>
      )}
    />
  );
  const textField = (field: StringField, fieldLabel: string, placeholder?: string, type?: 'date') => (
    <Controller
      control={form.control}
      name={field}
      render={({ field: input, fieldState }) => (
        <Field label={fieldLabel} validationMessage={fieldState.error?.message}>
          <Input
            id={id(field)}
            ref={input.ref}
            type={type}
            className={styles.control}
            value={String(input.value)}
            placeholder={placeholder === undefined ? undefined : `e.g. ${placeholder}`}
            onChange={(_e, d) => input.onChange(d.value)}
            onBlur={input.onBlur}
          />
        </Field>
      )}
    />
  );
  const selectField = (field: StringField, fieldLabel: string, options: ReactNode, required?: boolean) => (
    <Controller
      control={form.control}
      name={field}
      render={({ field: input, fieldState }) => (
        <Field label={fieldLabel} required={required} validationMessage={fieldState.error?.message}>
          <Select id={id(field)} ref={input.ref} className={styles.control} value={String(input.value)} onChange={(_e, d) => input.onChange(d.value)} onBlur={input.onBlur}>
            {options}
          </Select>
        </Field>
      )}
    />
  );
  const checkField = (field: 'isAccessible' | 'isCapped', fieldLabel: string) => (
    <Controller
      control={form.control}
      name={field}
      render={({ field: input }) => (
        <Checkbox className={styles.control} checked={input.value} onChange={(_e, d) => input.onChange(d.checked === true)} label={fieldLabel} />
      )}
    />
  );

  return (
    <form ref={formRef} className={styles.form} onSubmit={(event) => void save(event)} noValidate>
      {message && (
        <MessageBar intent="error" layout="multiline">
          <MessageBarBody>{message}</MessageBarBody>
        </MessageBar>
      )}
      {hasDraft && <Text className={styles.unsaved}>Not saved yet: your input is kept on this device until you save.</Text>}
      <div className={styles.grid}>
        {!item &&
          kinds.length > 1 &&
          selectField(
            'kind',
            'Kind',
            kinds.map((candidate) => (
              <option key={candidate} value={candidate}>
                {ITEM_KIND_LABELS[candidate]}
              </option>
            )),
            true,
          )}
        <Controller
          control={form.control}
          name="label"
          render={({ field, fieldState }) => (
            <Field label="Name" required validationMessage={fieldState.error?.message}>
              <Input id={id('label')} ref={field.ref} className={styles.control} value={field.value} onChange={(_e, d) => field.onChange(d.value)} onBlur={field.onBlur} />
            </Field>
          )}
        />
        {currentKind === 'amplifier' && (
          <>
            {numberField('ratedWatts8Ohm', 'Rated watts per channel at 8 Ω')}
            {numberField('ratedWatts4Ohm', 'Rated watts at 4 Ω (if rated)')}
            {numberField('minimumImpedanceOhm', 'Lowest stable load (Ω)')}
            <div className={styles.wide}>
              <Text weight="semibold" id={id('channels')} tabIndex={-1}>
                Channels
              </Text>
              {errorOf('channels') && <Text className={styles.unsaved}>{errorOf('channels')}</Text>}
              {channels.map((channel, i) => (
                <div key={channel.id ?? `new-${i}`} className={styles.actions}>
                  <Field label={`Channel ${i + 1} name`}>
                    <Input
                      className={styles.control}
                      value={channel.name}
                      onChange={(_e, d) => change('channels', channels.map((c, j) => (j === i ? { ...c, name: d.value } : c)))}
                    />
                  </Field>
                  {channels.length > 1 && (
                    <Button
                      appearance="subtle"
                      className={styles.button}
                      icon={<Delete20Regular />}
                      aria-label={`Remove channel ${channel.name}`}
                      onClick={() => change('channels', channels.filter((_c, j) => j !== i))}
                    />
                  )}
                </div>
              ))}
              <Button className={styles.button} icon={<Add20Regular />} onClick={() => change('channels', [...channels, { name: `Channel ${channels.length + 1}` }])}>
                Add a channel
              </Button>
            </div>
          </>
        )}
        {currentKind === 'speaker' && (
          <>
            {selectField(
              'speakerType',
              'Wired as',
              <>
                <option value="lowz">Low impedance (Ω)</option>
                <option value="cv">Constant-voltage line (tap watts)</option>
              </>,
            )}
            {speakerType === 'lowz' ? (
              numberField('nominalImpedanceOhm', 'Nominal impedance (Ω)')
            ) : (
              <>
                {selectField(
                  'cvLine',
                  'Line',
                  <>
                    <option value="25V">25 V</option>
                    <option value="70V">70 V</option>
                    <option value="100V">100 V</option>
                  </>,
                )}
                {numberField('tapWatts', 'Tap (watts)')}
              </>
            )}
            {numberField('dcResistanceOhm', 'DC resistance (Ω), if known')}
          </>
        )}
        {currentKind === 'subwoofer' && (
          <>
            {selectField(
              'voiceCoils',
              'Voice coils',
              <>
                <option value="single">Single</option>
                <option value="dual">Dual</option>
              </>,
            )}
            {numberField('coilImpedanceOhm', 'Impedance of one coil (Ω)')}
            {voiceCoils === 'dual' &&
              selectField(
                'coilWiring',
                'Coils wired',
                <>
                  <option value="">Choose…</option>
                  <option value="series">In series</option>
                  <option value="parallel">In parallel</option>
                  <option value="separate_channels">Each on its own channel</option>
                </>,
              )}
            {numberField('dcResistanceOhm', 'DC resistance per coil (Ω), if known', 'dcResistanceOhmPerCoil')}
          </>
        )}
        {(currentKind === 'speaker' || currentKind === 'subwoofer') &&
          selectField(
            'onwardWiring',
            'Runs leaving it are wired',
            <>
              <option value="">In parallel (loop-through)</option>
              <option value="series">In series</option>
            </>,
          )}
        {currentKind === 'junction' && (
          <>
            {textField('spliceType', 'Splice type', 'Gel-filled connectors in a valve box')}
            {checkField('isAccessible', 'Can be reached without digging')}
          </>
        )}
        {currentKind === 'spare_end' && (
          <>
            {checkField('isCapped', 'Capped')}
            {textField('marker', 'Marker', 'Orange flag, buried 6 in')}
          </>
        )}
        {currentKind === 'wall_entry' && (
          <>
            {textField('wallMaterial', 'Wall material', 'Brick veneer')}
            <Controller
              control={form.control}
              name="holeDiameter"
              render={({ field, fieldState }) => (
                <LengthInput
                  id={id('holeDiameterM')}
                  inputRef={field.ref}
                  label="Hole size"
                  scale="short"
                  value={field.value}
                  onChange={field.onChange}
                  error={fieldState.error?.message}
                />
              )}
            />
            {textField('sleeve', 'Sleeve or conduit', '3/4 in PVC sleeve')}
            {textField('sealant', 'Sealant', 'Polyurethane sealant')}
            {textField('outsideLocation', 'Outside, where', 'Left of the patio door, 30 cm up')}
            {textField('insideLocation', 'Inside, where', 'Behind the media cabinet')}
          </>
        )}
        {selectField(
          'zoneId',
          'Zone',
          <>
            <option value="">No zone</option>
            {asBuilt.zones.map((zone) => (
              <option key={zone.id} value={zone.id}>
                {zone.name}
              </option>
            ))}
          </>,
        )}
        {textField('model', 'Model')}
        {textField('serial', 'Serial number')}
        {textField('installDate', 'Installed on', undefined, 'date')}
        {textField('warrantyEnd', 'Warranty ends', undefined, 'date')}
        {currentKind !== 'amplifier' && (
          <div className={styles.wide}>
            <TiesEditor
              recordId={recordId}
              referencePoints={asBuilt.referencePoints}
              ties={ties}
              sideHint={sideHint}
              onChange={(nextTies, nextSide) => {
                change('ties', nextTies);
                change('sideHint', nextSide);
              }}
              error={errorOf('ties') ?? errorOf('sideHint')}
              siteId={siteId}
            />
          </div>
        )}
        <div className={styles.wide}>
          <GpsPosition site={asBuilt.site} fix={gps} onChange={(fix) => change('gps', fix)} />
        </div>
        <Controller
          control={form.control}
          name="notes"
          render={({ field, fieldState }) => (
            <Field label="Notes" className={styles.wide} validationMessage={fieldState.error?.message}>
              <Textarea id={id('notes')} value={field.value} onChange={(_e, d) => field.onChange(d.value)} onBlur={field.onBlur} resize="vertical" />
            </Field>
          )}
        />
      </div>
      <FormActions
        submitLabel={item ? 'Save' : 'Add'}
        isSaving={isSaving}
        hasDraft={hasDraft}
        onCancel={() => {
          clear();
          onDone();
        }}
      />
      <ConfirmDialog
        open={unsolved !== undefined}
        title="The ties do not meet"
        confirmLabel="Save without a position"
        cancelLabel="Fix the ties"
        isPending={isSavingAnyway}
        onConfirm={() => void saveAnyway()}
        onCancel={fixTies}
      >
        {`Cannot place “${label || 'this item'}” from these ties: ${unsolved?.reason ?? ''}. ${
          gps ? 'Saved now, only the phone position places it, which is much weaker than ties.' : 'Saved now, it has no position on the plan or the packet until the ties are fixed.'
        }`}
      </ConfirmDialog>
    </form>
  );
}

/** Today's date on the phone's own calendar (not UTC), as a date input wants it: `2026-12-02`. */
function todayLocalIso(now = new Date()): string {
  const pad = (n: number) => String(n).padStart(2, '0');
  return `${now.getFullYear()}-${pad(now.getMonth() + 1)}-${pad(now.getDate())}`;
}
