import { Button, Field, Input, Text } from '@fluentui/react-components';
import { Add24Regular, Delete20Regular } from '@fluentui/react-icons';
import { useState, type FormEvent } from 'react';
import { ZoneInputSchema } from '@domain/jobs/job-record.schema';

import { useNotify } from '../../../components/notify';
import { usePersistedDraft } from '../../../lib/drafts';
import { fieldErrorsFromZod } from '../../../lib/form-errors';
import type { JobAsBuiltResponse } from '../api/get-job-as-built';
import { useJobWriter } from '../hooks/job-writer';
import { fieldDomId } from '../utils/finding-target';
import { saveErrors } from '../utils/save-errors';

import { useCardStyles } from './card-styles';
import { useFormStyles } from './form-styles';

/** Listening areas (patio, spa, lawn): named once, then chosen for each piece of equipment. */
export function ZonesSection({ data, canRecord }: { data: JobAsBuiltResponse; canRecord: boolean }) {
  const styles = useCardStyles();
  const formStyles = useFormStyles();
  const notify = useNotify();
  const writer = useJobWriter();
  const jobId = data.job.id;
  const draftKey = `job:${jobId}:zone:new`;
  const { value: name, setValue: setName } = usePersistedDraft(draftKey, '');
  const [error, setError] = useState<string | undefined>();

  const add = async (event: FormEvent) => {
    event.preventDefault();
    const parsed = ZoneInputSchema.safeParse({ name });
    if (!parsed.success) {
      setError(fieldErrorsFromZod<'name'>(parsed.error).name ?? 'Enter a name.');
      return;
    }
    setError(undefined);
    try {
      await writer.save({ method: 'POST', path: '/zones', body: parsed.data, draftKey, label: `New zone "${parsed.data.name}"`, isAdditive: true });
    } catch (failure) {
      const { fields, message } = saveErrors(failure);
      setError(fields.name ?? message);
    }
  };

  const remove = async (zoneId: string, zoneName: string) => {
    try {
      await writer.save({ method: 'DELETE', path: `/zones/${zoneId}`, label: `Removing zone "${zoneName}"` });
      notify.success('Zone removed', `Its equipment stays, without a zone.`);
    } catch (failure) {
      notify.error('Could not remove the zone', saveErrors(failure).message);
    }
  };

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
                    aria-label={`Remove zone ${zone.name}`}
                    onClick={() => void remove(zone.id, zone.name)}
                  />
                )}
              </div>
            </li>
          ))}
        </ul>
      )}
      {canRecord && (
        <form className={formStyles.form} onSubmit={(event) => void add(event)} noValidate>
          <Field label="New zone" validationMessage={error}>
            <Input className={formStyles.control} value={name} onChange={(_e, d) => setName(d.value)} placeholder="Patio" />
          </Field>
          <div className={formStyles.actions}>
            <Button type="submit" appearance="primary" className={formStyles.bigButton} icon={<Add24Regular />}>
              Add zone
            </Button>
          </div>
        </form>
      )}
    </section>
  );
}
