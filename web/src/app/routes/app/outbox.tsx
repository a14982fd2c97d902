import { Button, makeStyles, Spinner, Text, tokens } from '@fluentui/react-components';
import { ArrowClockwise20Regular } from '@fluentui/react-icons';
import type { QueryClient } from '@tanstack/react-query';
import { useSearchParams, type LoaderFunctionArgs } from 'react-router';

import { RouteErrorPage } from '../../../components/errors/route-error-page';
import { PageHeader } from '../../../components/page-header';
import { requireRole } from '../../../features/auth/utils/require-user';
import { getMailStatusQueryOptions, useMailStatus } from '../../../features/outbox/api/get-mail-status';
import { getOutboxQueryOptions, useOutbox } from '../../../features/outbox/api/get-outbox';
import { OutboxList } from '../../../features/outbox/components/outbox-list';

const useStyles = makeStyles({
  refresh: { minHeight: '44px' },
  none: {
    margin: 0,
    padding: tokens.spacingHorizontalXL,
    borderRadius: tokens.borderRadiusLarge,
    backgroundColor: tokens.colorNeutralBackground1,
    maxWidth: '65ch',
  },
});

function pageOf(searchParams: URLSearchParams): number {
  const page = Number(searchParams.get('page') ?? '1');
  return Number.isInteger(page) && page >= 1 ? page : 1;
}

export const clientLoader =
  (queryClient: QueryClient) =>
  async ({ request }: LoaderFunctionArgs) => {
    await requireRole(request, ['admin', 'office']);
    const status = await queryClient.ensureQueryData(getMailStatusQueryOptions());
    // With a mail service there is no local mail to list: the page says where mail goes instead.
    if (status.captured) await queryClient.ensureQueryData(getOutboxQueryOptions({ page: pageOf(new URL(request.url).searchParams) }));
    return null;
  };

export default function OutboxRoute() {
  const styles = useStyles();
  const status = useMailStatus();
  if (status.data && !status.data.captured) {
    return (
      <>
        <PageHeader title="Outbox" description="Copies of the e-mail Loamline sends, when this server keeps them." />
        <Text as="p" block size={400} className={styles.none}>
          Mail from this server goes to the mail service at <strong>{status.data.destination}</strong>, which delivers it. No
          copies are kept here: look in the recipients' inboxes, or in the mail service's own log.
        </Text>
      </>
    );
  }
  return <CapturedOutbox />;
}

function CapturedOutbox() {
  const styles = useStyles();
  const [searchParams, setSearchParams] = useSearchParams();
  const page = pageOf(searchParams);
  const outbox = useOutbox({ page });

  return (
    <>
      <PageHeader
        title="Outbox"
        description="Every e-mail Loamline has sent for your company, kept by the built-in mail server instead of being delivered (no SMTP_URL is set). Real delivery needs a mail service."
        actions={
          <Button
            className={styles.refresh}
            icon={outbox.isFetching ? <Spinner size="tiny" /> : <ArrowClockwise20Regular />}
            disabled={outbox.isFetching}
            onClick={() => void outbox.refetch()}
          >
            Refresh
          </Button>
        }
      />
      {outbox.data === null ? (
        <Text as="p" block size={400} className={styles.none}>
          This server hands mail to a mail service, so there are no local copies to show.
        </Text>
      ) : outbox.data ? (
        <OutboxList
          data={outbox.data}
          isLoadingPage={outbox.isPlaceholderData}
          onPageChange={(next) => setSearchParams(next > 1 ? { page: String(next) } : {})}
        />
      ) : (
        <Spinner label="Loading mail…" />
      )}
    </>
  );
}

export const ErrorBoundary = RouteErrorPage;
