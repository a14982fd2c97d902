import { makeStyles, Text, tokens } from '@fluentui/react-components';
import { ChevronRight20Regular } from '@fluentui/react-icons';
import type { Role } from '@domain/auth/roles';
import type { JobSummaryResponse } from '@domain/jobs/job.schema';
import { Link } from 'react-router';

import { paths } from '../../../config/paths';
import { formatDate } from '../../../lib/format-date';
import { useDateStyle } from '../../../lib/use-date-style';
import { JobStatusBadge } from '../../jobs';
import { nextStepFor } from '../utils/next-step';

const useStyles = makeStyles({
  list: { listStyle: 'none', margin: 0, padding: 0, display: 'flex', flexDirection: 'column', gap: tokens.spacingVerticalS },
  link: {
    display: 'flex',
    alignItems: 'center',
    gap: tokens.spacingHorizontalM,
    minHeight: '64px',
    boxSizing: 'border-box',
    padding: `${tokens.spacingVerticalM} ${tokens.spacingHorizontalL}`,
    borderRadius: tokens.borderRadiusLarge,
    backgroundColor: tokens.colorNeutralBackground1,
    boxShadow: tokens.shadow2,
    color: tokens.colorNeutralForeground1,
    textDecorationLine: 'none',
    ':hover': { backgroundColor: tokens.colorNeutralBackground1Hover },
    ':focus-visible': { outline: `2px solid ${tokens.colorStrokeFocus2}`, outlineOffset: '2px' },
  },
  body: { display: 'flex', flexDirection: 'column', gap: tokens.spacingVerticalXS, flex: '1 1 auto', minWidth: 0 },
  top: { display: 'flex', flexWrap: 'wrap', alignItems: 'center', gap: `${tokens.spacingVerticalXS} ${tokens.spacingHorizontalS}` },
  title: { overflowWrap: 'anywhere' },
  facts: { color: tokens.colorNeutralForeground2, overflowWrap: 'anywhere' },
  next: { fontWeight: tokens.fontWeightSemibold, color: tokens.colorBrandForeground1 },
  chevron: { flexShrink: 0, color: tokens.colorNeutralForeground3 },
});

type HomeJobListProps = {
  /** The list's accessible name. */
  label: string;
  jobs: JobSummaryResponse[];
  /** Whose next step each row shows. */
  role: Role;
};

/** Jobs as tappable rows: title and status, where and for whom, and the next thing to do on it. */
export function HomeJobList({ label, jobs, role }: HomeJobListProps) {
  const dateStyle = useDateStyle();
  const styles = useStyles();
  return (
    <ul className={styles.list} aria-label={label}>
      {jobs.map((job) => (
        <li key={job.id}>
          <Link to={paths.job.getHref(job.id)} className={styles.link}>
            <span className={styles.body}>
              <span className={styles.top}>
                <Text weight="semibold" size={400} className={styles.title}>
                  {job.title}
                </Text>
                <JobStatusBadge status={job.status} size="small" />
              </span>
              <Text className={styles.facts}>
                {[job.site.label, job.site.city, job.customer.name].filter(Boolean).join(' · ')}
                {job.startDate ? ` · starts ${formatDate(job.startDate, dateStyle)}` : ''}
              </Text>
              <Text className={styles.next}>Next: {nextStepFor(job.status, role)}</Text>
            </span>
            <ChevronRight20Regular aria-hidden className={styles.chevron} />
          </Link>
        </li>
      ))}
    </ul>
  );
}
