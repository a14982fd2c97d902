import { Button, Combobox, Field, makeStyles, MessageBar, MessageBarBody, Option, Select, Text, tokens } from '@fluentui/react-components';
import { PeopleTeam20Regular } from '@fluentui/react-icons';
import { useQuery } from '@tanstack/react-query';
import { useState } from 'react';
import { Controller } from 'react-hook-form';
import { z } from 'zod';
import { JobDetailsSchema, type JobResponse, type UpdateJobInput } from '@domain/jobs/job.schema';

import { FormDialog, FormTextField, type FormDialogHelpers } from '../../../components/form-dialog';
import { useNotify } from '../../../components/notify';
import { describeRequestError } from '../../../lib/form-errors';
import { formatDate } from '../../../lib/format-date';
import { useDateStyle } from '../../../lib/use-date-style';
import { getUsersQueryOptions } from '../../users';
import { useJobWriter } from '../hooks/job-writer';

const useStyles = makeStyles({
  trigger: { minHeight: '48px' },
  surface: { maxWidth: '34rem' },
  dates: {
    display: 'grid',
    gridTemplateColumns: 'minmax(0, 1fr)',
    gap: tokens.spacingVerticalL,
    '@media (min-width: 480px)': { gridTemplateColumns: 'repeat(2, minmax(0, 1fr))', columnGap: tokens.spacingHorizontalL },
  },
  control: { minHeight: '48px' },
  facts: { display: 'grid', gridTemplateColumns: 'max-content minmax(0, 1fr)', gap: `${tokens.spacingVerticalS} ${tokens.spacingHorizontalL}`, margin: 0 },
  term: { color: tokens.colorNeutralForeground2 },
  value: { margin: 0 },
});

/** The crew and the dates as the form holds them: empty text for "nobody" or "no date". */
const JobDetailsFormSchema = z
  .object({
    crewLeadUserId: z.string(),
    technicianUserIds: z.array(z.string()),
    startDate: z.string(),
    endDate: z.string(),
  })
  .transform((form) => ({
    crewLeadUserId: form.crewLeadUserId === '' ? null : form.crewLeadUserId,
    technicianUserIds: form.technicianUserIds,
    startDate: form.startDate === '' ? null : form.startDate,
    endDate: form.endDate === '' ? null : form.endDate,
  }))
  .pipe(
    JobDetailsSchema.pick({ crewLeadUserId: true, technicianUserIds: true, startDate: true, endDate: true }).refine(
      (v) => !v.startDate || !v.endDate || v.startDate <= v.endDate,
      { error: 'Must not be before the start date.', path: ['endDate'] },
    ),
  );
type JobDetailsForm = z.input<typeof JobDetailsFormSchema>;
type JobDetailsOutput = z.output<typeof JobDetailsFormSchema>;
const FIELDS = ['crewLeadUserId', 'technicianUserIds', 'startDate', 'endDate'] as const satisfies readonly (keyof JobDetailsForm)[];

function defaultsOf(job: JobResponse): JobDetailsForm {
  return {
    crewLeadUserId: job.crewLead?.id ?? '',
    technicianUserIds: job.technicians.map((person) => person.id),
    startDate: job.startDate ?? '',
    endDate: job.endDate ?? '',
  };
}

type JobDetailsDialogProps = { job: JobResponse; canChange: boolean };

/**
 * The job's crew and dates. The office changes them here (a versioned job write, like any other);
 * everyone else sees them read-only.
 */
export function JobDetailsDialog({ job, canChange }: JobDetailsDialogProps) {
  const styles = useStyles();
  const notify = useNotify();
  const writer = useJobWriter();
  const [open, setOpen] = useState(false);
  const users = useQuery({ ...getUsersQueryOptions(), enabled: open && canChange });

  const active = (users.data ?? []).filter((user) => !user.isDisabled);
  // The same roles the API accepts (jobs.service): leads may be office or admin too; the crew are techs and leads.
  const leads = active.filter((user) => user.role === 'lead' || user.role === 'office' || user.role === 'admin');
  const technicians = active.filter((user) => user.role === 'tech' || user.role === 'lead');
  const nameOf = (id: string) =>
    users.data?.find((user) => user.id === id)?.name ?? job.technicians.find((person) => person.id === id)?.name ?? 'Someone';

  const save = async (values: JobDetailsOutput, { close, showFieldErrors, showMessage, form }: FormDialogHelpers<JobDetailsForm, JobDetailsOutput>) => {
    const { dirtyFields } = form.formState;
    const changes: UpdateJobInput = {};
    for (const field of FIELDS) if (dirtyFields[field]) Object.assign(changes, { [field]: values[field] });
    if (Object.keys(changes).length === 0) {
      close();
      return;
    }
    try {
      const outcome = await writer.save({ endpoint: 'updateJob', params: {}, body: changes, label: 'Crew and dates' });
      if (outcome === 'saved') notify.success('Crew and dates saved', job.title);
      if (outcome === 'queued') notify.success('Waiting for a connection', 'The crew and dates are sent when you are back online.');
      if (outcome !== 'conflict') close();
    } catch (error) {
      if (!showFieldErrors(error)) showMessage(describeRequestError(error));
    }
  };

  return (
    <FormDialog
      trigger={
        <Button className={styles.trigger} icon={<PeopleTeam20Regular />}>
          Crew and dates
        </Button>
      }
      title="Crew and dates"
      formLabel="Crew and dates"
      schema={JobDetailsFormSchema}
      defaultValues={defaultsOf(job)}
      onSubmit={save}
      surfaceClassName={styles.surface}
      onOpenChange={setOpen}
      view={canChange ? undefined : { title: 'Crew and dates', content: <DetailsView job={job} /> }}
    >
      {(form, fieldError) => (
        <>
          {users.isError && (
            <MessageBar intent="warning" layout="multiline">
              <MessageBarBody>The list of people could not be loaded. {describeRequestError(users.error)}</MessageBarBody>
            </MessageBar>
          )}
          <Controller
            control={form.control}
            name="crewLeadUserId"
            render={({ field }) => (
              <Field label="Crew lead" validationMessage={fieldError('crewLeadUserId')}>
                <Select ref={field.ref} className={styles.control} value={field.value} onChange={(_event, data) => field.onChange(data.value)} onBlur={field.onBlur}>
                  <option value="">Nobody yet</option>
                  {field.value !== '' && !leads.some((user) => user.id === field.value) && <option value={field.value}>{job.crewLead?.name ?? 'Current lead'}</option>}
                  {leads.map((user) => (
                    <option key={user.id} value={user.id}>
                      {user.name}
                    </option>
                  ))}
                </Select>
              </Field>
            )}
          />
          <Controller
            control={form.control}
            name="technicianUserIds"
            render={({ field }) => (
              <Field
                label="Technicians"
                hint="They add photos, depth readings and checks on this job."
                validationMessage={fieldError('technicianUserIds') ?? form.formState.errors.technicianUserIds?.root?.message}
              >
                <Combobox
                  multiselect
                  clearable
                  className={styles.control}
                  placeholder={users.isLoading ? 'Loading people…' : 'Nobody yet'}
                  selectedOptions={field.value}
                  value={field.value.map(nameOf).join(', ')}
                  onOptionSelect={(_event, data) => field.onChange(data.selectedOptions)}
                  onBlur={field.onBlur}
                >
                  {technicians.map((user) => (
                    <Option key={user.id} value={user.id} text={user.name}>
                      {user.name} ({user.role === 'lead' ? 'crew lead' : 'technician'})
                    </Option>
                  ))}
                </Combobox>
              </Field>
            )}
          />
          <div className={styles.dates}>
            <FormTextField form={form} name="startDate" label="Start date" type="date" error={fieldError('startDate')} />
            <FormTextField form={form} name="endDate" label="Finish date" type="date" error={fieldError('endDate')} />
          </div>
        </>
      )}
    </FormDialog>
  );
}

/** The crew and dates read-only, for everyone but the office. */
function DetailsView({ job }: { job: JobResponse }) {
  const dateStyle = useDateStyle();
  const styles = useStyles();
  return (
    <>
      <dl className={styles.facts}>
        <dt className={styles.term}>Crew lead</dt>
        <dd className={styles.value}>{job.crewLead?.name ?? 'Nobody yet'}</dd>
        <dt className={styles.term}>Technicians</dt>
        <dd className={styles.value}>{job.technicians.length === 0 ? 'Nobody yet' : job.technicians.map((p) => p.name).join(', ')}</dd>
        <dt className={styles.term}>Start</dt>
        <dd className={styles.value}>{job.startDate ? formatDate(job.startDate, dateStyle) : 'Not set'}</dd>
        <dt className={styles.term}>Finish</dt>
        <dd className={styles.value}>{job.endDate ? formatDate(job.endDate, dateStyle) : 'Not set'}</dd>
      </dl>
      <Text as="p" block>
        The office changes the crew and the dates.
      </Text>
    </>
  );
}
