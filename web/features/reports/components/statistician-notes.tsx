// "For the statistician": the test statistics and tables kept below the grower's part of a
// report, under their own heading so the plain words come first on the page and on paper.
import type { ReactNode } from 'react';
import { Section } from './report-bits';

export function StatisticianPart({
  notes,
  children,
}: {
  notes: readonly string[] | undefined;
  children?: ReactNode;
}) {
  if ((!notes || notes.length === 0) && !children) return null;
  return (
    <Section
      id="statistician"
      title="For the statistician"
      intro="The tests behind the plain words above: F tests and their degrees of freedom, p-values with and without adjustment for comparing several rates, and the residual checks."
    >
      {notes && notes.length > 0 ? (
        <ul className="max-w-prose list-disc space-y-1.5 pl-5 text-label text-ink">
          {notes.map((note) => (
            <li key={note}>{note}</li>
          ))}
        </ul>
      ) : null}
      {children}
    </Section>
  );
}

/** A titled group of tables inside the statistician's part. */
export function StatisticianBlock({
  title,
  intro,
  children,
}: {
  title: string;
  intro?: ReactNode;
  children: ReactNode;
}) {
  return (
    <div className="space-y-3">
      <h3 className="text-label font-semibold text-ink">{title}</h3>
      {intro ? <p className="max-w-prose text-label text-ink-muted">{intro}</p> : null}
      {children}
    </div>
  );
}
