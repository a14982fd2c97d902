import { makeStyles, Spinner, Text, tokens } from '@fluentui/react-components';
import type { QueryClient } from '@tanstack/react-query';
import type { ReactNode } from 'react';
import { useParams, type LoaderFunctionArgs } from 'react-router';

import { RouteErrorPage } from '../../../components/errors/route-error-page';
import { LogoMark } from '../../../components/logo';
import { getLocateViewQueryOptions, useLocateView } from '../../../features/locate/api/get-locate-view';
import { LocateUnavailable } from '../../../features/locate/components/locate-unavailable';
import { LocateView } from '../../../features/locate/components/locate-view';
import { isApiError } from '../../../lib/api-client';

const useStyles = makeStyles({
  page: { minHeight: '100dvh', backgroundColor: tokens.colorNeutralBackground2 },
  header: {
    display: 'flex',
    alignItems: 'center',
    gap: tokens.spacingHorizontalS,
    minHeight: '56px',
    paddingInline: tokens.spacingHorizontalL,
    backgroundColor: tokens.colorNeutralBackground1,
    borderBottom: `${tokens.strokeWidthThin} solid ${tokens.colorNeutralStroke2}`,
  },
  main: {
    boxSizing: 'border-box',
    maxWidth: '60rem',
    marginInline: 'auto',
    padding: `${tokens.spacingVerticalL} ${tokens.spacingHorizontalL} ${tokens.spacingVerticalXXXL}`,
  },
});

export const clientLoader =
  (queryClient: QueryClient) =>
  ({ params }: LoaderFunctionArgs) => {
    // Started here, not awaited: the page's frame draws at once on a weak signal and the map follows.
    // Never throws: a refused link is a page of its own, drawn by the component.
    void queryClient.prefetchQuery(getLocateViewQueryOptions(params.token ?? ''));
    return null;
  };

function Frame({ installer, children }: { installer?: string; children: ReactNode }) {
  const styles = useStyles();
  return (
    <div className={styles.page}>
      <header className={styles.header}>
        <LogoMark size={24} />
        <Text weight="semibold">{installer ? `Buried cables · ${installer}` : 'Buried cables'}</Text>
      </header>
      <main className={styles.main}>{children}</main>
    </div>
  );
}

/** The public locate view: a contractor with the link sees what is buried at the site, and how deep. */
export default function LocateRoute() {
  const { token = '' } = useParams();
  const query = useLocateView(token);

  if (query.isPending) {
    return (
      <Frame>
        <Spinner label="Loading the map…" />
      </Frame>
    );
  }
  if (query.isError) {
    const { error } = query;
    const reason = isApiError(error) && error.status === 404 ? 'not-valid' : isApiError(error) && error.status === 429 ? 'rate-limited' : 'error';
    return (
      <Frame>
        <LocateUnavailable reason={reason} />
      </Frame>
    );
  }
  return (
    <Frame installer={query.data.installer.companyName}>
      <LocateView view={query.data} />
    </Frame>
  );
}

export const ErrorBoundary = RouteErrorPage;
