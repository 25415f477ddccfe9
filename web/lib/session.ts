/** Role rules the web app needs to pick navigation and home content for a signed-in user. */
import type { SessionUser } from '../../shared/schemas/auth';

export type HomeKind = 'coordinator' | 'grower' | 'member';

export function isAdmin(user: SessionUser): boolean {
  return user.memberships.some((m) => m.role === 'admin');
}

/** A user coordinates if any membership is coordinator or admin. */
export function isCoordinator(user: SessionUser): boolean {
  return user.memberships.some((m) => m.role === 'coordinator' || m.role === 'admin');
}

export function isGrower(user: SessionUser): boolean {
  return user.memberships.some((m) => m.role === 'grower');
}

/** What the home page leads with: the most hands-on role the user holds. */
export function homeKind(user: SessionUser): HomeKind {
  if (isCoordinator(user)) return 'coordinator';
  if (isGrower(user)) return 'grower';
  return 'member';
}

/**
 * The demo accounts use the reserved `.example` domain (RFC 2606), which no real
 * mailbox can have, so such a user is looking at the invented demo network.
 */
export function isDemoUser(user: SessionUser): boolean {
  return user.email.toLowerCase().endsWith('.example');
}

export function firstName(user: SessionUser): string {
  return user.name.trim().split(/\s+/)[0] || user.email;
}
