import type { FluentIcon } from '@fluentui/react-icons';
import { HeartPulse24Regular, Home24Regular } from '@fluentui/react-icons';

import { paths } from '../../config/paths';

export type NavItem = {
  label: string;
  href: string;
  icon: FluentIcon;
  /** Highlight only on an exact match (the home page would otherwise match every path). */
  end?: boolean;
};

/** The main navigation, in order. Pages are added here as they are built. */
export const navItems: readonly NavItem[] = [
  { label: 'Home', href: paths.home.getHref(), icon: Home24Regular, end: true },
  { label: 'System status', href: paths.status.getHref(), icon: HeartPulse24Regular },
];
