// Small pieces shared by the report pages: fact lists, section headings, export links.
import type { ReactNode } from 'react';
import { buttonClasses } from '../../../components/ui/button';
import { PageSection, type PageSectionProps } from '../../../components/ui/page-section';

export function Facts({ items }: { items: [string, ReactNode][] }) {
  return (
    <dl className="grid grid-cols-2 gap-x-6 gap-y-3 rounded-card border border-line bg-surface p-5 shadow-card sm:grid-cols-2 lg:grid-cols-4">
      {items.map(([term, value]) => (
        <div key={term} className="min-w-0">
          <dt className="text-caption font-semibold uppercase tracking-wide text-ink-muted">
            {term}
          </dt>
          <dd className="mt-0.5 text-ink">{value || '—'}</dd>
        </div>
      ))}
    </dl>
  );
}

/** A report section; on paper it is kept whole on one page where it fits. */
export function Section(props: Omit<PageSectionProps, 'className'>) {
  return <PageSection {...props} className="report-section break-inside-avoid-page" />;
}

export function ChartCard({ children, label = 'Chart' }: { children: ReactNode; label?: string }) {
  return (
    // A scrolling box takes keyboard focus so a wide chart can be scrolled without a mouse.
    <div
      className="min-w-0 overflow-x-auto rounded-card border border-line bg-surface p-4 shadow-card"
      tabIndex={0}
      role="region"
      aria-label={label}
    >
      {children}
    </div>
  );
}

/** A plain download link styled as a button (the browser saves the file). */
export function DownloadLink({ href, children }: { href: string; children: ReactNode }) {
  return (
    <a href={href} download className={buttonClasses('secondary', 'md', 'no-underline')}>
      {children}
    </a>
  );
}

/** A boxed note that sits beside the tables. */
export function DataTableNote({ title, children }: { title: string; children: ReactNode }) {
  return (
    <div className="rounded-card border border-line bg-surface p-4">
      <p className="text-label font-semibold text-ink">{title}</p>
      <p className="mt-1 text-label text-ink">{children}</p>
    </div>
  );
}
