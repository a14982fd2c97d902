import { Button, Field, Text, Textarea } from '@fluentui/react-components';
import { zodResolver } from '@hookform/resolvers/zod';
import { Controller } from 'react-hook-form';
import { z } from 'zod';
import { JobDetailsSchema } from '@domain/jobs/job.schema';

import { useNotify } from '../../../components/notify';
import { useDraftForm } from '../../../lib/drafts';
import type { JobAsBuiltResponse } from '../../job-record';
import { useJobWriter } from '../hooks/job-writer';
import { saveErrors } from '../utils/save-errors';

import { useCardStyles } from '../../../components/card-styles';
import { useFormStyles } from '../../../components/form-styles';

/** The notes as typed; blank means "no notes" (null), as the job's schema has it. */
const NotesFormSchema = z
  .object({ notes: z.string() })
  .transform((form) => ({ notes: form.notes.trim() === '' ? null : form.notes }))
  .pipe(JobDetailsSchema.pick({ notes: true }));

/** The job's notes, and the office's comment when it sent the job back. */
export function NotesSection({ data, canChange }: { data: JobAsBuiltResponse; canChange: boolean }) {
  const styles = useCardStyles();
  const formStyles = useFormStyles();
  const notify = useNotify();
  const writer = useJobWriter();
  const draftKey = `job:${data.job.id}:notes`;
  const { form, hasDraft, clear } = useDraftForm(draftKey, { notes: data.job.notes ?? '' }, zodResolver(NotesFormSchema));

  const save = form.handleSubmit(async (body) => {
    try {
      const outcome = await writer.save({ endpoint: 'updateJob', params: {}, body, draftKey, label: 'Job notes' });
      if (outcome === 'saved') notify.success('Notes saved');
    } catch (failure) {
      const { fields, message } = saveErrors(failure);
      form.setError('notes', { message: fields.notes ?? message });
    }
  });

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
      <Controller
        control={form.control}
        name="notes"
        render={({ field, fieldState }) => (
          <Field label="Notes for the office and the packet" validationMessage={fieldState.error?.message} hint={hasDraft ? 'Not saved yet.' : undefined}>
            <Textarea
              ref={field.ref}
              value={field.value}
              onChange={(_e, d) => field.onChange(d.value)}
              onBlur={field.onBlur}
              readOnly={!canChange}
              resize="vertical"
              rows={6}
            />
          </Field>
        )}
      />
      {canChange && (
        <div className={formStyles.actions}>
          <Button appearance="primary" className={formStyles.bigButton} disabled={!hasDraft || form.formState.isSubmitting} onClick={() => void save()}>
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
