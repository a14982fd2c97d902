import { makeStyles, MessageBar, MessageBarBody, Spinner, Text, tokens } from '@fluentui/react-components';
import { Link } from 'react-router';

import { paths } from '../../../config/paths';
import { useSignupMail } from '../api/get-signup-mail';

const useStyles = makeStyles({
  wrap: { display: 'flex', flexDirection: 'column', gap: tokens.spacingVerticalL },
  local: {
    display: 'flex',
    flexDirection: 'column',
    gap: tokens.spacingVerticalS,
    padding: tokens.spacingHorizontalL,
    borderRadius: tokens.borderRadiusLarge,
    backgroundColor: tokens.colorNeutralBackground2,
  },
  subject: { fontWeight: tokens.fontWeightSemibold, overflowWrap: 'anywhere' },
  body: { margin: 0, whiteSpace: 'pre-wrap', overflowWrap: 'anywhere', fontFamily: 'inherit', fontSize: tokens.fontSizeBase300 },
  action: {
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
  },
});

/** The path and query of the first link to `path` in a message's text (same origin as this page). */
function appLinkIn(text: string | null, path: string): string | undefined {
  const match = (text ?? '').match(new RegExp(`https?://[^\\s"'<>]+(${path.replace(/\//g, '\\/')}\\?token=[\\w-]+)`));
  return match?.[1];
}

type CheckYourMailProps = {
  email: string;
  message: string;
  receipt: string;
  /** Mail is captured by this server (no mail service): show the message here. */
  mailCaptured: boolean;
};

export function CheckYourMail({ email, message, receipt, mailCaptured }: CheckYourMailProps) {
  const styles = useStyles();
  const mail = useSignupMail(receipt, mailCaptured);
  const verifyLink = appLinkIn(mail.data?.message?.text ?? null, '/sign-up/verify');
  const signInLink = appLinkIn(mail.data?.message?.text ?? null, '/sign-in');

  return (
    <div className={styles.wrap}>
      <MessageBar intent="success" layout="multiline">
        <MessageBarBody>
          {message} The message goes to <strong>{email}</strong>.
        </MessageBarBody>
      </MessageBar>
      {mailCaptured && (
        <section className={styles.local} aria-label="The message, as this server captured it">
          <Text size={300}>
            This server keeps its mail instead of sending it (no mail service is set up), so the message is shown here.
          </Text>
          {mail.isError ? (
            <Text>The message could not be loaded. Reload the page to try again.</Text>
          ) : !mail.data || mail.data.status === 'queued' || !mail.data.message ? (
            <Spinner size="small" label="Waiting for the message…" />
          ) : mail.data.status === 'failed' ? (
            <Text>The message could not be sent. Start again.</Text>
          ) : (
            <>
              <Text className={styles.subject}>{mail.data.message.subject}</Text>
              <pre className={styles.body}>{mail.data.message.text}</pre>
              {verifyLink && (
                <Link to={verifyLink} className={styles.action}>
                  Confirm and create the company
                </Link>
              )}
              {!verifyLink && signInLink && (
                <Link to={paths.signIn.getHref()} reloadDocument className={styles.action}>
                  Go to sign in
                </Link>
              )}
            </>
          )}
        </section>
      )}
    </div>
  );
}
