import { makeStyles, mergeClasses, Text, tokens } from '@fluentui/react-components';
import type { ReactNode } from 'react';

const useStyles = makeStyles({
  root: {
    display: 'flex',
    flexWrap: 'wrap',
    alignItems: 'flex-start',
    justifyContent: 'space-between',
    columnGap: tokens.spacingHorizontalL,
    rowGap: tokens.spacingVerticalM,
    marginBlockEnd: tokens.spacingVerticalXL,
  },
  text: {
    display: 'flex',
    flexDirection: 'column',
    gap: tokens.spacingVerticalXS,
    flex: '1 1 20rem',
    minWidth: 0,
  },
  title: { margin: 0 },
  description: { margin: 0, color: tokens.colorNeutralForeground2, maxWidth: '65ch' },
  descriptionBlock: { fontFamily: tokens.fontFamilyBase, fontSize: tokens.fontSizeBase400, lineHeight: tokens.lineHeightBase400 },
  actions: { display: 'flex', gap: tokens.spacingHorizontalS, flexShrink: 0 },
});

type PageHeaderProps = {
  title: string;
  description?: ReactNode;
  /** Buttons for the whole page, shown to the right (below the title on a phone). */
  actions?: ReactNode;
};

/** A page's title (the level-2 heading under the product name), sets the document title too. */
export function PageHeader({ title, description, actions }: PageHeaderProps) {
  const styles = useStyles();
  return (
    <div className={styles.root}>
      <title>{`${title} · Loamline`}</title>
      <div className={styles.text}>
        <Text as="h2" block size={700} weight="semibold" className={styles.title}>
          {title}
        </Text>
        {typeof description === 'string' ? (
          <Text as="p" block size={400} className={styles.description}>
            {description}
          </Text>
        ) : (
          // A paragraph only for plain text: a description built of elements (a badge is a <div>) would
          // put block content inside <p>, which HTML does not allow. Same type size as the text one.
          description && <div className={mergeClasses(styles.description, styles.descriptionBlock)}>{description}</div>
        )}
      </div>
      {actions && <div className={styles.actions}>{actions}</div>}
    </div>
  );
}
