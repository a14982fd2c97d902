import { makeStyles, Spinner, Text, tokens } from '@fluentui/react-components';
import type { QueryClient } from '@tanstack/react-query';
import type { LoaderFunctionArgs } from 'react-router';
import { ROLES } from '@domain/auth/roles';

import { RouteErrorPage } from '../../../components/errors/route-error-page';
import { PageHeader } from '../../../components/page-header';
import { requireRole } from '../../../features/auth/utils/require-user';
import { UnitsChooser } from '../../../features/jobs/components/units-chooser';
import { getCompanySettingsQueryOptions, useCompanySettings } from '../../../features/settings/api/get-company-settings';
import { useCompanyProfile } from '../../../features/settings/api/get-company-profile';
import { useDepthRules } from '../../../features/settings/api/get-depth-rules';
import { CompanyProfileForm } from '../../../features/settings/components/company-profile-form';
import { CompanySettingsForm } from '../../../features/settings/components/company-settings-form';
import { DepthRulesEditor } from '../../../features/settings/components/depth-rules-editor';
import { useSessionUser } from '../../../lib/session';

const useStyles = makeStyles({
  sections: {
    display: 'grid',
    gridTemplateColumns: 'minmax(0, 1fr)',
    gap: tokens.spacingVerticalXXL,
    '@media (min-width: 1024px)': { gridTemplateColumns: 'repeat(2, minmax(0, 1fr))', columnGap: tokens.spacingHorizontalXXL },
  },
  section: {
    display: 'flex',
    flexDirection: 'column',
    gap: tokens.spacingVerticalM,
    padding: tokens.spacingHorizontalL,
    borderRadius: tokens.borderRadiusLarge,
    backgroundColor: tokens.colorNeutralBackground1,
    boxShadow: tokens.shadow2,
    alignSelf: 'start',
  },
  title: { margin: 0 },
  muted: { color: tokens.colorNeutralForeground2 },
});

export const clientLoader =
  (queryClient: QueryClient) =>
  async ({ request }: LoaderFunctionArgs) => {
    await requireRole(request, ROLES);
    await queryClient.ensureQueryData(getCompanySettingsQueryOptions());
    return null;
  };

/** The company profile and depth rules, for the admin (who changes them) and the office (who reads them). */
function CompanySections({ canChange }: { canChange: boolean }) {
  const styles = useStyles();
  const profile = useCompanyProfile();
  const depthRules = useDepthRules();
  return (
    <>
      <section className={styles.section} aria-labelledby="settings-profile">
        <Text as="h3" id="settings-profile" size={500} weight="semibold" className={styles.title}>
          Company profile
        </Text>
        <Text className={styles.muted}>What homeowners and anyone digging at a site see about you: packets, packet e-mails, the portal and the locate view.</Text>
        {profile.data ? <CompanyProfileForm profile={profile.data} canChange={canChange} /> : <Spinner size="small" label="Loading the profile" />}
      </section>
      <section className={styles.section} aria-labelledby="settings-depth">
        <Text as="h3" id="settings-depth" size={500} weight="semibold" className={styles.title}>
          Depth rules
        </Text>
        {depthRules.data ? <DepthRulesEditor rules={depthRules.data} canChange={canChange} /> : <Spinner size="small" label="Loading the depth rules" />}
      </section>
    </>
  );
}

/** Your own units, and the company's defaults (changed by an admin). */
export default function SettingsRoute() {
  const styles = useStyles();
  const user = useSessionUser();
  const { data: settings } = useCompanySettings();
  if (!user) return null;

  return (
    <>
      <PageHeader title="Settings" description="Lengths are always stored in metres; these choices change only how values are shown and typed." />
      <div className={styles.sections}>
        <section className={styles.section} aria-labelledby="settings-mine">
          <Text as="h3" id="settings-mine" size={500} weight="semibold" className={styles.title}>
            Your units
          </Text>
          <Text className={styles.muted}>They follow you on every device you sign in on.</Text>
          <UnitsChooser isBare />
        </section>
        <section className={styles.section} aria-labelledby="settings-company">
          <Text as="h3" id="settings-company" size={500} weight="semibold" className={styles.title}>
            Company defaults
          </Text>
          <CompanySettingsForm settings={settings} canChange={user.role === 'admin'} />
        </section>
        {(user.role === 'admin' || user.role === 'office') && <CompanySections canChange={user.role === 'admin'} />}
      </div>
    </>
  );
}

export const ErrorBoundary = RouteErrorPage;
