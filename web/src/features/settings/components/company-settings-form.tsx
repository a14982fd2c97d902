import { zodResolver } from '@hookform/resolvers/zod';
import { Button, Field, makeStyles, MessageBar, MessageBarBody, Radio, RadioGroup, Spinner, Text, tokens } from '@fluentui/react-components';
import { useEffect, useState } from 'react';
import { Controller, useForm } from 'react-hook-form';
import { z } from 'zod';
import {
  type CompanySettingsResponse,
  GAUGE_UNITS,
  LENGTH_UNITS,
  PAPER_SIZES,
  type UpdateCompanySettingsInput,
} from '@domain/settings/settings.schema';

import { useNotify } from '../../../components/notify';
import { isApiError } from '../../../lib/api-client';
import { describeRequestError, toSentence } from '../../../lib/form-errors';
import { GAUGE_UNIT_LABELS, LENGTH_UNIT_LABELS } from '../../../lib/units';
import { useUpdateCompanySettings } from '../api/update-company-settings';

const useStyles = makeStyles({
  form: { display: 'flex', flexDirection: 'column', gap: tokens.spacingVerticalL },
  radio: { minHeight: '44px' },
  actions: { display: 'flex', gap: tokens.spacingHorizontalM },
  button: { minHeight: '48px' },
  muted: { color: tokens.colorNeutralForeground2 },
});

/** Every field is set here: the form always shows the whole of the company's settings. */
const CompanySettingsFormSchema = z.object({
  lengthUnits: z.enum(LENGTH_UNITS),
  gaugeUnits: z.enum(GAUGE_UNITS),
  paperSize: z.enum(PAPER_SIZES),
});
type CompanySettingsForm = z.infer<typeof CompanySettingsFormSchema>;
const FIELDS = ['lengthUnits', 'gaugeUnits', 'paperSize'] as const;

const PAPER_LABELS: Record<CompanySettingsForm['paperSize'], string> = { letter: 'US Letter', a4: 'A4' };

type CompanySettingsFormProps = { settings: CompanySettingsResponse; canChange: boolean };

/**
 * The company's defaults: the units everyone sees unless they chose their own, and the paper packets
 * are printed on. Values are stored in SI units whichever is chosen.
 */
export function CompanySettingsForm({ settings, canChange }: CompanySettingsFormProps) {
  const styles = useStyles();
  const notify = useNotify();
  const update = useUpdateCompanySettings();
  const [message, setMessage] = useState<string | undefined>();
  const values = { lengthUnits: settings.lengthUnits, gaugeUnits: settings.gaugeUnits, paperSize: settings.paperSize };
  const { control, handleSubmit, reset, setError, formState } = useForm<CompanySettingsForm>({
    resolver: zodResolver(CompanySettingsFormSchema),
    defaultValues: values,
  });

  // After a save (or someone else's), show what the server has.
  useEffect(() => {
    reset({ lengthUnits: settings.lengthUnits, gaugeUnits: settings.gaugeUnits, paperSize: settings.paperSize });
  }, [reset, settings.gaugeUnits, settings.lengthUnits, settings.paperSize]);

  const save = handleSubmit(async (form) => {
    setMessage(undefined);
    const changes: UpdateCompanySettingsInput = {};
    for (const field of FIELDS) if (formState.dirtyFields[field]) Object.assign(changes, { [field]: form[field] });
    if (Object.keys(changes).length === 0) return;
    try {
      await update.mutateAsync(changes);
      notify.success('Company settings saved');
    } catch (error) {
      const issues = isApiError(error) ? error.issues.filter((issue) => (FIELDS as readonly string[]).includes(issue.path)) : [];
      for (const issue of issues) setError(issue.path as (typeof FIELDS)[number], { message: toSentence(issue.message) });
      if (issues.length === 0) setMessage(describeRequestError(error));
    }
  });

  return (
    <form className={styles.form} onSubmit={(event) => void save(event)} noValidate aria-label="Company defaults">
      {message && (
        <MessageBar intent="error" layout="multiline">
          <MessageBarBody>{message}</MessageBarBody>
        </MessageBar>
      )}
      {!canChange && <Text className={styles.muted}>Only an admin changes the company’s defaults.</Text>}
      <Controller
        control={control}
        name="lengthUnits"
        render={({ field, fieldState }) => (
          <Field label="Lengths" hint="Runs, stations, ties and depths in the app; also what packets issued from now on print in." validationMessage={fieldState.error?.message}>
            <RadioGroup value={field.value} disabled={!canChange} onChange={(_e, d) => field.onChange(d.value)}>
              {LENGTH_UNITS.map((unit) => (
                <Radio key={unit} className={styles.radio} value={unit} label={LENGTH_UNIT_LABELS[unit]} />
              ))}
            </RadioGroup>
          </Field>
        )}
      />
      <Controller
        control={control}
        name="gaugeUnits"
        render={({ field, fieldState }) => (
          <Field label="Wire sizes" validationMessage={fieldState.error?.message}>
            <RadioGroup layout="horizontal" value={field.value} disabled={!canChange} onChange={(_e, d) => field.onChange(d.value)}>
              {GAUGE_UNITS.map((unit) => (
                <Radio key={unit} className={styles.radio} value={unit} label={GAUGE_UNIT_LABELS[unit]} />
              ))}
            </RadioGroup>
          </Field>
        )}
      />
      <Controller
        control={control}
        name="paperSize"
        render={({ field, fieldState }) => (
          <Field label="Packet paper" hint="Handover packets issued from now on are printed on this paper." validationMessage={fieldState.error?.message}>
            <RadioGroup layout="horizontal" value={field.value} disabled={!canChange} onChange={(_e, d) => field.onChange(d.value)}>
              {PAPER_SIZES.map((size) => (
                <Radio key={size} className={styles.radio} value={size} label={PAPER_LABELS[size]} />
              ))}
            </RadioGroup>
          </Field>
        )}
      />
      {canChange && (
        <div className={styles.actions}>
          <Button
            type="submit"
            appearance="primary"
            className={styles.button}
            disabled={!formState.isDirty || formState.isSubmitting}
            icon={formState.isSubmitting ? <Spinner size="tiny" /> : undefined}
          >
            Save company settings
          </Button>
          {formState.isDirty && (
            <Button className={styles.button} disabled={formState.isSubmitting} onClick={() => reset(values)}>
              Undo changes
            </Button>
          )}
        </div>
      )}
    </form>
  );
}
