import { Button, makeStyles, Text, tokens } from '@fluentui/react-components';
import { Copy20Regular, Open20Regular } from '@fluentui/react-icons';

import { useNotify } from '../../../components/notify';

const useStyles = makeStyles({
  list: { listStyle: 'none', margin: 0, padding: 0, display: 'flex', flexDirection: 'column', gap: tokens.spacingVerticalS },
  item: {
    display: 'flex',
    flexWrap: 'wrap',
    alignItems: 'center',
    gap: tokens.spacingHorizontalS,
    padding: `${tokens.spacingVerticalS} ${tokens.spacingHorizontalM}`,
    borderRadius: tokens.borderRadiusMedium,
    backgroundColor: tokens.colorNeutralBackground3,
  },
  url: {
    flex: '1 1 16rem',
    minWidth: 0,
    overflowWrap: 'anywhere',
    fontSize: tokens.fontSizeBase300,
    userSelect: 'all',
  },
  actions: { display: 'flex', gap: tokens.spacingHorizontalS },
  action: { minHeight: '44px' },
  openLink: {
    display: 'inline-flex',
    alignItems: 'center',
    gap: tokens.spacingHorizontalXS,
    minHeight: '44px',
    paddingInline: tokens.spacingHorizontalM,
    borderRadius: tokens.borderRadiusMedium,
    border: `${tokens.strokeWidthThin} solid ${tokens.colorNeutralStroke1}`,
    backgroundColor: tokens.colorNeutralBackground1,
    color: tokens.colorNeutralForeground1,
    fontWeight: tokens.fontWeightSemibold,
    textDecorationLine: 'none',
    boxSizing: 'border-box',
    ':hover': { backgroundColor: tokens.colorNeutralBackground1Hover },
  },
});

/**
 * The message's links as plain text with Open and Copy: the formatted view is sandboxed (nothing in
 * it can be clicked), and a developer testing locally needs to follow an invitation link.
 */
export function MessageLinks({ links }: { links: readonly string[] }) {
  const styles = useStyles();
  const notify = useNotify();

  const copy = async (link: string) => {
    try {
      await navigator.clipboard.writeText(link);
      notify.success('Link copied');
    } catch {
      notify.error('Could not copy', 'Select the link and copy it by hand.');
    }
  };

  if (links.length === 0) return <Text>This message has no links.</Text>;

  return (
    <ul className={styles.list}>
      {links.map((link) => (
        <li key={link} className={styles.item}>
          <Text className={styles.url}>{link}</Text>
          <span className={styles.actions}>
            <a href={link} target="_blank" rel="noreferrer noopener" className={styles.openLink}>
              <Open20Regular aria-hidden="true" />
              Open
            </a>
            <Button className={styles.action} icon={<Copy20Regular />} onClick={() => void copy(link)}>
              Copy
            </Button>
          </span>
        </li>
      ))}
    </ul>
  );
}
