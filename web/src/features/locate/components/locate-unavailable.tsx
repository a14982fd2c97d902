import { Text } from '../../../components/plain/text';

import styles from './locate-view.module.css';

type LocateUnavailableProps = { reason: 'not-valid' | 'rate-limited' | 'error' };

/** Instead of the map: the link does not work (or not right now). Shows nothing about the site. */
export function LocateUnavailable({ reason }: LocateUnavailableProps) {
  return (
    <div className={styles.unavailable} role="alert">
      {reason === 'not-valid' && (
        <>
          <Text as="h1" size={700} weight="bold" className={styles.flush}>
            This link no longer works
          </Text>
          <Text as="p" size={400} className={styles.flush}>
            It has expired or was withdrawn. Ask the homeowner for a new one.
          </Text>
        </>
      )}
      {reason === 'rate-limited' && (
        <>
          <Text as="h1" size={700} weight="bold" className={styles.flush}>
            Too many tries, wait a minute
          </Text>
          <Text as="p" size={400} className={styles.flush}>
            Then reload this page.
          </Text>
        </>
      )}
      {reason === 'error' && (
        <>
          <Text as="h1" size={700} weight="bold" className={styles.flush}>
            The map could not be loaded
          </Text>
          <Text as="p" size={400} className={styles.flush}>
            Check your connection and reload this page.
          </Text>
        </>
      )}
    </div>
  );
}
