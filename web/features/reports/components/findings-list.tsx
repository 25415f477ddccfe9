// The plain-language findings, first sentence set apart as the headline.
export function FindingsList({
  findings,
  title = 'What this means',
}: {
  findings: string[];
  title?: string;
}) {
  const [lead, ...rest] = findings;
  return (
    <section
      aria-labelledby="findings-title"
      className="rounded-card border border-line border-l-4 border-l-straw-500 bg-surface p-5 shadow-card sm:p-6"
    >
      <h2 id="findings-title" className="text-heading text-ink">
        {title}
      </h2>
      {lead ? <p className="mt-2 text-lead font-medium text-ink">{lead}</p> : null}
      <ul className="mt-3 space-y-2.5">
        {rest.map((finding, i) => (
          <li key={i} className="flex gap-3 text-ink">
            <span aria-hidden="true" className="mt-2.5 size-1.5 shrink-0 rounded-full bg-accent" />
            <span>{finding}</span>
          </li>
        ))}
      </ul>
    </section>
  );
}
