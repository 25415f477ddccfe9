// A titled section of a page (reports, the series report): a heading the section is labelled by,
// an optional line under it saying what the section shows, then its content.
import type { ReactNode } from 'react';
import { cn } from '../../lib/cn';

export interface PageSectionProps {
  id: string;
  title: string;
  intro?: ReactNode;
  children: ReactNode;
  className?: string;
}

export function PageSection({ id, title, intro, children, className }: PageSectionProps) {
  return (
    <section id={id} aria-labelledby={`${id}-title`} className={cn('space-y-4', className)}>
      <div>
        <h2 id={`${id}-title`} className="text-heading text-ink">
          {title}
        </h2>
        {intro ? <p className="mt-1 max-w-prose text-label text-ink-muted">{intro}</p> : null}
      </div>
      {children}
    </section>
  );
}
