// "For the statistician": the test statistics kept below the plain-word findings.
export function StatisticianNotes({ notes }: { notes: readonly string[] | undefined }) {
  if (!notes || notes.length === 0) return null;
  return (
    <details className="rounded-card border border-line bg-surface px-4 py-3 text-label text-ink">
      <summary className="cursor-pointer font-semibold">For the statistician</summary>
      <ul className="mt-2 list-disc space-y-1 pl-5 text-ink-muted">
        {notes.map((note) => (
          <li key={note}>{note}</li>
        ))}
      </ul>
    </details>
  );
}
