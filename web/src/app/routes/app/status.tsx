import { Button, makeStyles, Spinner } from '@fluentui/react-components';
import { ArrowClockwise20Regular } from '@fluentui/react-icons';
import type { QueryClient } from '@tanstack/react-query';

import { RouteErrorPage } from '../../../components/errors/route-error-page';
import { PageHeader } from '../../../components/page-header';
import { getHealthQueryOptions, useHealth } from '../../../features/health/api/get-health';
import { HealthReport } from '../../../features/health/components/health-report';
import { summarizeHealth } from '../../../features/health/utils/summarize-health';

const REFRESH_EVERY_MS = 30_000;

const useStyles = makeStyles({
  refresh: { minHeight: '44px', minWidth: '7.5rem' },
});

export const clientLoader = (queryClient: QueryClient) => async () => {
  // Never throws: a server that is down is what this page is for, not an error page.
  await queryClient.prefetchQuery(getHealthQueryOptions());
  return null;
};

export default function StatusRoute() {
  const styles = useStyles();
  const health = useHealth({ refetchInterval: REFRESH_EVERY_MS });
  const checkedAt = Math.max(health.dataUpdatedAt, health.errorUpdatedAt);

  return (
    <>
      <PageHeader
        title="System status"
        description="Whether the Loamline server and its database are answering. This page checks again every 30 seconds."
        actions={
          <Button
            className={styles.refresh}
            icon={health.isFetching ? <Spinner size="tiny" /> : <ArrowClockwise20Regular />}
            disabled={health.isFetching}
            onClick={() => void health.refetch()}
          >
            Refresh
          </Button>
        }
      />
      <HealthReport summary={summarizeHealth(health)} checkedAt={checkedAt} />
    </>
  );
}

export const ErrorBoundary = RouteErrorPage;
