import { Button, Field, Input, Text } from '@fluentui/react-components';
import { Add24Regular, Delete20Regular } from '@fluentui/react-icons';
import { zodResolver } from '@hookform/resolvers/zod';
import { Controller } from 'react-hook-form';
import { z } from 'zod';
import { ZoneInputSchema } from '@domain/jobs/job-record.schema';

import { useDraftForm } from '../../../lib/drafts';
import { toSentence } from '../../../lib/form-errors';
import type { JobAsBuiltResponse } from '../../job-record';
import { useJobWriter } from '../hooks/job-writer';
import { zoneDeleteRequest } from '../utils/delete-requests';
import { fieldDomId } from '../utils/finding-target';
import { saveErrors } from '../utils/save-errors';

import { useCardStyles } from '../../../components/card-styles';
import { useDeleteRecord } from './delete-record';
import { useFormStyles } from '../../../components/form-styles';

/** A blank name is the usual mistake: say what to do; everything else is the shared schema's rule. */
const ZoneFormSchema = z.object({ name: z.string().trim().min(1, { error: 'Enter a name.' }) }).pipe(ZoneInputSchema);

/** Listening areas (patio, spa, lawn): named once, then chosen for each piece of equipment. */
export function ZonesSection({ data, canRecord }: { data: JobAsBuiltResponse; canRecord: boolean }) {
  const styles = useCardStyles();
  const formStyles = useFormStyles();
  const writer = useJobWriter();
  const deletion = useDeleteRecord();
  const jobId = data.job.id;
  const draftKey = `job:${jobId}:zone:new`;
  const { form, hasDraft } = useDraftForm(draftKey, { name: '' }, zodResolver(ZoneFormSchema));

  const add = form.handleSubmit(async (body) => {
    try {
      await writer.save({ endpoint: 'createZone', params: {}, body, draftKey, label: `New zone "${body.name}"` });
    } catch (failure) {
      const { fields, message } = saveErrors(failure);
      form.setError('name', { message: fields.name ?? message });
    }
  });

  return (
    <section aria-labelledby="section-zones" className={formStyles.form}>
      <Text as="h3" id="section-zones" size={500} weight="semibold" className={styles.title}>
        Zones ({data.asBuilt.zones.length})
      </Text>
      {data.asBuilt.zones.length === 0 ? (
        <Text as="p" className={styles.empty}>
          No zones yet.
        </Text>
      ) : (
        <ul className={styles.list} aria-label="Zones">
          {data.asBuilt.zones.map((zone) => (
            <li key={zone.id} className={styles.card} id={fieldDomId(zone.id, 'name')} tabIndex={-1}>
              <div className={styles.header}>
                <Text weight="semibold" size={400}>
                  {zone.name}
                </Text>
                <Text className={styles.facts}>
                  {data.asBuilt.items.filter((item) => item.zoneId === zone.id).length} pieces of equipment
                </Text>
                {canRecord && (
                  <Button
                    appearance="subtle"
                    className={formStyles.button}
                    icon={<Delete20Regular />}
                    aria-label={`Delete zone ${zone.name}`}
                    onClick={() => deletion.ask(zoneDeleteRequest(data.asBuilt, zone))}
                  />
                )}
              </div>
            </li>
          ))}
        </ul>
      )}
      {canRecord && (
        <form className={formStyles.form} onSubmit={(event) => void add(event)} noValidate>
          <Controller
            control={form.control}
            name="name"
            render={({ field, fieldState }) => (
              <Field
                label="New zone"
                validationMessage={fieldState.error?.message && toSentence(fieldState.error.message)}
                hint={hasDraft && field.value !== '' ? 'Not saved yet.' : undefined}
              >
                <Input
                  ref={field.ref}
                  className={formStyles.control}
                  value={field.value}
                  onChange={(_e, d) => field.onChange(d.value)}
                  onBlur={field.onBlur}
                  placeholder="Patio"
                />
              </Field>
            )}
          />
          <div className={formStyles.actions}>
            <Button type="submit" appearance="primary" className={formStyles.bigButton} icon={<Add24Regular />}>
              Add zone
            </Button>
          </div>
        </form>
      )}
      {deletion.dialog}
    </section>
  );
}
