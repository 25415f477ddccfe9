// The frame around every page: header with wordmark, role navigation and account, then footer.
import { useEffect, useState, type ReactNode } from 'react';
import { Link, NavLink, useLocation, useNavigation } from 'react-router-dom';
import type { SessionUser } from '../../../shared/schemas/auth';
import { Wordmark } from '../../components/layout/wordmark';
import { buttonClasses } from '../../components/ui/button';
import { cn } from '../../lib/cn';
import { isDemoUser } from '../../lib/session';
import { NetworkSwitcher } from '../../features/networks/components/network-switcher';
import { scopeToNetwork, useCurrentNetworkId } from '../../features/networks/lib/current-network';
import { navItemsFor } from './nav-items';
import { AccountDetails, UserMenu, useSignOut } from './user-menu';

function NavigationProgress() {
  const navigation = useNavigation();
  if (navigation.state === 'idle') return null;
  return (
    <div
      role="progressbar"
      aria-label="Loading page"
      className="fixed inset-x-0 top-0 z-50 h-1 overflow-hidden"
    >
      <div className="h-full w-1/3 animate-[sheaf-slide_1.1s_ease-in-out_infinite] bg-straw-300" />
      <style>
        {'@keyframes sheaf-slide{0%{transform:translateX(-100%)}100%{transform:translateX(300%)}}'}
      </style>
    </div>
  );
}

function PhoneMenu({ user, onNavigate }: { user: SessionUser; onNavigate: () => void }) {
  const { signOut, busy } = useSignOut();
  const scoped = scopeToNetwork(user, useCurrentNetworkId(user));
  return (
    <div
      id="phone-menu"
      className="border-t border-field-700 bg-surface px-4 pb-5 pt-3 shadow-raised md:hidden"
    >
      <NetworkSwitcher user={user} className="mb-4 block" />
      <nav aria-label="Main" className="mb-4">
        <ul className="space-y-1">
          {navItemsFor(scoped).map((item) => (
            <li key={item.to}>
              <NavLink
                to={item.to}
                end={item.end}
                onClick={onNavigate}
                className={({ isActive }) =>
                  cn(
                    'flex min-h-12 items-center rounded-field px-3 font-medium no-underline',
                    isActive ? 'bg-accent-soft text-accent' : 'text-ink hover:bg-sunken',
                  )
                }
              >
                {item.label}
              </NavLink>
            </li>
          ))}
        </ul>
      </nav>
      <div className="border-t border-line pt-4">
        <AccountDetails user={user} onSignOut={signOut} busy={busy} />
      </div>
    </div>
  );
}

function Header({ user }: { user: SessionUser | null }) {
  const [menuOpen, setMenuOpen] = useState(false);
  const networkId = useCurrentNetworkId(user);
  const scoped = user ? scopeToNetwork(user, networkId) : null;
  const location = useLocation();
  useEffect(() => setMenuOpen(false), [location.pathname]);

  return (
    <header className="no-print sticky top-0 z-20 bg-field-800 text-field-50 shadow-sm">
      <div className="mx-auto flex h-16 max-w-page items-center gap-4 px-4 sm:px-6">
        <Link to="/" className="rounded-field no-underline" aria-label="Sheaf home">
          <Wordmark />
        </Link>
        {user ? (
          <>
            <nav aria-label="Main" className="hidden flex-1 md:block">
              <ul className="flex items-center gap-1">
                {navItemsFor(scoped!).map((item) => (
                  <li key={item.to}>
                    <NavLink
                      to={item.to}
                      end={item.end}
                      className={({ isActive }) =>
                        cn(
                          'relative flex min-h-11 items-center rounded-field px-3 text-label font-medium no-underline',
                          isActive
                            ? 'text-straw-100 after:absolute after:inset-x-3 after:bottom-1 after:h-0.5 after:rounded-full after:bg-straw-300'
                            : 'text-field-100 hover:bg-field-900 hover:text-white',
                        )
                      }
                    >
                      {item.label}
                    </NavLink>
                  </li>
                ))}
              </ul>
            </nav>
            <NetworkSwitcher user={user} className="ml-auto hidden md:block" />
            <div className="hidden md:block">
              <UserMenu user={user} />
            </div>
            <button
              type="button"
              className="ml-auto flex min-h-11 items-center gap-2 rounded-field px-3 text-label font-semibold text-field-50 hover:bg-field-900 md:hidden"
              aria-expanded={menuOpen}
              aria-controls="phone-menu"
              onClick={() => setMenuOpen((v) => !v)}
            >
              <svg
                aria-hidden="true"
                viewBox="0 0 20 20"
                className="size-5"
                fill="none"
                stroke="currentColor"
                strokeWidth="2"
                strokeLinecap="round"
              >
                {menuOpen ? (
                  <path d="M5 5l10 10M15 5L5 15" />
                ) : (
                  <path d="M3 6h14M3 10h14M3 14h14" />
                )}
              </svg>
              Menu
            </button>
          </>
        ) : (
          <Link to="/sign-in" className={buttonClasses('secondary', 'md', 'ml-auto')}>
            Sign in
          </Link>
        )}
      </div>
      {user && menuOpen ? <PhoneMenu user={user} onNavigate={() => setMenuOpen(false)} /> : null}
    </header>
  );
}

function Footer({ user }: { user: SessionUser | null }) {
  return (
    <footer className="no-print border-t border-line bg-sunken/70">
      <div className="mx-auto flex max-w-page flex-col gap-2 px-4 py-5 text-label text-ink-muted sm:flex-row sm:items-center sm:justify-between sm:px-6">
        <p>Sheaf · seeding-rate trials for grower networks</p>
        <div className="flex flex-wrap items-center gap-x-4 gap-y-1">
          {user && isDemoUser(user) ? (
            <span className="font-medium text-caution">Demo data is invented</span>
          ) : null}
          <Link to="/cautions" className="font-medium text-accent underline">
            Cautions for field work
          </Link>
        </div>
      </div>
    </footer>
  );
}

export function AppShell({ user, children }: { user: SessionUser | null; children: ReactNode }) {
  return (
    <div className="flex min-h-dvh flex-col">
      <a
        href="#main"
        className="sr-only z-50 rounded-field bg-surface px-4 py-2 focus:not-sr-only focus:fixed focus:left-2 focus:top-2"
      >
        Skip to content
      </a>
      <NavigationProgress />
      <Header user={user} />
      <main id="main" className="mx-auto w-full max-w-page flex-1 px-4 py-6 sm:px-6 sm:py-8">
        {children}
      </main>
      <Footer user={user} />
    </div>
  );
}
