import { makeStyles, Text, tokens } from '@fluentui/react-components';
import type { QueryClient } from '@tanstack/react-query';
import { Link, useParams, type LoaderFunctionArgs } from 'react-router';
import { STAFF_ROLES } from '@domain/auth/roles';

import { RouteErrorPage } from '../../../components/errors/route-error-page';
import { PageHeader } from '../../../components/page-header';
import { paths } from '../../../config/paths';
import { requireRole } from '../../../features/auth/utils/require-user';
import { CreateJobDialog } from '../../../features/jobs/components/create-job-dialog';
import { JobStatusBadge } from '../../../features/jobs/components/job-status-badge';
import { isJobStatus } from '../../../features/jobs/utils/job-status';
import { SitePackets } from '../../../features/delivery/components/site-packets';
import { getSiteQueryOptions, useSite } from '../../../features/sites/api/get-site';
import { ReferencePoints } from '../../../features/sites/components/reference-points';
import { SiteHomeowners } from '../../../features/sites/components/site-homeowners';
import { SiteDialog } from '../../../features/sites/components/site-dialog';
import { formatDate } from '../../../lib/format-date';
import { useDateStyle } from '../../../lib/use-date-style';
import { useSessionUser } from '../../../lib/session';

const useStyles = makeStyles({
  layout: {
    display: 'grid',
    gridTemplateColumns: 'minmax(0, 1fr)',
    gap: tokens.spacingVerticalXXL,
    '@media (min-width: 1024px)': { gridTemplateColumns: 'repeat(2, minmax(0, 1fr))', columnGap: tokens.spacingHorizontalXXL },
  },
  section: { display: 'flex', flexDirection: 'column', gap: tokens.spacingVerticalM },
  heading: { margin: 0 },
  actions: { display: 'flex', gap: tokens.spacingHorizontalS, flexWrap: 'wrap' },
  list: { listStyle: 'none', margin: 0, padding: 0, display: 'flex', flexDirection: 'column', gap: tokens.spacingVerticalS },
  row: {
    display: 'flex',
    flexWrap: 'wrap',
    alignItems: 'center',
    justifyContent: 'space-between',
    gap: tokens.spacingHorizontalM,
    minHeight: '56px',
    padding: `${tokens.spacingVerticalS} ${tokens.spacingHorizontalL}`,
    borderRadius: tokens.borderRadiusLarge,
    backgroundColor: tokens.colorNeutralBackground1,
    boxShadow: tokens.shadow2,
  },
  link: { color: tokens.colorBrandForegroundLink, fontWeight: tokens.fontWeightSemibold },
  muted: { color: tokens.colorNeutralForeground2 },
  address: { fontStyle: 'normal', display: 'flex', flexDirection: 'column' },
});

export const clientLoader =
  (queryClient: QueryClient) =>
  async ({ request, params }: LoaderFunctionArgs) => {
    await requireRole(request, STAFF_ROLES);
    await queryClient.ensureQueryData(getSiteQueryOptions(params.siteId ?? ''));
    return null;
  };

export default function SiteRoute() {
  const dateStyle = useDateStyle();
  const styles = useStyles();
  const { siteId = '' } = useParams();
  const user = useSessionUser();
  const { data: site } = useSite(siteId);
  const isOffice = user?.role === 'admin' || user?.role === 'office';
  const canEditPoints = isOffice || user?.role === 'lead';

  return (
    <>
      <PageHeader
        title={site.label}
        description={
          <>
            <Link to={paths.customer.getHref(site.customer.id)} className={styles.link}>
              {site.customer.name}
            </Link>{' '}
            · {site.city}
          </>
        }
        actions={
          isOffice ? (
            <span className={styles.actions}>
              <SiteDialog customerId={site.customer.id} site={site} />
              <CreateJobDialog site={{ id: site.id, label: site.label }} />
            </span>
          ) : undefined
        }
      />
      <div className={styles.layout}>
        <section className={styles.section} aria-labelledby="site-address">
          <Text as="h3" id="site-address" size={500} weight="semibold" className={styles.heading}>
            Address
          </Text>
          <address className={styles.address}>
            <Text>{site.addressLine1}</Text>
            {site.addressLine2 && <Text>{site.addressLine2}</Text>}
            <Text>{[site.postalCode, site.city, site.region].filter(Boolean).join(' ')}</Text>
            <Text>{site.country}</Text>
          </address>
          {site.notes && <Text>{site.notes}</Text>}
          <Text as="h3" size={500} weight="semibold" className={styles.heading}>
            Homeowners
          </Text>
          <SiteHomeowners site={site} canChange={isOffice} />
        </section>
        <section className={styles.section} aria-labelledby="site-points">
          <Text as="h3" id="site-points" size={500} weight="semibold" className={styles.heading}>
            Reference points
          </Text>
          <Text className={styles.muted}>Fixed points ties are taped from. x is metres or feet east of the plan origin, y north.</Text>
          <ReferencePoints siteId={site.id} points={site.referencePoints} canEdit={canEditPoints} />
        </section>
        {isOffice && (
          <section className={styles.section} aria-labelledby="site-packets">
            <Text as="h3" id="site-packets" size={500} weight="semibold" className={styles.heading}>
              Handover packets
            </Text>
            <SitePackets siteLabel={site.label} jobs={site.jobs.filter((job) => job.status === 'issued')} />
          </section>
        )}
        <section className={styles.section} aria-labelledby="site-jobs">
          <Text as="h3" id="site-jobs" size={500} weight="semibold" className={styles.heading}>
            Jobs here
          </Text>
          {site.jobs.length === 0 ? (
            <Text className={styles.muted}>No jobs on this site yet.</Text>
          ) : (
            <ul className={styles.list} aria-label="Jobs on this site">
              {site.jobs.map((job) => (
                <li key={job.id} className={styles.row}>
                  <Link to={paths.job.getHref(job.id)} className={styles.link}>
                    {job.title}
                    {job.revision > 1 ? ` (revision ${job.revision})` : ''}
                  </Link>
                  <span className={styles.actions}>
                    {isJobStatus(job.status) && <JobStatusBadge status={job.status} />}
                    <Text className={styles.muted}>{formatDate(job.updatedAt, dateStyle)}</Text>
                  </span>
                </li>
              ))}
            </ul>
          )}
        </section>
      </div>
    </>
  );
}

export const ErrorBoundary = RouteErrorPage;
