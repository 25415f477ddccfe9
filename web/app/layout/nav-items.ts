// Which sections a user's roles open in the main navigation.
import type { SessionUser } from '../../../shared/schemas/auth';
import { isAdmin, isCoordinator, isGrower } from '../../lib/session';

export interface NavItem {
  to: string;
  label: string;
  /** Match the path exactly (for the home page). */
  end?: boolean;
}

export function navItemsFor(user: SessionUser): NavItem[] {
  const items: NavItem[] = [];
  if (isCoordinator(user)) {
    items.push(
      { to: '/', label: 'Trials', end: true },
      { to: '/trials/new', label: 'New trial', end: true },
      { to: '/people', label: 'People' },
      { to: '/calculator', label: 'Seed calculator' },
    );
  } else if (isGrower(user)) {
    items.push(
      { to: '/', label: 'My sites', end: true },
      { to: '/calculator', label: 'Seed calculator' },
    );
  } else {
    items.push({ to: '/', label: 'Reports', end: true });
  }
  if (isAdmin(user)) items.push({ to: '/network', label: 'Network' });
  if (isAdmin(user)) items.push({ to: '/admin/mail', label: 'Caught e-mail' });
  return items;
}
