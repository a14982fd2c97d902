import type { FluentIcon } from '@fluentui/react-icons';
import {
  BuildingHome24Regular,
  ClipboardTextLtr24Regular,
  HeartPulse24Regular,
  Home24Regular,
  MailInbox24Regular,
  Map24Regular,
  People24Regular,
  Settings24Regular,
} from '@fluentui/react-icons';
import { isStaffRole, type Role } from '@domain/auth/roles';

import { paths } from '../../config/paths';

export type NavItem = {
  label: string;
  href: string;
  icon: FluentIcon;
  /** Highlight only on an exact match (the home page would otherwise match every path). */
  end?: boolean;
};

type NavContext = {
  /** The signed-in person's role; `undefined` when nobody is signed in. */
  role: Role | undefined;
  /** The server captures mail locally, so the Outbox page has something to show. */
  hasOutbox?: boolean;
};

/** The main navigation, in order, for who is looking. Pages are added here as they are built. */
export function buildNavItems({ role, hasOutbox = false }: NavContext): NavItem[] {
  if (!role) return [{ label: 'System status', href: paths.status.getHref(), icon: HeartPulse24Regular }];
  // A homeowner's home is their property: their menu has no contractor home page at all.
  const items: NavItem[] =
    role === 'homeowner'
      ? [{ label: 'My property', href: paths.portal.getHref(), icon: Map24Regular }]
      : [{ label: 'Home', href: paths.home.getHref(), icon: Home24Regular, end: true }];
  if (isStaffRole(role)) {
    items.push({ label: 'Jobs', href: paths.jobs.getHref(), icon: ClipboardTextLtr24Regular });
    items.push({ label: 'Customers', href: paths.customers.getHref(), icon: BuildingHome24Regular });
  }
  if (role === 'admin' || role === 'office') {
    items.push({ label: 'Users', href: paths.users.getHref(), icon: People24Regular });
  }
  if ((role === 'admin' || role === 'office') && hasOutbox) {
    items.push({ label: 'Outbox', href: paths.outbox.getHref(), icon: MailInbox24Regular });
  }
  items.push({ label: 'Settings', href: paths.settings.getHref(), icon: Settings24Regular });
  items.push({ label: 'System status', href: paths.status.getHref(), icon: HeartPulse24Regular });
  return items;
}
