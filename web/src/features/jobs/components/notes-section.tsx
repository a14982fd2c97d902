import { Button, Field, Text, Textarea } from '@fluentui/react-components';
import { useState } from 'react';

import { useNotify } from '../../../components/notify';
import { usePersistedDraft } from '../../../lib/drafts';
import type { JobAsBuiltResponse } from '../api/get-job-as-built';
import { useJobWriter } from '../hooks/job-writer';
import { saveErrors } from '../utils/save-errors';

import { useCardStyles } from './card-styles';
import { useFormStyles } from './form-styles';

/** The job's notes, and the office's comment when it sent the job back. */
export function NotesSection({ data, canChange }: { data: JobAsBuiltResponse; canChange: boolean }) {
  const styles = useCardStyles();
  const formStyles = useFormStyles();
  const notify = useNotify();
  const writer = useJobWriter();
  const draftKey = `job:${data.job.id}:notes`;
  const { value, setValue, hasDraft, clear } = usePersistedDraft(draftKey, data.job.notes ?? '');
  const [error, setError] = useState<string | undefined>();

  const save = async () => {
    try {
      const outcome = await writer.save({ method: 'PATCH', path: '', body: { notes: value.trim() === '' ? null : value }, draftKey, label: 'Job notes' });
      if (outcome === 'saved') notify.success('Notes saved');
      setError(undefined);
    } catch (failure) {
      const { fields, message } = saveErrors(failure);
      setError(fields.notes ?? message);
    }
  };

  return (
    <section aria-labelledby="section-notes" className={formStyles.form}>
      <Text as="h3" id="section-notes" size={500} weight="semibold" className={styles.title}>
        Notes
      </Text>
      {data.job.reviewComment && (
        <div className={styles.card}>
          <Text weight="semibold">From the office</Text>
          <Text>{data.job.reviewComment}</Text>
        </div>
      )}
      <Field label="Notes for the office and the packet" validationMessage={error} hint={hasDraft ? 'Not saved yet.' : undefined}>
        <Textarea value={value} onChange={(_e, d) => setValue(d.value)} readOnly={!canChange} resize="vertical" rows={6} />
      </Field>
      {canChange && (
        <div className={formStyles.actions}>
          <Button appearance="primary" className={formStyles.bigButton} disabled={!hasDraft} onClick={() => void save()}>
            Save notes
          </Button>
          {hasDraft && (
            <Button className={formStyles.bigButton} onClick={clear}>
              Discard changes
            </Button>
          )}
        </div>
      )}
    </section>
  );
}
