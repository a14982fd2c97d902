import { Button, Field, Input, MessageBar, MessageBarBody, Select, Text, Textarea } from '@fluentui/react-components';
import { zodResolver } from '@hookform/resolvers/zod';
import { Controller } from 'react-hook-form';
import { z } from 'zod';
import type { AmplifierItem } from '@domain/as-built/item.schema';
import { ChannelSetupSchema, type ChannelSetup } from '@domain/jobs/job-record.schema';

import { useNotify } from '../../../components/notify';
import { useDraftForm } from '../../../lib/drafts';
import type { JobAsBuiltResponse } from '../../job-record';
import { useJobWriter } from '../hooks/job-writer';
import { saveErrors } from '../utils/save-errors';

import { useCardStyles } from '../../../components/card-styles';
import { useFormStyles } from '../../../components/form-styles';

type SetupDraft = Record<'source' | 'gain' | 'volumeLimit' | 'eq' | 'crossover' | 'firmware' | 'networkName' | 'notes', string> & {
  polarity: '' | 'normal' | 'inverted';
};

const TEXT_FIELDS: { key: Exclude<keyof SetupDraft, 'polarity' | 'notes'>; label: string; placeholder: string }[] = [
  { key: 'source', label: 'Source', placeholder: 'Streamer input 1' },
  { key: 'gain', label: 'Gain', placeholder: '−6 dB' },
  { key: 'volumeLimit', label: 'Volume limit', placeholder: '70 %' },
  { key: 'eq', label: 'EQ', placeholder: 'Outdoor preset, +2 dB at 60 Hz' },
  { key: 'crossover', label: 'Crossover', placeholder: 'HPF 80 Hz 24 dB/oct' },
  { key: 'firmware', label: 'Firmware', placeholder: '2.4.1' },
  { key: 'networkName', label: 'Network name (never the password)', placeholder: 'Backyard-Audio' },
];

const orNull = (value: string) => (value.trim() === '' ? null : value.trim());

/** Blank fields are "not recorded" (null); the rest is checked by the shared schema under each field. */
const SetupFormSchema = z
  .object({
    source: z.string(),
    gain: z.string(),
    volumeLimit: z.string(),
    eq: z.string(),
    crossover: z.string(),
    polarity: z.enum(['', 'normal', 'inverted']),
    firmware: z.string(),
    networkName: z.string(),
    notes: z.string(),
  })
  .transform((draft): z.input<typeof ChannelSetupSchema> => ({
    source: orNull(draft.source),
    gain: orNull(draft.gain),
    volumeLimit: orNull(draft.volumeLimit),
    eq: orNull(draft.eq),
    crossover: orNull(draft.crossover),
    polarity: draft.polarity === '' ? null : draft.polarity,
    firmware: orNull(draft.firmware),
    networkName: orNull(draft.networkName),
    notes: orNull(draft.notes),
  }))
  .pipe(ChannelSetupSchema);

/** How each amplifier channel was left: source, gain, limits, EQ, crossover, polarity, firmware. */
export function AmpSetupSection({ data, canRecord }: { data: JobAsBuiltResponse; canRecord: boolean }) {
  const styles = useCardStyles();
  const formStyles = useFormStyles();
  const amps = data.asBuilt.items.filter((item): item is AmplifierItem => item.kind === 'amplifier');
  return (
    <section aria-labelledby="section-amp" className={formStyles.form}>
      <Text as="h3" id="section-amp" size={500} weight="semibold" className={styles.title}>
        Amplifier setup
      </Text>
      <MessageBar intent="info">
        <MessageBarBody>Record the network name only. Never write a Wi-Fi or account password here: the packet is handed to the homeowner.</MessageBarBody>
      </MessageBar>
      {amps.length === 0 && (
        <Text as="p" className={styles.empty}>
          No amplifier recorded yet: add it under Equipment.
        </Text>
      )}
      {amps.flatMap((amp) =>
        amp.channels.map((channel) => (
          <ChannelSetupCard
            key={channel.id}
            jobId={data.job.id}
            amp={amp}
            channel={channel}
            setup={data.records.channelSetups[channel.id]}
            canRecord={canRecord}
          />
        )),
      )}
    </section>
  );
}

type ChannelSetupCardProps = {
  jobId: string;
  amp: AmplifierItem;
  channel: AmplifierItem['channels'][number];
  setup: ChannelSetup | undefined;
  canRecord: boolean;
};

function ChannelSetupCard({ jobId, amp, channel, setup, canRecord }: ChannelSetupCardProps) {
  const styles = useCardStyles();
  const formStyles = useFormStyles();
  const notify = useNotify();
  const writer = useJobWriter();
  const draftKey = `job:${jobId}:setup:${channel.id}`;
  const initial: SetupDraft = {
    source: setup?.source ?? '',
    gain: setup?.gain ?? '',
    volumeLimit: setup?.volumeLimit ?? '',
    eq: setup?.eq ?? '',
    crossover: setup?.crossover ?? '',
    polarity: setup?.polarity ?? '',
    firmware: setup?.firmware ?? '',
    networkName: setup?.networkName ?? '',
    notes: setup?.notes ?? '',
  };
  const { form, hasDraft, clear } = useDraftForm<SetupDraft, ChannelSetup>(draftKey, initial, zodResolver(SetupFormSchema));

  const save = form.handleSubmit(async (body) => {
    try {
      const outcome = await writer.save({
        endpoint: 'updateChannelSetup',
        params: { itemId: amp.id, channelId: channel.id },
        body,
        draftKey,
        label: `Setup of ${amp.label} · ${channel.name}`,
      });
      if (outcome === 'saved') notify.success('Setup saved', `${amp.label} · ${channel.name}`);
    } catch (failure) {
      const { fields, message } = saveErrors(failure);
      for (const [field, text] of Object.entries(fields)) if (field in initial) form.setError(field as keyof SetupDraft, { message: text });
      if (message) notify.error('Could not save the setup', message);
    }
  });

  return (
    <div className={styles.card} aria-label={`${amp.label} · ${channel.name}`}>
      <Text as="h4" size={400} weight="semibold" className={styles.title}>
        {amp.label} · {channel.name}
      </Text>
      <div className={formStyles.grid}>
        {TEXT_FIELDS.map((text) => (
          <Controller
            key={text.key}
            control={form.control}
            name={text.key}
            render={({ field, fieldState }) => (
              <Field label={text.label} validationMessage={fieldState.error?.message}>
                <Input
                  ref={field.ref}
                  className={formStyles.control}
                  value={field.value}
                  placeholder={`e.g. ${text.placeholder}`}
                  readOnly={!canRecord}
                  autoComplete="off"
                  onChange={(_e, d) => field.onChange(d.value)}
                  onBlur={field.onBlur}
                />
              </Field>
            )}
          />
        ))}
        <Controller
          control={form.control}
          name="polarity"
          render={({ field, fieldState }) => (
            <Field label="Polarity" validationMessage={fieldState.error?.message}>
              <Select className={formStyles.control} value={field.value} disabled={!canRecord} onChange={(_e, d) => field.onChange(d.value)} onBlur={field.onBlur}>
                <option value="">Not recorded</option>
                <option value="normal">Normal</option>
                <option value="inverted">Inverted</option>
              </Select>
            </Field>
          )}
        />
        <Controller
          control={form.control}
          name="notes"
          render={({ field, fieldState }) => (
            <Field label="Notes" className={formStyles.wide} validationMessage={fieldState.error?.message}>
              <Textarea value={field.value} readOnly={!canRecord} onChange={(_e, d) => field.onChange(d.value)} onBlur={field.onBlur} resize="vertical" />
            </Field>
          )}
        />
      </div>
      {canRecord && (
        <div className={formStyles.actions}>
          <Button appearance="primary" className={formStyles.bigButton} disabled={!hasDraft || form.formState.isSubmitting} onClick={() => void save()}>
            Save setup
          </Button>
          {hasDraft && (
            <Button className={formStyles.bigButton} onClick={clear}>
              Discard changes
            </Button>
          )}
        </div>
      )}
    </div>
  );
}
