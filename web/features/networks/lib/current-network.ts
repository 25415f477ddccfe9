// Which of a person's networks the pages show: chosen in the header, kept in this browser.
import { useSyncExternalStore } from 'react';
import type { SessionUser } from '../../../../shared/schemas/auth';

const KEY = 'sheaf.currentNetwork';
const listeners = new Set<() => void>();

function read(): string | null {
  try {
    return window.localStorage.getItem(KEY);
  } catch {
    return null;
  }
}

export function setCurrentNetwork(networkId: string | null): void {
  try {
    if (networkId) window.localStorage.setItem(KEY, networkId);
    else window.localStorage.removeItem(KEY);
  } catch {
    // Private browsing without storage: the choice lasts until the page reloads.
  }
  for (const listener of listeners) listener();
}

function subscribe(listener: () => void) {
  listeners.add(listener);
  const onStorage = (e: StorageEvent) => e.key === KEY && listener();
  window.addEventListener('storage', onStorage);
  return () => {
    listeners.delete(listener);
    window.removeEventListener('storage', onStorage);
  };
}

/** The chosen network if the person still belongs to it, else their first one. */
export function currentNetworkId(user: SessionUser, chosen: string | null): string | null {
  if (chosen && user.memberships.some((m) => m.networkId === chosen)) return chosen;
  return user.memberships[0]?.networkId ?? null;
}

export function useCurrentNetworkId(user: SessionUser | null | undefined): string | null {
  const chosen = useSyncExternalStore(subscribe, read, () => null);
  return user ? currentNetworkId(user, chosen) : null;
}

/** The user as seen inside one network: only that membership, so role rules follow the network. */
export function scopeToNetwork(user: SessionUser, networkId: string | null): SessionUser {
  if (!networkId) return user;
  return { ...user, memberships: user.memberships.filter((m) => m.networkId === networkId) };
}

/** The signed-in user limited to the network chosen in the header. */
export function useScopedUser<T extends SessionUser | null | undefined>(user: T): T {
  const networkId = useCurrentNetworkId(user);
  if (!user) return user;
  return scopeToNetwork(user, networkId) as T;
}
