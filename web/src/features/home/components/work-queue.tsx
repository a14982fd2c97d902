import { makeStyles, Spinner, Text, tokens } from '@fluentui/react-components';
import type { Role } from '@domain/auth/roles';
import type { JobStatus } from '@domain/jobs/job-rules';
import { Link } from 'react-router';

import { PageHeader } from '../../../components/page-header';
import { paths } from '../../../config/paths';
import { FailedDeliveriesCard } from '../../delivery';
import { useQueueJobs } from '../api/get-home-jobs';

import { HomeJobList } from './home-job-list';

const useStyles = makeStyles({
  page: { display: 'flex', flexDirection: 'column', gap: tokens.spacingVerticalXXL },
  section: { display: 'flex', flexDirection: 'column', gap: tokens.spacingVerticalM },
  head: { display: 'flex', flexWrap: 'wrap', alignItems: 'baseline', justifyContent: 'space-between', gap: tokens.spacingHorizontalM },
  heading: { margin: 0 },
  muted: { color: tokens.colorNeutralForeground2 },
  empty: { margin: 0, padding: tokens.spacingHorizontalL, borderRadius: tokens.borderRadiusLarge, backgroundColor: tokens.colorNeutralBackground1 },
  more: { display: 'inline-flex', alignItems: 'center', minHeight: '44px', color: tokens.colorBrandForegroundLink },
  error: { color: tokens.colorPaletteRedForeground1 },
});

type QueueSectionProps = {
  id: string;
  status: JobStatus;
  title: string;
  description: string;
  emptyText: string;
  role: Role;
};

function QueueSection({ id, status, title, description, emptyText, role }: QueueSectionProps) {
  const styles = useStyles();
  const jobs = useQueueJobs(status);
  const total = jobs.data?.total;
  return (
    <section className={styles.section} aria-labelledby={id}>
      <div className={styles.head}>
        <Text as="h3" id={id} size={500} weight="semibold" className={styles.heading}>
          {title}
          {total !== undefined && ` (${total})`}
        </Text>
        <Link to={`${paths.jobs.getHref()}?status=${status}`} className={styles.more}>
          Open in the jobs list
        </Link>
      </div>
      <Text className={styles.muted}>{description}</Text>
      {jobs.isPending ? (
        <Spinner size="small" label="Loading…" labelPosition="after" />
      ) : jobs.isError ? (
        <Text role="alert" className={styles.error}>
          This list could not be loaded. Reload the page to try again.
        </Text>
      ) : jobs.data.items.length === 0 ? (
        <Text as="p" className={styles.empty}>
          {emptyText}
        </Text>
      ) : (
        <>
          <HomeJobList label={title} jobs={jobs.data.items} role={role} />
          {jobs.data.total > jobs.data.items.length && (
            <Text className={styles.muted}>
              The {jobs.data.items.length} waiting longest of {jobs.data.total}.
            </Text>
          )}
        </>
      )}
    </section>
  );
}

/**
 * The office's and admin's home: what waits on them, oldest first: submitted jobs to review, jobs
 * ready to issue, and packet e-mails that failed (shown only when there are some).
 */
export function WorkQueue({ role }: { role: Role }) {
  const styles = useStyles();
  return (
    <>
      <PageHeader title="Work queue" description="What is waiting on the office, the longest-waiting first." />
      <div className={styles.page}>
        <FailedDeliveriesCard />
        <QueueSection
          id="queue-review"
          status="submitted"
          title="To review"
          description="Submitted by the crew: check the record, then mark it ready to issue or send it back with a comment."
          emptyText="No job is waiting for review."
          role={role}
        />
        <QueueSection
          id="queue-issue"
          status="ready_to_issue"
          title="Ready to issue"
          description="Reviewed: issue the handover packet and send it to the homeowner."
          emptyText="No job is waiting to be issued."
          role={role}
        />
      </div>
    </>
  );
}
