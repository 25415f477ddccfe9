// A table of figures in a scrolling box that takes keyboard focus (a wide table scrolls without
// a mouse); the first column names each row. Reports and the series report share it.
import type { ReactNode } from 'react';
import { cn } from '../../lib/cn';

export function DataTable({
  caption,
  head,
  rows,
  className,
  captionAbove = false,
}: {
  caption: ReactNode;
  head: ReactNode[];
  rows: ReactNode[][];
  className?: string;
  /** Show the caption above the box rather than inside it, so a phone shows all of it. */
  captionAbove?: boolean;
}) {
  const label = typeof caption === 'string' ? caption : 'Table';
  const box = (
    <div
      className={cn('overflow-x-auto rounded-card border border-line bg-surface', className)}
      tabIndex={0}
      role="region"
      aria-label={label}
    >
      <table className="figures w-full min-w-max border-collapse text-label">
        <caption
          className={
            captionAbove ? 'sr-only' : 'px-4 pt-3 text-left text-label font-semibold text-ink'
          }
        >
          {caption}
        </caption>
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
  );
  if (!captionAbove) return box;
  return (
    <figure className="space-y-2">
      <figcaption aria-hidden="true" className="max-w-prose text-label font-semibold text-ink">
        {caption}
      </figcaption>
      {box}
    </figure>
  );
}
