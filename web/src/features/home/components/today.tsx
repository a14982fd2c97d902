import { makeStyles, Spinner, Text, tokens } from '@fluentui/react-components';
import type { Role } from '@domain/auth/roles';
import { Link } from 'react-router';

import { PageHeader } from '../../../components/page-header';
import { paths } from '../../../config/paths';
import { useTodayJobs } from '../api/get-home-jobs';
import { compareForToday } from '../utils/next-step';

import { HomeJobList } from './home-job-list';

const useStyles = makeStyles({
  section: { display: 'flex', flexDirection: 'column', gap: tokens.spacingVerticalM },
  empty: { margin: 0, padding: tokens.spacingHorizontalL, borderRadius: tokens.borderRadiusLarge, backgroundColor: tokens.colorNeutralBackground1 },
  more: { display: 'inline-flex', alignItems: 'center', minHeight: '44px', color: tokens.colorBrandForegroundLink },
  error: { color: tokens.colorPaletteRedForeground1 },
});

/** A crew lead's or technician's home: the jobs they are on, the work in hand first, each with its next step. */
export function Today({ role }: { role: Role }) {
  const styles = useStyles();
  const jobs = useTodayJobs();
  const items = [...(jobs.data?.items ?? [])].sort(compareForToday);
  const allMine = `${paths.jobs.getHref()}?mine=true`;

  return (
    <>
      <PageHeader title="Today" description="The jobs you are on, the one in hand first, and what to do next on each." />
      <section className={styles.section} aria-labelledby="today-jobs">
        <Text as="h3" id="today-jobs" size={500} weight="semibold" style={{ margin: 0 }}>
          Your jobs
        </Text>
        {jobs.isPending ? (
          <Spinner size="small" label="Loading your jobs…" labelPosition="after" />
        ) : jobs.isError ? (
          <Text role="alert" className={styles.error}>
            Your jobs could not be loaded. Check the signal, then pull down or reload the page.
          </Text>
        ) : items.length === 0 ? (
          <Text as="p" className={styles.empty}>
            You are on no open job. When the office puts you on a job's crew, it shows here.
          </Text>
        ) : (
          <HomeJobList label="Your open jobs" jobs={items} role={role} />
        )}
        {jobs.data && jobs.data.total > jobs.data.items.length && (
          <Text>
            Showing the first {jobs.data.items.length} of {jobs.data.total}.
          </Text>
        )}
        {jobs.data && (
          <Link to={allMine} className={styles.more}>
            All your jobs, issued ones too
          </Link>
        )}
      </section>
    </>
  );
}
