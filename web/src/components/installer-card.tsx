import { makeStyles, Text, tokens } from '@fluentui/react-components';
import { Call20Regular, Mail20Regular } from '@fluentui/react-icons';
import { telHref } from '@domain/company/company-profile.schema';

const useStyles = makeStyles({
  section: { display: 'flex', flexDirection: 'column', gap: tokens.spacingVerticalM },
  heading: { margin: 0 },
  muted: { color: tokens.colorNeutralForeground2 },
  contact: { display: 'flex', flexWrap: 'wrap', gap: tokens.spacingHorizontalM },
  call: {
    display: 'inline-flex',
    alignItems: 'center',
    gap: tokens.spacingHorizontalS,
    minHeight: '48px',
    paddingInline: tokens.spacingHorizontalL,
    borderRadius: tokens.borderRadiusMedium,
    backgroundColor: tokens.colorBrandBackground,
    color: tokens.colorNeutralForegroundOnBrand,
    fontWeight: tokens.fontWeightSemibold,
    textDecorationLine: 'none',
    ':hover': { backgroundColor: tokens.colorBrandBackgroundHover },
  },
  mail: {
    display: 'inline-flex',
    alignItems: 'center',
    gap: tokens.spacingHorizontalS,
    minHeight: '48px',
    paddingInline: tokens.spacingHorizontalL,
    borderRadius: tokens.borderRadiusMedium,
    border: `1px solid ${tokens.colorNeutralStroke1}`,
    color: tokens.colorBrandForegroundLink,
    fontWeight: tokens.fontWeightSemibold,
    textDecorationLine: 'none',
  },
});

export type InstallerContact = { companyName: string; phone: string | null; email: string | null; licenceNumbers: string[] };

type InstallerCardProps = {
  installer: InstallerContact;
  /** Id of the heading, for the section's aria-labelledby. */
  headingId: string;
  headingLevel?: 'h2' | 'h3';
  /** The homeowner's portal says "questions about your system"; the locate view asks to call before digging. */
  reason: 'portal' | 'locate';
};

/**
 * "Installed by": the company's name with tap-to-call (`tel:`) and `mailto:` links, from the company
 * profile. Shown in the homeowner portal and the public locate view.
 */
export function InstallerCard({ installer, headingId, headingLevel = 'h2', reason }: InstallerCardProps) {
  const styles = useStyles();
  return (
    <section className={styles.section} aria-labelledby={headingId}>
      <Text as={headingLevel} id={headingId} size={500} weight="semibold" className={styles.heading}>
        Installed by {installer.companyName}
      </Text>
      <Text className={styles.muted}>
        {reason === 'locate'
          ? 'Call the installer before digging near these cables if anything on this map is unclear.'
          : 'Questions about your system, or digging planned near it? Contact the installer.'}
      </Text>
      <div className={styles.contact}>
        {installer.phone ? (
          <a href={telHref(installer.phone)} className={styles.call}>
            <Call20Regular aria-hidden="true" />
            Call the installer: {installer.phone}
          </a>
        ) : (
          <Text className={styles.muted}>No phone number on file.</Text>
        )}
        {installer.email && (
          <a href={`mailto:${installer.email}`} className={styles.mail}>
            <Mail20Regular aria-hidden="true" />
            E-mail {installer.email}
          </a>
        )}
      </div>
      {installer.licenceNumbers.length > 0 && <Text className={styles.muted}>Licence {installer.licenceNumbers.join(', ')}</Text>}
    </section>
  );
}
