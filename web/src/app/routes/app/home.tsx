import { makeStyles, Text, tokens } from '@fluentui/react-components';
import type { QueryClient } from '@tanstack/react-query';
import { redirect } from 'react-router';

import { RouteErrorPage } from '../../../components/errors/route-error-page';
import { PageHeader } from '../../../components/page-header';
import { paths } from '../../../config/paths';
import { getHealthQueryOptions, useHealth } from '../../../features/health/api/get-health';
import { HealthSummaryCard } from '../../../features/health/components/health-summary-card';
import { summarizeHealth } from '../../../features/health/utils/summarize-health';
import { FailedDeliveriesCard } from '../../../features/delivery/components/failed-deliveries-card';
import { getSessionUser, useSessionUser } from '../../../lib/session';

const useStyles = makeStyles({
  layout: {
    display: 'grid',
    gridTemplateColumns: 'minmax(0, 1fr)',
    gap: tokens.spacingVerticalXL,
    alignItems: 'start',
    '@media (min-width: 1024px)': {
      gridTemplateColumns: 'minmax(0, 2fr) minmax(16rem, 1fr)',
      columnGap: tokens.spacingHorizontalXXL,
    },
  },
  intro: { display: 'flex', flexDirection: 'column', gap: tokens.spacingVerticalM },
  heading: { margin: 0 },
  list: {
    margin: 0,
    paddingInlineStart: tokens.spacingHorizontalXL,
    display: 'flex',
    flexDirection: 'column',
    gap: tokens.spacingVerticalM,
    maxWidth: '65ch',
  },
  item: { paddingInlineStart: tokens.spacingHorizontalXS },
});

export const clientLoader = (queryClient: QueryClient) => async () => {
  // A homeowner's home is their property.
  if (getSessionUser()?.role === 'homeowner') throw redirect(paths.portal.getHref());
  // Never throws: a server that is down is something this page reports, not an error page.
  await queryClient.prefetchQuery(getHealthQueryOptions());
  return null;
};

export default function HomeRoute() {
  const styles = useStyles();
  const health = useHealth({ refetchInterval: 60_000 });
  const user = useSessionUser();
  const isOffice = user?.role === 'admin' || user?.role === 'office';

  return (
    <>
      <PageHeader
        title="Welcome"
        description="Loamline keeps the record of what your crew puts in the ground on each job, so nobody has to guess later."
      />
      {/* Failed packet e-mails come first: the one thing on this page that waits for someone. */}
      {isOffice && <FailedDeliveriesCard />}
      <div className={styles.layout}>
        <section className={styles.intro} aria-labelledby="what-it-does">
          <Text as="h3" block id="what-it-does" size={500} weight="semibold" className={styles.heading}>
            What it does for you
          </Text>
          <ul className={styles.list}>
            <li className={styles.item}>
              <Text size={400}>
                Record the as-built on site from a phone before the trench is filled in: equipment, cable runs,
                burial depths, wall entries and amplifier settings.
              </Text>
            </li>
            <li className={styles.item}>
              <Text size={400}>
                Check the work as you go: the load on each amplifier channel, power lost in the cable, and
                runs buried shallower than your rules allow.
              </Text>
            </li>
            <li className={styles.item}>
              <Text size={400}>
                Give the homeowner a print-ready handover packet with the site plan, the wiring and the
                equipment list.
              </Text>
            </li>
            <li className={styles.item}>
              <Text size={400}>
                Share a read-only map of what is buried and how deep with anyone who digs there later.
              </Text>
            </li>
          </ul>
        </section>
        <HealthSummaryCard summary={summarizeHealth(health)} detailsHref={paths.status.getHref()} />
      </div>
    </>
  );
}

export const ErrorBoundary = RouteErrorPage;
