import { telHref } from '@domain/company/phone';

import styles from './installer-card.module.css';
import { CallIcon, MailIcon } from './plain/icons';

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
 * profile. Shown in the homeowner portal and the public locate view (no Fluent UI: plain CSS on Fluent's
 * token variables).
 */
export function InstallerCard({ installer, headingId, headingLevel = 'h2', reason }: InstallerCardProps) {
  const Heading = headingLevel;
  return (
    <section className={styles.section} aria-labelledby={headingId}>
      <Heading id={headingId} className={styles.heading}>
        Installed by {installer.companyName}
      </Heading>
      <span className={styles.muted}>
        {reason === 'locate'
          ? 'Call the installer before digging near these cables if anything on this map is unclear.'
          : 'Questions about your system, or digging planned near it? Contact the installer.'}
      </span>
      <div className={styles.contact}>
        {installer.phone ? (
          <a href={telHref(installer.phone)} className={styles.call}>
            <CallIcon />
            Call the installer: {installer.phone}
          </a>
        ) : (
          <span className={styles.muted}>No phone number on file.</span>
        )}
        {installer.email && (
          <a href={`mailto:${installer.email}`} className={styles.mail}>
            <MailIcon />
            E-mail {installer.email}
          </a>
        )}
      </div>
      {installer.licenceNumbers.length > 0 && <span className={styles.muted}>Licence {installer.licenceNumbers.join(', ')}</span>}
    </section>
  );
}
