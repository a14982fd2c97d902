import { makeStyles, Text, tokens } from '@fluentui/react-components';
import { Link } from 'react-router';

import { PageHeader } from '../../components/page-header';
import { paths } from '../../config/paths';

const useStyles = makeStyles({
  body: { display: 'flex', flexDirection: 'column', alignItems: 'flex-start', gap: tokens.spacingVerticalS },
  text: { margin: 0, maxWidth: '65ch' },
  link: {
    display: 'inline-flex',
    alignItems: 'center',
    minHeight: '44px',
    color: tokens.colorBrandForegroundLink,
    fontWeight: tokens.fontWeightSemibold,
    fontSize: tokens.fontSizeBase400,
  },
});

export default function NotFoundRoute() {
  const styles = useStyles();
  return (
    <>
      <PageHeader title="Page not found" />
      <div className={styles.body}>
        <Text as="p" block size={400} className={styles.text}>
          There is nothing at this address. It may have been mistyped, or the page may have moved.
        </Text>
        <Link to={paths.home.getHref()} className={styles.link}>
          Go to the home page
        </Link>
      </div>
    </>
  );
}
