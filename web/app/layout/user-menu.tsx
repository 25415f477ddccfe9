// The signed-in person's name, their networks and roles, and the sign-out action.
import { useEffect, useId, useRef, useState } from 'react';
import { useNavigate } from 'react-router-dom';
import type { SessionUser } from '../../../shared/schemas/auth';
import { Button } from '../../components/ui/button';
import { useLogout } from '../../features/auth/api/logout';
import { cn } from '../../lib/cn';
import { roleName } from '../../lib/format';

export function initials(name: string): string {
  // Letters only: "Corin Hale (invented)" gives "CH", not "C(".
  const parts = name
    .replace(/\([^)]*\)/g, ' ')
    .split(/\s+/)
    .map((part) => part.replace(/[^\p{L}]/gu, ''))
    .filter(Boolean);
  const letters = parts.length > 1 ? [parts[0]![0], parts[parts.length - 1]![0]] : [parts[0]?.[0]];
  return letters.join('').toUpperCase() || '?';
}

/** Memberships and a sign-out button; used in the dropdown and in the phone menu. */
export function AccountDetails({
  user,
  onSignOut,
  busy,
}: {
  user: SessionUser;
  onSignOut: () => void;
  busy: boolean;
}) {
  return (
    <div className="space-y-3">
      <div>
        <p className="font-semibold text-ink">{user.name}</p>
        <p className="break-all text-caption text-ink-muted">{user.email}</p>
      </div>
      {user.memberships.length > 0 ? (
        <ul className="space-y-1 border-t border-line pt-3 text-label">
          {user.memberships.map((m) => (
            <li key={`${m.networkId}-${m.role}`} className="flex justify-between gap-3">
              <span className="text-ink">{m.networkName}</span>
              <span className="shrink-0 text-ink-muted">{roleName(m.role)}</span>
            </li>
          ))}
        </ul>
      ) : null}
      <Button variant="secondary" className="w-full" onClick={onSignOut} busy={busy}>
        Sign out
      </Button>
    </div>
  );
}

export function useSignOut() {
  const logout = useLogout();
  const navigate = useNavigate();
  return {
    signOut: () =>
      logout.mutate(undefined, { onSettled: () => navigate('/sign-in', { replace: true }) }),
    busy: logout.isPending,
  };
}

export function UserMenu({ user }: { user: SessionUser }) {
  const [open, setOpen] = useState(false);
  const panelId = useId();
  const root = useRef<HTMLDivElement>(null);
  const { signOut, busy } = useSignOut();

  useEffect(() => {
    if (!open) return;
    const onPointer = (event: PointerEvent) => {
      if (!root.current?.contains(event.target as Node)) setOpen(false);
    };
    const onKey = (event: KeyboardEvent) => {
      if (event.key === 'Escape') setOpen(false);
    };
    document.addEventListener('pointerdown', onPointer);
    document.addEventListener('keydown', onKey);
    return () => {
      document.removeEventListener('pointerdown', onPointer);
      document.removeEventListener('keydown', onKey);
    };
  }, [open]);

  return (
    <div ref={root} className="relative">
      <button
        type="button"
        aria-expanded={open}
        aria-controls={panelId}
        onClick={() => setOpen((v) => !v)}
        className="flex min-h-11 items-center gap-2 rounded-full py-1 pl-1 pr-3 text-label font-medium text-field-50 hover:bg-field-900"
      >
        <span
          aria-hidden="true"
          className="flex size-8 items-center justify-center rounded-full bg-straw-300 text-caption font-bold text-field-950"
        >
          {initials(user.name)}
        </span>
        <span className="max-w-40 truncate">{user.name}</span>
        <span
          aria-hidden="true"
          className={cn('text-xs transition-transform', open && 'rotate-180')}
        >
          ▾
        </span>
        <span className="sr-only">account menu</span>
      </button>
      {open ? (
        <div
          id={panelId}
          className="absolute right-0 z-30 mt-2 w-72 rounded-card border border-line bg-surface p-4 shadow-raised"
        >
          <AccountDetails user={user} onSignOut={signOut} busy={busy} />
        </div>
      ) : null}
    </div>
  );
}
