import { makeStyles, Text, tokens } from '@fluentui/react-components';

const useStyles = makeStyles({
  root: { display: 'flex', flexDirection: 'column', gap: tokens.spacingVerticalM, paddingBlock: tokens.spacingVerticalXXL },
  text: { margin: 0 },
});

type LocateUnavailableProps = { reason: 'not-valid' | 'rate-limited' | 'error' };

/** Instead of the map: the link does not work (or not right now). Shows nothing about the site. */
export function LocateUnavailable({ reason }: LocateUnavailableProps) {
  const styles = useStyles();
  return (
    <div className={styles.root} role="alert">
      {reason === 'not-valid' && (
        <>
          <Text as="h1" size={700} weight="bold" className={styles.text}>
            This link no longer works
          </Text>
          <Text as="p" size={400} className={styles.text}>
            It has expired or was withdrawn. Ask the homeowner for a new one.
          </Text>
        </>
      )}
      {reason === 'rate-limited' && (
        <>
          <Text as="h1" size={700} weight="bold" className={styles.text}>
            Too many tries, wait a minute
          </Text>
          <Text as="p" size={400} className={styles.text}>
            Then reload this page.
          </Text>
        </>
      )}
      {reason === 'error' && (
        <>
          <Text as="h1" size={700} weight="bold" className={styles.text}>
            The map could not be loaded
          </Text>
          <Text as="p" size={400} className={styles.text}>
            Check your connection and reload this page.
          </Text>
        </>
      )}
    </div>
  );
}
