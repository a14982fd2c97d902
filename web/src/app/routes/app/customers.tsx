import { makeStyles, SearchBox, Spinner, Text, tokens } from '@fluentui/react-components';
import { ChevronRight20Regular } from '@fluentui/react-icons';
import type { QueryClient } from '@tanstack/react-query';
import { useState } from 'react';
import { Link, useNavigate, type LoaderFunctionArgs } from 'react-router';
import { STAFF_ROLES } from '@domain/auth/roles';

import { RouteErrorPage } from '../../../components/errors/route-error-page';
import { Pager } from '../../../components/pager';
import { PageHeader } from '../../../components/page-header';
import { paths } from '../../../config/paths';
import { requireRole } from '../../../features/auth/utils/require-user';
import { getCustomersQueryOptions, useCustomers } from '../../../features/customers/api/get-customers';
import { CustomerDialog } from '../../../features/customers/components/customer-dialog';
import { useSessionUser } from '../../../lib/session';

const useStyles = makeStyles({
  search: { width: '100%', maxWidth: '32rem', minHeight: '48px', marginBlockEnd: tokens.spacingVerticalL },
  list: { listStyle: 'none', margin: 0, padding: 0, display: 'flex', flexDirection: 'column', gap: tokens.spacingVerticalS },
  card: {
    display: 'flex',
    alignItems: 'center',
    justifyContent: 'space-between',
    gap: tokens.spacingHorizontalM,
    minHeight: '64px',
    padding: `${tokens.spacingVerticalS} ${tokens.spacingHorizontalL}`,
    borderRadius: tokens.borderRadiusLarge,
    backgroundColor: tokens.colorNeutralBackground1,
    boxShadow: tokens.shadow2,
    color: tokens.colorNeutralForeground1,
    textDecorationLine: 'none',
    ':hover': { backgroundColor: tokens.colorNeutralBackground1Hover },
  },
  main: { display: 'flex', flexDirection: 'column', minWidth: 0 },
  muted: { color: tokens.colorNeutralForeground2 },
});

export const clientLoader =
  (queryClient: QueryClient) =>
  async ({ request }: LoaderFunctionArgs) => {
    await requireRole(request, STAFF_ROLES);
    await queryClient.ensureQueryData(getCustomersQueryOptions());
    return null;
  };

export default function CustomersRoute() {
  const styles = useStyles();
  const user = useSessionUser();
  const navigate = useNavigate();
  const [q, setQ] = useState('');
  const [page, setPage] = useState(1);
  const customers = useCustomers({ q: q.trim(), page });
  const isOffice = user?.role === 'admin' || user?.role === 'office';

  return (
    <>
      <PageHeader
        title="Customers"
        description="The people Loamline records work for, and their sites."
        actions={isOffice ? <CustomerDialog onSaved={(customer) => void navigate(paths.customer.getHref(customer.id))} /> : undefined}
      />
      <SearchBox
        className={styles.search}
        placeholder="Search by name"
        aria-label="Search customers"
        value={q}
        onChange={(_e, d) => {
          setQ(d.value);
          setPage(1);
        }}
      />
      {customers.data ? (
        customers.data.total === 0 ? (
          <Text>No customers {q ? 'match this search' : 'yet'}.</Text>
        ) : (
          <>
            <ul className={styles.list} aria-label="Customers">
              {customers.data.items.map((customer) => (
                <li key={customer.id}>
                  <Link to={paths.customer.getHref(customer.id)} className={styles.card}>
                    <span className={styles.main}>
                      <Text weight="semibold" size={400}>
                        {customer.name}
                      </Text>
                      <Text className={styles.muted}>{[customer.email, customer.phone].filter(Boolean).join(' · ') || 'No contact details'}</Text>
                    </span>
                    <ChevronRight20Regular aria-hidden />
                  </Link>
                </li>
              ))}
            </ul>
            <Pager page={customers.data.page} pageSize={customers.data.pageSize} total={customers.data.total} noun="customers" onPageChange={setPage} />
          </>
        )
      ) : (
        <Spinner label="Loading customers…" />
      )}
    </>
  );
}

export const ErrorBoundary = RouteErrorPage;
