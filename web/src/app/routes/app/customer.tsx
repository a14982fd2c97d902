import { makeStyles, Spinner, Text, tokens } from '@fluentui/react-components';
import { ChevronRight20Regular } from '@fluentui/react-icons';
import type { QueryClient } from '@tanstack/react-query';
import { Link, useNavigate, useParams, type LoaderFunctionArgs } from 'react-router';
import { STAFF_ROLES } from '@domain/auth/roles';

import { RouteErrorPage } from '../../../components/errors/route-error-page';
import { PageHeader } from '../../../components/page-header';
import { paths } from '../../../config/paths';
import { requireRole } from '../../../features/auth/utils/require-user';
import { getCustomerQueryOptions, useCustomer } from '../../../features/customers/api/get-customer';
import { CustomerDialog } from '../../../features/customers/components/customer-dialog';
import { useSites } from '../../../features/sites/api/get-sites';
import { SiteDialog } from '../../../features/sites/components/site-dialog';
import { useSessionUser } from '../../../lib/session';

const useStyles = makeStyles({
  section: { display: 'flex', flexDirection: 'column', gap: tokens.spacingVerticalM, marginBlockEnd: tokens.spacingVerticalXXL },
  heading: { margin: 0 },
  actions: { display: 'flex', gap: tokens.spacingHorizontalS, flexWrap: 'wrap' },
  list: { listStyle: 'none', margin: 0, padding: 0, display: 'flex', flexDirection: 'column', gap: tokens.spacingVerticalS },
  card: {
    display: 'flex',
    alignItems: 'center',
    justifyContent: 'space-between',
    minHeight: '64px',
    padding: `${tokens.spacingVerticalS} ${tokens.spacingHorizontalL}`,
    borderRadius: tokens.borderRadiusLarge,
    backgroundColor: tokens.colorNeutralBackground1,
    boxShadow: tokens.shadow2,
    color: tokens.colorNeutralForeground1,
    textDecorationLine: 'none',
  },
  main: { display: 'flex', flexDirection: 'column' },
  muted: { color: tokens.colorNeutralForeground2 },
});

export const clientLoader =
  (queryClient: QueryClient) =>
  async ({ request, params }: LoaderFunctionArgs) => {
    await requireRole(request, STAFF_ROLES);
    await queryClient.ensureQueryData(getCustomerQueryOptions(params.customerId ?? ''));
    return null;
  };

export default function CustomerRoute() {
  const styles = useStyles();
  const { customerId = '' } = useParams();
  const user = useSessionUser();
  const navigate = useNavigate();
  const { data: customer } = useCustomer(customerId);
  const sites = useSites({ customerId });
  const isOffice = user?.role === 'admin' || user?.role === 'office';

  return (
    <>
      <PageHeader
        title={customer.name}
        description={[customer.email, customer.phone].filter(Boolean).join(' · ') || 'No contact details yet.'}
        actions={
          isOffice ? (
            <span className={styles.actions}>
              <CustomerDialog customer={customer} />
              <SiteDialog customerId={customer.id} onSaved={(site) => void navigate(paths.site.getHref(site.id))} />
            </span>
          ) : undefined
        }
      />
      {customer.notes && (
        <section className={styles.section}>
          <Text>{customer.notes}</Text>
        </section>
      )}
      <section className={styles.section} aria-labelledby="customer-sites">
        <Text as="h3" id="customer-sites" size={500} weight="semibold" className={styles.heading}>
          Sites
        </Text>
        {sites.data ? (
          sites.data.length === 0 ? (
            <Text className={styles.muted}>No sites yet.</Text>
          ) : (
            <ul className={styles.list} aria-label="Sites">
              {sites.data.map((site) => (
                <li key={site.id}>
                  <Link to={paths.site.getHref(site.id)} className={styles.card}>
                    <span className={styles.main}>
                      <Text weight="semibold" size={400}>
                        {site.label}
                      </Text>
                      <Text className={styles.muted}>
                        {site.addressLine1}, {site.city}
                      </Text>
                    </span>
                    <ChevronRight20Regular aria-hidden />
                  </Link>
                </li>
              ))}
            </ul>
          )
        ) : (
          <Spinner label="Loading sites…" />
        )}
      </section>
    </>
  );
}

export const ErrorBoundary = RouteErrorPage;
