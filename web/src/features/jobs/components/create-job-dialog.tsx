import { Button, Field, makeStyles, Select } from '@fluentui/react-components';
import { Add20Regular } from '@fluentui/react-icons';
import { useQuery } from '@tanstack/react-query';
import { useMemo, useState } from 'react';
import { Controller } from 'react-hook-form';
import { useNavigate } from 'react-router';
import { z } from 'zod';
import { CreateJobSchema } from '@domain/jobs/job.schema';

import { FormDialog, FormTextField } from '../../../components/form-dialog';
import { useNotify } from '../../../components/notify';
import { paths } from '../../../config/paths';
import { blankToNull, describeRequestError } from '../../../lib/form-errors';
import { useSites } from '../../sites';
import { getUsersQueryOptions } from '../../users';
import { useCreateJob } from '../api/create-job';

const useStyles = makeStyles({
  trigger: { minHeight: '48px' },
  surface: { maxWidth: '32rem' },
  control: { minHeight: '48px' },
});

/** The form's choices as the shared schema has them: no crew lead or start date yet is null. */
const CreateJobFormSchema = z
  .object({
    siteId: z.string().min(1, { error: 'Choose the site the job is on.' }),
    title: z.string(),
    crewLeadUserId: blankToNull(),
    startDate: blankToNull(),
  })
  .pipe(CreateJobSchema);

type CreateJobDialogProps = {
  /** Creating from a site page: the site is fixed. */
  site?: { id: string; label: string };
};

/** "New job" for the office: site, title, crew lead and start date; opens the new job after. */
export function CreateJobDialog({ site }: CreateJobDialogProps) {
  const styles = useStyles();
  const notify = useNotify();
  const navigate = useNavigate();
  const create = useCreateJob();
  const [open, setOpen] = useState(false);
  const sites = useSites({}, { enabled: open && !site });
  const users = useQuery({ ...getUsersQueryOptions(), enabled: open });
  const leads = (users.data ?? []).filter((user) => (user.role === 'lead' || user.role === 'office' || user.role === 'admin') && !user.isDisabled);
  const defaultValues = useMemo(() => ({ siteId: site?.id ?? '', title: '', crewLeadUserId: '', startDate: '' }), [site?.id]);

  return (
    <FormDialog
      trigger={
        <Button appearance="primary" className={styles.trigger} icon={<Add20Regular />}>
          New job
        </Button>
      }
      title={site ? `New job at ${site.label}` : 'New job'}
      schema={CreateJobFormSchema}
      defaultValues={defaultValues}
      isPending={create.isPending}
      submitLabel="Create job"
      surfaceClassName={styles.surface}
      onOpenChange={setOpen}
      onSubmit={(input, { close, showFieldErrors, showMessage }) =>
        create.mutate(input, {
          onSuccess: (job) => {
            notify.success('Job created', job.title);
            close();
            void navigate(paths.job.getHref(job.id));
          },
          onError: (error) => {
            if (!showFieldErrors(error)) showMessage(describeRequestError(error, 'The job could not be created. Try again.'));
          },
        })
      }
    >
      {(form, fieldError) => (
        <>
          {!site && (
            <Controller
              control={form.control}
              name="siteId"
              render={({ field }) => (
                <Field label="Site" required validationMessage={fieldError('siteId')}>
                  <Select ref={field.ref} className={styles.control} value={field.value} onChange={(_event, data) => field.onChange(data.value)}>
                    <option value="">{sites.isLoading ? 'Loading sites…' : 'Choose a site'}</option>
                    {(sites.data ?? []).map((candidate) => (
                      <option key={candidate.id} value={candidate.id}>
                        {candidate.label} — {candidate.customer.name}, {candidate.city}
                      </option>
                    ))}
                  </Select>
                </Field>
              )}
            />
          )}
          <FormTextField form={form} name="title" label="Title" required placeholder="Back-yard sound, phase 1" error={fieldError('title')} />
          <Controller
            control={form.control}
            name="crewLeadUserId"
            render={({ field }) => (
              <Field label="Crew lead" hint="Can be chosen later." validationMessage={fieldError('crewLeadUserId')}>
                <Select ref={field.ref} className={styles.control} value={field.value} onChange={(_event, data) => field.onChange(data.value)}>
                  <option value="">Nobody yet</option>
                  {leads.map((user) => (
                    <option key={user.id} value={user.id}>
                      {user.name}
                    </option>
                  ))}
                </Select>
              </Field>
            )}
          />
          <FormTextField form={form} name="startDate" label="Start date" type="date" error={fieldError('startDate')} />
        </>
      )}
    </FormDialog>
  );
}
