// The top of every page: an optional eyebrow line, the title, a sentence of context and actions.
import type { ReactNode } from 'react';
import { Link } from 'react-router-dom';
import { cn } from '../../lib/cn';

/** Where "up" is from this page: the parent page's path and name. */
export interface BackTo {
  to: string;
  label: string;
}

export interface PageHeaderProps {
  eyebrow?: ReactNode;
  /** A link to the page this one belongs to, shown above the title. */
  back?: BackTo;
  title: ReactNode;
  description?: ReactNode;
  actions?: ReactNode;
  className?: string;
}

export function PageHeader({
  eyebrow,
  back,
  title,
  description,
  actions,
  className,
}: PageHeaderProps) {
  return (
    <header
      className={cn(
        'mb-6 flex flex-col gap-4 border-b border-line pb-5 sm:flex-row sm:items-end sm:justify-between',
        className,
      )}
    >
      <div className="min-w-0 space-y-1">
        {back ? (
          <p className="no-print mb-2">
            <Link
              to={back.to}
              className="inline-flex min-h-11 items-center gap-1.5 rounded-field text-label font-semibold text-accent no-underline hover:underline sm:min-h-0"
            >
              <span aria-hidden="true">←</span>
              {back.label}
            </Link>
          </p>
        ) : null}
        {eyebrow ? (
          <p className="text-caption font-semibold uppercase tracking-wider text-straw-700 dark:text-straw-300">
            {eyebrow}
          </p>
        ) : null}
        <h1 className="text-title text-ink">{title}</h1>
        {description ? <p className="max-w-prose text-ink-muted">{description}</p> : null}
      </div>
      {actions ? <div className="flex flex-wrap gap-2">{actions}</div> : null}
    </header>
  );
}
