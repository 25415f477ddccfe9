// A figures table for the series report: a caption saying what the numbers are, a scroll box.
import type { ReactNode } from 'react';
import { cn } from '../../../lib/cn';

export function SeriesTable({
  caption,
  head,
  rows,
}: {
  caption: string;
  head: ReactNode[];
  rows: ReactNode[][];
}) {
  return (
    <figure className="space-y-2">
      {/* The caption sits outside the scrolling box so a phone shows all of it. */}
      <figcaption aria-hidden="true" className="max-w-prose text-label font-semibold text-ink">
        {caption}
      </figcaption>
      {/* A scrolling box takes keyboard focus so a wide table can be scrolled without a mouse. */}
      <div
        className="overflow-x-auto rounded-card border border-line bg-surface"
        tabIndex={0}
        role="region"
        aria-label={caption}
      >
        <table className="figures w-full min-w-max border-collapse text-label">
          <caption className="sr-only">{caption}</caption>
          <thead>
            <tr>
              {head.map((cell, i) => (
                <th
                  key={i}
                  scope="col"
                  className={cn(
                    'border-b border-line px-4 py-2 font-semibold text-ink-muted',
                    i === 0 ? 'text-left' : 'text-right',
                  )}
                >
                  {cell}
                </th>
              ))}
            </tr>
          </thead>
          <tbody>
            {rows.map((row, r) => (
              <tr key={r} className="border-b border-line last:border-b-0">
                {row.map((cell, i) =>
                  i === 0 ? (
                    <th key={i} scope="row" className="px-4 py-2 text-left font-medium text-ink">
                      {cell}
                    </th>
                  ) : (
                    <td key={i} className="px-4 py-2 text-right text-ink">
                      {cell}
                    </td>
                  ),
                )}
              </tr>
            ))}
          </tbody>
        </table>
      </div>
    </figure>
  );
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
