import { makeStyles, Spinner, Text, tokens } from '@fluentui/react-components';
import { ArrowLeft20Regular } from '@fluentui/react-icons';
import type { QueryClient } from '@tanstack/react-query';
import { Link, useParams, type LoaderFunctionArgs } from 'react-router';

import { RouteErrorPage } from '../../../components/errors/route-error-page';
import { InstallerCard } from '../../../components/installer-card';
import { PageHeader } from '../../../components/page-header';
import { paths } from '../../../config/paths';
import { requireRole } from '../../../features/auth/utils/require-user';
import { SiteMapPlan } from '../../../features/locate/components/site-map-plan';
import { getPortalSiteQueryOptions, usePortalSite } from '../../../features/portal/api/get-portal-site';
import { usePortalSiteMap } from '../../../features/portal/api/get-portal-site-map';
import { LocateLinks } from '../../../features/portal/components/locate-links';
import { PacketList } from '../../../features/portal/components/packet-list';
import { describeRequestError } from '../../../lib/form-errors';
import { useDateStyle } from '../../../lib/use-date-style';
import { useUnitPreferences } from '../../../lib/use-unit-preferences';

const useStyles = makeStyles({
  back: {
    display: 'inline-flex',
    alignItems: 'center',
    gap: tokens.spacingHorizontalXS,
    minHeight: '44px',
    color: tokens.colorBrandForegroundLink,
    fontWeight: tokens.fontWeightSemibold,
    textDecorationLine: 'none',
  },
  layout: { display: 'flex', flexDirection: 'column', gap: tokens.spacingVerticalXXL },
  section: { display: 'flex', flexDirection: 'column', gap: tokens.spacingVerticalM },
  heading: { margin: 0 },
  muted: { color: tokens.colorNeutralForeground2 },
  revisions: { margin: 0, paddingInlineStart: tokens.spacingHorizontalXL },
});

export const clientLoader =
  (queryClient: QueryClient) =>
  async ({ request, params }: LoaderFunctionArgs) => {
    await requireRole(request, ['homeowner']);
    await queryClient.ensureQueryData(getPortalSiteQueryOptions(params.siteId ?? ''));
    return null;
  };

function SiteMapSection({ siteId }: { siteId: string }) {
  const styles = useStyles();
  const map = usePortalSiteMap(siteId);
  const [preferences] = useUnitPreferences();
  const { locale } = useDateStyle();
  if (map.isPending) return <Spinner size="small" label="Loading the map…" />;
  if (map.isError) return <Text>{describeRequestError(map.error)}</Text>;
  return (
    <>
      <SiteMapPlan map={map.data} units={preferences.length} locale={locale} />
      {map.data.revisions.length > 0 && (
        <>
          <Text className={styles.muted}>Drawn from:</Text>
          <ul className={styles.revisions}>
            {map.data.revisions.map((r) => (
              <li key={r.revisionId}>
                <Text>
                  {r.jobTitle}, revision {r.revision}
                </Text>
              </li>
            ))}
          </ul>
        </>
      )}
    </>
  );
}

/** One of the homeowner's sites: packets, the map, locate links. */
export default function PortalSiteRoute() {
  const styles = useStyles();
  const { siteId = '' } = useParams();
  const { data: site } = usePortalSite(siteId);
  const { installer } = site;

  return (
    <>
      <Link to={paths.portal.getHref()} className={styles.back}>
        <ArrowLeft20Regular aria-hidden="true" />
        My property
      </Link>
      <PageHeader title={site.label} description={`${site.addressLine1}, ${[site.postalCode, site.city].filter(Boolean).join(' ')}`} />
      <div className={styles.layout}>
        <InstallerCard installer={installer} headingId="portal-installer" headingLevel="h3" reason="portal" />
        <section className={styles.section} aria-labelledby="portal-packets">
          <Text as="h3" id="portal-packets" size={500} weight="semibold" className={styles.heading}>
            Handover packets
          </Text>
          <PacketList packets={site.packets} />
        </section>
        <section className={styles.section} aria-labelledby="portal-map">
          <Text as="h3" id="portal-map" size={500} weight="semibold" className={styles.heading}>
            Map of buried cables
          </Text>
          <SiteMapSection siteId={site.id} />
        </section>
        <section className={styles.section} aria-labelledby="portal-links">
          <Text as="h3" id="portal-links" size={500} weight="semibold" className={styles.heading}>
            Locate links
          </Text>
          <Text className={styles.muted}>
            Before anyone digs in your yard, send them a link: they see this map and the depths, without an account.
          </Text>
          <LocateLinks siteId={site.id} />
        </section>
      </div>
    </>
  );
}

export const ErrorBoundary = RouteErrorPage;
