import { Button, Checkbox, Field, Input, MessageBar, MessageBarBody, Select, Spinner, Text, Textarea } from '@fluentui/react-components';
import { Add20Regular, Delete20Regular } from '@fluentui/react-icons';
import { useEffect, useRef, useState, type FormEvent } from 'react';
import type { AsBuilt } from '@domain/as-built/as-built.schema';
import type { Item, ItemKind } from '@domain/as-built/item.schema';
import { ItemInputSchema } from '@domain/jobs/job-record.schema';

import { useNotify } from '../../../components/notify';
import { usePersistedDraft } from '../../../lib/drafts';
import { fieldErrorsFromZod } from '../../../lib/form-errors';
import { lengthInputValue, parseLength } from '../../../lib/units';
import { useUnitPreferences } from '../../../lib/use-unit-preferences';
import { useJobWriter } from '../hooks/job-writer';
import { fieldDomId } from '../utils/finding-target';
import { ITEM_KIND_LABELS } from '../utils/record-labels';
import { saveErrors } from '../utils/save-errors';

import { useFormStyles } from './form-styles';
import { LengthInput } from './length-input';
import { TiesEditor, type TieDraft } from './ties-editor';

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
    installDate: item?.installDate ?? '',
    warrantyEnd: item?.warrantyEnd ?? '',
    notes: item?.notes ?? '',
    ties: (item?.ties ?? []).map((tie) => ({ referencePointId: tie.referencePointId, distance: lengthInputValue(tie.distanceM, units.length, 'long') })),
    sideHint: item?.sideHint ?? '',
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
    position: item?.position,
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
  const draftKey = `job:${jobId}:item:${item?.id ?? `new-${kinds.join('-')}`}`;
  const recordId = item?.id ?? 'new-item';
  const { value: draft, setValue, hasDraft, clear } = usePersistedDraft<ItemDraft>(draftKey, draftOf(item, kind, units));
  const [errors, setErrors] = useState<Record<string, string>>({});
  const [message, setMessage] = useState<string | undefined>();
  const [isSaving, setIsSaving] = useState(false);
  const formRef = useRef<HTMLFormElement>(null);
  const set = <K extends keyof ItemDraft>(key: K, value: ItemDraft[K]) => setValue((current) => ({ ...current, [key]: value }));
  const id = (field: string) => fieldDomId(recordId, field);

  useEffect(() => {
    if (!focusField) return;
    formRef.current?.querySelector<HTMLElement>(`#${CSS.escape(fieldDomId(recordId, focusField))}`)?.focus();
  }, [focusField, recordId]);

  const handleSubmit = async (event: FormEvent) => {
    event.preventDefault();
    const body = bodyOf(draft, item, units);
    const parsed = ItemInputSchema.safeParse(body);
    const found: Record<string, string> = parsed.success ? {} : (fieldErrorsFromZod(parsed.error) as Record<string, string>);
    setErrors(found);
    setMessage(undefined);
    if (!parsed.success) return;
    setIsSaving(true);
    try {
      const outcome = await writer.save({
        method: item ? 'PUT' : 'POST',
        path: item ? `/items/${item.id}` : '/items',
        body,
        draftKey,
        label: item ? `Changes to "${draft.label}"` : `New ${ITEM_KIND_LABELS[draft.kind].toLowerCase()} "${draft.label}"`,
        isAdditive: !item,
      });
      if (outcome === 'saved') notify.success(item ? 'Saved' : 'Added', draft.label);
      onDone();
    } catch (error) {
      const { fields, message: problem } = saveErrors(error);
      setErrors(fields);
      setMessage(problem);
    } finally {
      setIsSaving(false);
    }
  };

  const numberField = (field: keyof ItemDraft & string, label: string, errorKey: string = field, hint?: string) => (
    <Field label={label} validationMessage={errors[errorKey]} hint={hint}>
      <Input
        id={id(errorKey)}
        className={styles.control}
        inputMode="decimal"
        value={String(draft[field])}
        onChange={(_e, d) => set(field, d.value as never)}
      />
    </Field>
  );
  const textField = (field: keyof ItemDraft & string, label: string, placeholder?: string) => (
    <Field label={label} validationMessage={errors[field]}>
      <Input id={id(field)} className={styles.control} value={String(draft[field])} placeholder={placeholder} onChange={(_e, d) => set(field, d.value as never)} />
    </Field>
  );

  return (
    <form ref={formRef} className={styles.form} onSubmit={(event) => void handleSubmit(event)} noValidate>
      {message && (
        <MessageBar intent="error" layout="multiline">
          <MessageBarBody>{message}</MessageBarBody>
        </MessageBar>
      )}
      {hasDraft && <Text className={styles.unsaved}>Not saved yet: your input is kept on this device until you save.</Text>}
      <div className={styles.grid}>
        {!item && kinds.length > 1 && (
          <Field label="Kind" required>
            <Select id={id('kind')} className={styles.control} value={draft.kind} onChange={(_e, d) => set('kind', d.value as ItemKind)}>
              {kinds.map((candidate) => (
                <option key={candidate} value={candidate}>
                  {ITEM_KIND_LABELS[candidate]}
                </option>
              ))}
            </Select>
          </Field>
        )}
        <Field label="Name" required validationMessage={errors.label}>
          <Input id={id('label')} className={styles.control} value={draft.label} onChange={(_e, d) => set('label', d.value)} />
        </Field>
        {draft.kind === 'amplifier' && (
          <>
            {numberField('ratedWatts8Ohm', 'Rated watts per channel at 8 Ω')}
            {numberField('ratedWatts4Ohm', 'Rated watts at 4 Ω (if rated)')}
            {numberField('minimumImpedanceOhm', 'Lowest stable load (Ω)')}
            <div className={styles.wide}>
              <Text weight="semibold" id={id('channels')} tabIndex={-1}>
                Channels
              </Text>
              {draft.channels.map((channel, i) => (
                <div key={channel.id ?? `new-${i}`} className={styles.actions}>
                  <Field label={`Channel ${i + 1} name`}>
                    <Input
                      className={styles.control}
                      value={channel.name}
                      onChange={(_e, d) => set('channels', draft.channels.map((c, j) => (j === i ? { ...c, name: d.value } : c)))}
                    />
                  </Field>
                  {draft.channels.length > 1 && (
                    <Button
                      appearance="subtle"
                      className={styles.button}
                      icon={<Delete20Regular />}
                      aria-label={`Remove channel ${channel.name}`}
                      onClick={() => set('channels', draft.channels.filter((_c, j) => j !== i))}
                    />
                  )}
                </div>
              ))}
              <Button className={styles.button} icon={<Add20Regular />} onClick={() => set('channels', [...draft.channels, { name: `Channel ${draft.channels.length + 1}` }])}>
                Add a channel
              </Button>
            </div>
          </>
        )}
        {draft.kind === 'speaker' && (
          <>
            <Field label="Wired as">
              <Select className={styles.control} value={draft.speakerType} onChange={(_e, d) => set('speakerType', d.value as 'lowz' | 'cv')}>
                <option value="lowz">Low impedance (Ω)</option>
                <option value="cv">Constant-voltage line (tap watts)</option>
              </Select>
            </Field>
            {draft.speakerType === 'lowz' ? (
              numberField('nominalImpedanceOhm', 'Nominal impedance (Ω)')
            ) : (
              <>
                <Field label="Line">
                  <Select className={styles.control} value={draft.cvLine} onChange={(_e, d) => set('cvLine', d.value as ItemDraft['cvLine'])}>
                    <option value="25V">25 V</option>
                    <option value="70V">70 V</option>
                    <option value="100V">100 V</option>
                  </Select>
                </Field>
                {numberField('tapWatts', 'Tap (watts)', 'constantVoltage')}
              </>
            )}
            {numberField('dcResistanceOhm', 'DC resistance (Ω), if known')}
          </>
        )}
        {draft.kind === 'subwoofer' && (
          <>
            <Field label="Voice coils">
              <Select className={styles.control} value={draft.voiceCoils} onChange={(_e, d) => set('voiceCoils', d.value as 'single' | 'dual')}>
                <option value="single">Single</option>
                <option value="dual">Dual</option>
              </Select>
            </Field>
            {numberField('coilImpedanceOhm', 'Impedance of one coil (Ω)')}
            {draft.voiceCoils === 'dual' && (
              <Field label="Coils wired" validationMessage={errors.coilWiring}>
                <Select id={id('coilWiring')} className={styles.control} value={draft.coilWiring} onChange={(_e, d) => set('coilWiring', d.value as ItemDraft['coilWiring'])}>
                  <option value="">Choose…</option>
                  <option value="series">In series</option>
                  <option value="parallel">In parallel</option>
                  <option value="separate_channels">Each on its own channel</option>
                </Select>
              </Field>
            )}
            {numberField('dcResistanceOhm', 'DC resistance per coil (Ω), if known', 'dcResistanceOhmPerCoil')}
          </>
        )}
        {(draft.kind === 'speaker' || draft.kind === 'subwoofer') && (
          <Field label="Runs leaving it are wired">
            <Select className={styles.control} value={draft.onwardWiring} onChange={(_e, d) => set('onwardWiring', d.value as ItemDraft['onwardWiring'])}>
              <option value="">In parallel (loop-through)</option>
              <option value="series">In series</option>
            </Select>
          </Field>
        )}
        {draft.kind === 'junction' && (
          <>
            {textField('spliceType', 'Splice type', 'Gel-filled connectors in a valve box')}
            <Checkbox className={styles.control} checked={draft.isAccessible} onChange={(_e, d) => set('isAccessible', d.checked === true)} label="Can be reached without digging" />
          </>
        )}
        {draft.kind === 'spare_end' && (
          <>
            <Checkbox className={styles.control} checked={draft.isCapped} onChange={(_e, d) => set('isCapped', d.checked === true)} label="Capped" />
            {textField('marker', 'Marker', 'Orange flag, buried 6 in')}
          </>
        )}
        {draft.kind === 'wall_entry' && (
          <>
            {textField('wallMaterial', 'Wall material', 'Brick veneer')}
            <LengthInput id={id('holeDiameterM')} label="Hole size" scale="short" value={draft.holeDiameter} onChange={(v) => set('holeDiameter', v)} error={errors.holeDiameterM} />
            {textField('sleeve', 'Sleeve or conduit', '3/4 in PVC sleeve')}
            {textField('sealant', 'Sealant', 'Polyurethane sealant')}
            {textField('outsideLocation', 'Outside, where', 'Left of the patio door, 30 cm up')}
            {textField('insideLocation', 'Inside, where', 'Behind the media cabinet')}
          </>
        )}
        <Field label="Zone" validationMessage={errors.zoneId}>
          <Select id={id('zoneId')} className={styles.control} value={draft.zoneId} onChange={(_e, d) => set('zoneId', d.value)}>
            <option value="">No zone</option>
            {asBuilt.zones.map((zone) => (
              <option key={zone.id} value={zone.id}>
                {zone.name}
              </option>
            ))}
          </Select>
        </Field>
        {textField('model', 'Model')}
        {textField('serial', 'Serial number')}
        <Field label="Installed on" validationMessage={errors.installDate}>
          <Input id={id('installDate')} type="date" className={styles.control} value={draft.installDate} onChange={(_e, d) => set('installDate', d.value)} />
        </Field>
        <Field label="Warranty ends" validationMessage={errors.warrantyEnd}>
          <Input id={id('warrantyEnd')} type="date" className={styles.control} value={draft.warrantyEnd} onChange={(_e, d) => set('warrantyEnd', d.value)} />
        </Field>
        {draft.kind !== 'amplifier' && (
          <div className={styles.wide}>
            <TiesEditor
              recordId={recordId}
              referencePoints={asBuilt.referencePoints}
              ties={draft.ties}
              sideHint={draft.sideHint}
              onChange={(ties, sideHint) => setValue((current) => ({ ...current, ties, sideHint }))}
              error={errors.ties}
            />
          </div>
        )}
        <Field label="Notes" className={styles.wide}>
          <Textarea id={id('notes')} value={draft.notes} onChange={(_e, d) => set('notes', d.value)} resize="vertical" />
        </Field>
      </div>
      <div className={styles.actions}>
        <Button type="submit" appearance="primary" className={styles.bigButton} disabled={isSaving} icon={isSaving ? <Spinner size="tiny" /> : undefined}>
          {item ? 'Save' : 'Add'}
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
