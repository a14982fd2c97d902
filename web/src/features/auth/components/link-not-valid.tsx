import { makeStyles, Text, tokens } from '@fluentui/react-components';
import { Link } from 'react-router';

import { paths } from '../../../config/paths';

const useStyles = makeStyles({
  root: { display: 'flex', flexDirection: 'column', gap: tokens.spacingVerticalM },
  text: { margin: 0 },
  actions: { display: 'flex', flexDirection: 'column', gap: tokens.spacingVerticalS },
  primary: {
    display: 'inline-flex',
    alignItems: 'center',
    justifyContent: 'center',
    minHeight: '48px',
    paddingInline: tokens.spacingHorizontalL,
    borderRadius: tokens.borderRadiusMedium,
    backgroundColor: tokens.colorBrandBackground,
    color: tokens.colorNeutralForegroundOnBrand,
    fontWeight: tokens.fontWeightSemibold,
    textDecorationLine: 'none',
    ':hover': { backgroundColor: tokens.colorBrandBackgroundHover },
  },
  secondary: {
    display: 'inline-flex',
    alignItems: 'center',
    justifyContent: 'center',
    minHeight: '44px',
    color: tokens.colorBrandForegroundLink,
    fontWeight: tokens.fontWeightSemibold,
  },
});

type LinkNotValidProps = {
  /** What the link was for: it decides how to get a new one. */
  kind: 'invitation' | 'reset';
};

/** Shown for an invitation or reset link that was already used, has expired, or was mistyped. */
export function LinkNotValid({ kind }: LinkNotValidProps) {
  const styles = useStyles();
  return (
    <div className={styles.root} role="alert">
      {kind === 'invitation' ? (
        <>
          <Text as="p" block size={400} className={styles.text}>
            Invitation links work once and stop working after a few days, or when the invitation is withdrawn.
          </Text>
          <Text as="p" block className={styles.text}>
            If you already set your password with it, sign in. Otherwise ask the office of the company that invited you
            to send a new invitation.
          </Text>
        </>
      ) : (
        <>
          <Text as="p" block size={400} className={styles.text}>
            Password reset links work once and stop working after an hour.
          </Text>
          <Text as="p" block className={styles.text}>
            Ask for a new link and use the newest e-mail you receive.
          </Text>
        </>
      )}
      <div className={styles.actions}>
        {kind === 'reset' && (
          <Link to={paths.forgotPassword.getHref()} className={styles.primary}>
            Send me a new link
          </Link>
        )}
        <Link to={paths.signIn.getHref()} reloadDocument className={kind === 'reset' ? styles.secondary : styles.primary}>
          Go to sign in
        </Link>
        {kind === 'invitation' && (
          <Link to={paths.forgotPassword.getHref()} className={styles.secondary}>
            Forgot your password?
          </Link>
        )}
      </div>
    </div>
  );
}
