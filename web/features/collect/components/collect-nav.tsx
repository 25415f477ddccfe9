// Tabs between a site's collect pages: strips, grid, CSV upload, photos, and history for coordinators.
import { NavLink } from 'react-router-dom';
import { cn } from '../../../lib/cn';

export function CollectNav({ siteId, isCoordinator }: { siteId: string; isCoordinator: boolean }) {
  const items = [
    { to: `/sites/${siteId}`, label: 'Strips', end: true },
    { to: `/sites/${siteId}/grid`, label: 'Grid' },
    { to: `/sites/${siteId}/import`, label: 'Upload CSV' },
    { to: `/sites/${siteId}/photos`, label: 'Photos' },
    ...(isCoordinator ? [{ to: `/sites/${siteId}/history`, label: 'History' }] : []),
  ];
  return (
    <nav
      aria-label="Site data"
      className="no-print -mx-4 mb-5 overflow-x-auto px-4 sm:mx-0 sm:px-0"
    >
      <ul className="flex min-w-max gap-1 border-b border-line">
        {items.map((item) => (
          <li key={item.to}>
            <NavLink
              to={item.to}
              end={item.end}
              className={({ isActive }) =>
                cn(
                  '-mb-px flex min-h-11 items-center border-b-2 px-3 text-label font-semibold no-underline',
                  isActive
                    ? 'border-accent text-accent'
                    : 'border-transparent text-ink-muted hover:text-ink',
                )
              }
            >
              {item.label}
            </NavLink>
          </li>
        ))}
      </ul>
    </nav>
  );
}
