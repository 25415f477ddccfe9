// What a list shows when it has nothing in it yet: why, and what to do next.
import type { ReactNode } from 'react';
import { cn } from '../../lib/cn';

export interface EmptyStateProps {
  title: ReactNode;
  children?: ReactNode;
  action?: ReactNode;
  className?: string;
  /** `h1` when the empty state is the whole page (a 404 or "not published"), so it has a heading. */
  titleAs?: 'p' | 'h1' | 'h2';
}

export function EmptyState({
  title,
  children,
  action,
  className,
  titleAs: Title = 'p',
}: EmptyStateProps) {
  return (
    <div
      className={cn(
        'flex flex-col items-center rounded-card border border-dashed border-line-strong bg-sunken/60 px-6 py-10 text-center',
        className,
      )}
    >
      <svg aria-hidden="true" viewBox="0 0 48 24" className="mb-3 h-6 w-12 text-straw-500">
        {[4, 14, 24, 34, 44].map((x) => (
          <path
            key={x}
            d={`M${x} 22 V8`}
            stroke="currentColor"
            strokeWidth="2"
            strokeLinecap="round"
            strokeDasharray="3 3"
          />
        ))}
      </svg>
      <Title className="text-heading text-ink">{title}</Title>
      {children ? <div className="mt-1 max-w-prose text-ink-muted">{children}</div> : null}
      {action ? <div className="mt-5">{action}</div> : null}
    </div>
  );
}
