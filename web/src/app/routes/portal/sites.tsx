import { makeStyles, Text, tokens } from '@fluentui/react-components';
import type { QueryClient } from '@tanstack/react-query';
import { Link, type LoaderFunctionArgs } from 'react-router';

import { RouteErrorPage } from '../../../components/errors/route-error-page';
import { PageHeader } from '../../../components/page-header';
import { paths } from '../../../config/paths';
import { requireRole } from '../../../features/auth/utils/require-user';
import { getPortalSitesQueryOptions, usePortalSites } from '../../../features/portal/api/get-portal-sites';
import { formatDate } from '../../../lib/format-date';
import { useDateStyle } from '../../../lib/use-date-style';

const useStyles = makeStyles({
  list: { listStyle: 'none', margin: 0, padding: 0, display: 'flex', flexDirection: 'column', gap: tokens.spacingVerticalS },
  row: {
    display: 'flex',
    flexDirection: 'column',
    gap: tokens.spacingVerticalXS,
    padding: `${tokens.spacingVerticalM} ${tokens.spacingHorizontalL}`,
    borderRadius: tokens.borderRadiusLarge,
    backgroundColor: tokens.colorNeutralBackground1,
    boxShadow: tokens.shadow2,
  },
  link: {
    color: tokens.colorBrandForegroundLink,
    fontWeight: tokens.fontWeightSemibold,
    fontSize: tokens.fontSizeBase400,
    display: 'inline-flex',
    alignItems: 'center',
    minHeight: '44px',
  },
  muted: { color: tokens.colorNeutralForeground2 },
});

export const clientLoader =
  (queryClient: QueryClient) =>
  async ({ request }: LoaderFunctionArgs) => {
    await requireRole(request, ['homeowner']);
    await queryClient.ensureQueryData(getPortalSitesQueryOptions());
    return null;
  };

/** The homeowner's properties. */
export default function PortalSitesRoute() {
  const dateStyle = useDateStyle();
  const styles = useStyles();
  const { data: sites } = usePortalSites();
  return (
    <>
      <PageHeader title="My property" description="Your handover packets, the map of what is buried, and links for anyone who digs." />
      {sites.length === 0 ? (
        <Text className={styles.muted}>No property is linked to your account yet.</Text>
      ) : (
        <ul className={styles.list} aria-label="Your sites">
          {sites.map((site) => (
            <li key={site.id} className={styles.row}>
              <Link to={paths.portalSite.getHref(site.id)} className={styles.link}>
                {site.label}
              </Link>
              <Text>
                {site.addressLine1}, {site.city}
              </Text>
              <Text className={styles.muted}>
                Installed by {site.installer.companyName} · {site.packetCount} {site.packetCount === 1 ? 'packet' : 'packets'}
                {site.lastIssuedAt ? `, last issued ${formatDate(site.lastIssuedAt, dateStyle)}` : ''}
              </Text>
            </li>
          ))}
        </ul>
      )}
    </>
  );
}

export const ErrorBoundary = RouteErrorPage;
