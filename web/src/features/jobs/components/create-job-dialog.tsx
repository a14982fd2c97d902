import {
  Button,
  Dialog,
  DialogActions,
  DialogBody,
  DialogContent,
  DialogSurface,
  DialogTitle,
  DialogTrigger,
  Field,
  Input,
  makeStyles,
  MessageBar,
  MessageBarBody,
  Select,
  Spinner,
  tokens,
} from '@fluentui/react-components';
import { Add20Regular } from '@fluentui/react-icons';
import { useQuery } from '@tanstack/react-query';
import { useState, type FormEvent } from 'react';
import { useNavigate } from 'react-router';
import { CreateJobSchema } from '@domain/jobs/job.schema';

import { paths } from '../../../config/paths';
import { describeRequestError, fieldErrorsFromApi, fieldErrorsFromZod, type FieldErrors } from '../../../lib/form-errors';
import { useNotify } from '../../../components/notify';
import { useSites } from '../../sites';
import { getUsersQueryOptions } from '../../users';
import { useCreateJob } from '../api/create-job';

const useStyles = makeStyles({
  trigger: { minHeight: '48px' },
  surface: { maxWidth: '32rem' },
  form: { display: 'flex', flexDirection: 'column', gap: tokens.spacingVerticalL },
  control: { minHeight: '48px' },
  action: { minHeight: '48px' },
});

type Field = 'siteId' | 'title' | 'crewLeadUserId' | 'startDate';

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
  const [siteId, setSiteId] = useState(site?.id ?? '');
  const [title, setTitle] = useState('');
  const [crewLeadUserId, setCrewLeadUserId] = useState('');
  const [startDate, setStartDate] = useState('');
  const [errors, setErrors] = useState<FieldErrors<Field>>({});
  const sites = useSites({}, { enabled: open && !site });
  const users = useQuery({ ...getUsersQueryOptions(), enabled: open });
  const leads = (users.data ?? []).filter((user) => (user.role === 'lead' || user.role === 'office' || user.role === 'admin') && !user.isDisabled);

  const handleSubmit = (event: FormEvent) => {
    event.preventDefault();
    const parsed = CreateJobSchema.safeParse({
      siteId,
      title,
      crewLeadUserId: crewLeadUserId || null,
      startDate: startDate || null,
    });
    if (!parsed.success) {
      const found = fieldErrorsFromZod<Field>(parsed.error);
      if (siteId === '') found.siteId = 'Choose the site the job is on.';
      setErrors(found);
      return;
    }
    setErrors({});
    create.mutate(parsed.data, {
      onSuccess: (job) => {
        notify.success('Job created', job.title);
        setOpen(false);
        void navigate(paths.job.getHref(job.id));
      },
      onError: (error) => setErrors(fieldErrorsFromApi<Field>(error)),
    });
  };

  return (
    <Dialog open={open} onOpenChange={(_event, data) => !create.isPending && setOpen(data.open)}>
      <DialogTrigger disableButtonEnhancement>
        <Button appearance="primary" className={styles.trigger} icon={<Add20Regular />}>
          New job
        </Button>
      </DialogTrigger>
      <DialogSurface className={styles.surface}>
        <form onSubmit={handleSubmit} noValidate>
          <DialogBody>
            <DialogTitle>{site ? `New job at ${site.label}` : 'New job'}</DialogTitle>
            <DialogContent className={styles.form}>
              {create.isError && Object.keys(errors).length === 0 && (
                <MessageBar intent="error" layout="multiline">
                  <MessageBarBody>{describeRequestError(create.error, 'The job could not be created. Try again.')}</MessageBarBody>
                </MessageBar>
              )}
              {!site && (
                <Field label="Site" required validationMessage={errors.siteId}>
                  <Select className={styles.control} value={siteId} onChange={(_event, data) => setSiteId(data.value)}>
                    <option value="">{sites.isLoading ? 'Loading sites…' : 'Choose a site'}</option>
                    {(sites.data ?? []).map((candidate) => (
                      <option key={candidate.id} value={candidate.id}>
                        {candidate.label} — {candidate.customer.name}, {candidate.city}
                      </option>
                    ))}
                  </Select>
                </Field>
              )}
              <Field label="Title" required validationMessage={errors.title}>
                <Input className={styles.control} value={title} onChange={(_event, data) => setTitle(data.value)} placeholder="Back-yard sound, phase 1" />
              </Field>
              <Field label="Crew lead" hint="Can be chosen later." validationMessage={errors.crewLeadUserId}>
                <Select className={styles.control} value={crewLeadUserId} onChange={(_event, data) => setCrewLeadUserId(data.value)}>
                  <option value="">Nobody yet</option>
                  {leads.map((user) => (
                    <option key={user.id} value={user.id}>
                      {user.name}
                    </option>
                  ))}
                </Select>
              </Field>
              <Field label="Start date" validationMessage={errors.startDate}>
                <Input className={styles.control} type="date" value={startDate} onChange={(_event, data) => setStartDate(data.value)} />
              </Field>
            </DialogContent>
            <DialogActions fluid>
              <DialogTrigger disableButtonEnhancement>
                <Button className={styles.action} disabled={create.isPending}>
                  Cancel
                </Button>
              </DialogTrigger>
              <Button
                type="submit"
                appearance="primary"
                className={styles.action}
                disabled={create.isPending}
                icon={create.isPending ? <Spinner size="tiny" /> : undefined}
              >
                Create job
              </Button>
            </DialogActions>
          </DialogBody>
        </form>
      </DialogSurface>
    </Dialog>
  );
}
