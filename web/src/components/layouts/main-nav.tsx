import { makeStyles, mergeClasses, tokens } from '@fluentui/react-components';
import { NavLink } from 'react-router';

import type { NavItem } from './nav-items';

const useStyles = makeStyles({
  list: {
    listStyle: 'none',
    margin: 0,
    padding: 0,
    display: 'flex',
    flexDirection: 'column',
    gap: tokens.spacingVerticalXS,
  },
  link: {
    position: 'relative',
    display: 'flex',
    alignItems: 'center',
    gap: tokens.spacingHorizontalM,
    // Crews tap this with gloves on; keep every target at least 48 px tall.
    minHeight: '48px',
    paddingInline: tokens.spacingHorizontalM,
    borderRadius: tokens.borderRadiusMedium,
    color: tokens.colorNeutralForeground2,
    fontSize: tokens.fontSizeBase400,
    lineHeight: tokens.lineHeightBase400,
    fontWeight: tokens.fontWeightMedium,
    textDecorationLine: 'none',
    ':hover': {
      backgroundColor: tokens.colorNeutralBackground1Hover,
      color: tokens.colorNeutralForeground1,
    },
    ':active': { backgroundColor: tokens.colorNeutralBackground1Pressed },
    ':focus-visible': {
      outline: `${tokens.strokeWidthThick} solid ${tokens.colorStrokeFocus2}`,
      outlineOffset: `calc(${tokens.strokeWidthThick} * -1)`,
    },
  },
  active: {
    backgroundColor: tokens.colorBrandBackground2,
    color: tokens.colorBrandForeground2,
    fontWeight: tokens.fontWeightSemibold,
    ':hover': {
      backgroundColor: tokens.colorBrandBackground2Hover,
      color: tokens.colorBrandForeground2,
    },
    '::before': {
      content: '""',
      position: 'absolute',
      insetInlineStart: 0,
      insetBlock: tokens.spacingVerticalM,
      width: tokens.strokeWidthThickest,
      borderRadius: tokens.borderRadiusCircular,
      backgroundColor: tokens.colorBrandStroke1,
    },
  },
  icon: { flexShrink: 0 },
});

type MainNavProps = {
  items: readonly NavItem[];
  /** Called after a link is followed, e.g. to close the phone menu. */
  onNavigate?: () => void;
};

export function MainNav({ items, onNavigate }: MainNavProps) {
  const styles = useStyles();
  return (
    <ul className={styles.list}>
      {items.map(({ label, href, icon: Icon, end }) => (
        <li key={href}>
          <NavLink
            to={href}
            end={end}
            onClick={onNavigate}
            className={({ isActive }) => mergeClasses(styles.link, isActive && styles.active)}
          >
            <Icon className={styles.icon} aria-hidden="true" />
            {label}
          </NavLink>
        </li>
      ))}
    </ul>
  );
}
