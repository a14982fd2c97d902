import { makeStyles, tokens } from '@fluentui/react-components';
import { ArrowLeft20Regular } from '@fluentui/react-icons';
import type { QueryClient } from '@tanstack/react-query';
import { Link, useParams, type LoaderFunctionArgs } from 'react-router';

import { RouteErrorPage } from '../../../components/errors/route-error-page';
import { PageHeader } from '../../../components/page-header';
import { paths } from '../../../config/paths';
import { requireRole } from '../../../features/auth/utils/require-user';
import { getOutboxMessageQueryOptions, useOutboxMessage } from '../../../features/outbox/api/get-outbox-message';
import { MessageView } from '../../../features/outbox/components/message-view';

const useStyles = makeStyles({
  back: {
    display: 'inline-flex',
    alignItems: 'center',
    gap: tokens.spacingHorizontalXS,
    minHeight: '44px',
    marginBlockEnd: tokens.spacingVerticalS,
    color: tokens.colorBrandForegroundLink,
    fontWeight: tokens.fontWeightSemibold,
    textDecorationLine: 'none',
    ':hover': { textDecorationLine: 'underline' },
  },
});

export const clientLoader =
  (queryClient: QueryClient) =>
  async ({ request, params }: LoaderFunctionArgs) => {
    await requireRole(request, ['admin', 'office']);
    await queryClient.ensureQueryData(getOutboxMessageQueryOptions(params.messageId ?? ''));
    return null;
  };

function Message({ id }: { id: string }) {
  const { data: message } = useOutboxMessage(id);
  return (
    <>
      <PageHeader title={message.subject || '(no subject)'} />
      <MessageView message={message} />
    </>
  );
}

export default function OutboxMessageRoute() {
  const styles = useStyles();
  const { messageId = '' } = useParams();
  return (
    <>
      <Link to={paths.outbox.getHref()} className={styles.back}>
        <ArrowLeft20Regular aria-hidden="true" />
        All mail
      </Link>
      <Message id={messageId} />
    </>
  );
}

export const ErrorBoundary = RouteErrorPage;
