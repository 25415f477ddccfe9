// The series report's figures tables (a caption saying what the numbers are, a scroll box) and
// its sections.
import type { ReactNode } from 'react';
import { DataTable } from '../../../components/ui/data-table';

/** A figures table of the series report, its caption above the scrolling box. */
export function SeriesTable(props: { caption: string; head: ReactNode[]; rows: ReactNode[][] }) {
  return <DataTable {...props} captionAbove />;
}

export function SeriesSection({
  id,
  title,
  intro,
  children,
}: {
  id: string;
  title: string;
  intro?: ReactNode;
  children: ReactNode;
}) {
  return (
    <section id={id} aria-labelledby={`${id}-title`} className="space-y-4">
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
