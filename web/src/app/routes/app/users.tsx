import { makeStyles, Text, tokens } from '@fluentui/react-components';
import type { QueryClient } from '@tanstack/react-query';
import type { LoaderFunctionArgs } from 'react-router';

import { RouteErrorPage } from '../../../components/errors/route-error-page';
import { PageHeader } from '../../../components/page-header';
import { requireRole } from '../../../features/auth/utils/require-user';
import { getInvitationsQueryOptions, useInvitations } from '../../../features/users/api/get-invitations';
import { getUsersQueryOptions, useUsers } from '../../../features/users/api/get-users';
import { InvitationsList } from '../../../features/users/components/invitations-list';
import { InviteDialog } from '../../../features/users/components/invite-dialog';
import { UsersTable } from '../../../features/users/components/users-table';
import { useSessionUser } from '../../../lib/session';

const useStyles = makeStyles({
  sections: { display: 'flex', flexDirection: 'column', gap: tokens.spacingVerticalXXL },
  section: { display: 'flex', flexDirection: 'column', gap: tokens.spacingVerticalM },
  sectionTitle: { margin: 0 },
});

const ALLOWED = ['admin', 'office'] as const;

export const clientLoader =
  (queryClient: QueryClient) =>
  async ({ request }: LoaderFunctionArgs) => {
    await requireRole(request, ALLOWED);
    await Promise.all([
      queryClient.ensureQueryData(getUsersQueryOptions()),
      queryClient.ensureQueryData(getInvitationsQueryOptions()),
    ]);
    return null;
  };

export default function UsersRoute() {
  const styles = useStyles();
  const user = useSessionUser();
  const { data: users } = useUsers();
  const { data: invitations } = useInvitations();
  // The signed-in area renders only with a session.
  if (!user) return null;

  return (
    <>
      <PageHeader
        title="Users"
        description={
          user.role === 'admin'
            ? 'Everyone who can sign in to your company, and the invitations still waiting for an answer.'
            : 'Everyone who can sign in to your company. Only an admin can change roles or disable an account.'
        }
        actions={<InviteDialog actorRole={user.role} />}
      />
      <div className={styles.sections}>
        <section className={styles.section} aria-labelledby="users-people">
          <Text as="h3" id="users-people" size={500} weight="semibold" className={styles.sectionTitle}>
            People ({users.length})
          </Text>
          <UsersTable users={users} actor={user} />
        </section>
        <section className={styles.section} aria-labelledby="users-invitations">
          <Text as="h3" id="users-invitations" size={500} weight="semibold" className={styles.sectionTitle}>
            Waiting invitations ({invitations.length})
          </Text>
          <InvitationsList invitations={invitations} />
        </section>
      </div>
    </>
  );
}

export const ErrorBoundary = RouteErrorPage;
