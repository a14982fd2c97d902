import { makeStyles, Text, tokens } from '@fluentui/react-components';
import type { ReactNode } from 'react';
import { Link } from 'react-router';

import { paths } from '../../config/paths';
import { LogoMark } from '../logo';

const WIDE = '@media (min-width: 600px)';

const useStyles = makeStyles({
  root: {
    minHeight: '100dvh',
    boxSizing: 'border-box',
    display: 'flex',
    flexDirection: 'column',
    alignItems: 'center',
    gap: tokens.spacingVerticalXL,
    padding: `${tokens.spacingVerticalXXL} ${tokens.spacingHorizontalL}`,
    backgroundColor: tokens.colorNeutralBackground2,
    [WIDE]: { justifyContent: 'center', paddingBlock: tokens.spacingVerticalXXXL },
  },
  brand: {
    margin: 0,
    display: 'flex',
    alignItems: 'center',
    gap: tokens.spacingHorizontalS,
    fontSize: tokens.fontSizeBase600,
    lineHeight: tokens.lineHeightBase600,
    fontWeight: tokens.fontWeightBold,
    letterSpacing: '-0.01em',
    color: tokens.colorNeutralForeground1,
  },
  card: {
    boxSizing: 'border-box',
    width: '100%',
    maxWidth: '28rem',
    display: 'flex',
    flexDirection: 'column',
    gap: tokens.spacingVerticalL,
    padding: `${tokens.spacingVerticalXL} ${tokens.spacingHorizontalL}`,
    borderRadius: tokens.borderRadiusXLarge,
    backgroundColor: tokens.colorNeutralBackground1,
    boxShadow: tokens.shadow4,
    [WIDE]: { padding: `${tokens.spacingVerticalXXL} ${tokens.spacingHorizontalXXL}` },
  },
  heading: { display: 'flex', flexDirection: 'column', gap: tokens.spacingVerticalXS },
  title: { margin: 0 },
  description: { margin: 0, color: tokens.colorNeutralForeground2 },
  footer: {
    display: 'flex',
    flexWrap: 'wrap',
    justifyContent: 'center',
    gap: tokens.spacingHorizontalL,
  },
  footerLink: {
    display: 'inline-flex',
    alignItems: 'center',
    minHeight: '44px',
    paddingInline: tokens.spacingHorizontalS,
    color: tokens.colorNeutralForeground2,
    fontSize: tokens.fontSizeBase300,
  },
});

type AuthLayoutProps = {
  title: string;
  description?: ReactNode;
  children: ReactNode;
};

/**
 * The frame for the pages around signing in (invitation, password reset, sign-up): the product name
 * and one card, nothing that needs a session. The sign-in page itself is a page of its own drawn the
 * same way without Fluent UI (features/auth/components/sign-in-page.module.css): change both together.
 */
export function AuthLayout({ title, description, children }: AuthLayoutProps) {
  const styles = useStyles();
  return (
    <div className={styles.root}>
      <title>{`${title} · Loamline`}</title>
      <h1 className={styles.brand}>
        <LogoMark size={40} />
        Loamline
      </h1>
      <main className={styles.card}>
        <div className={styles.heading}>
          <Text as="h2" block size={600} weight="semibold" className={styles.title}>
            {title}
          </Text>
          {description && (
            <Text as="p" block size={300} className={styles.description}>
              {description}
            </Text>
          )}
        </div>
        {children}
      </main>
      <footer className={styles.footer}>
        <Link to={paths.status.getHref()} className={styles.footerLink}>
          System status
        </Link>
      </footer>
    </div>
  );
}
