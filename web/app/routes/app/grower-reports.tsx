// The grower's home, below their sites: every report they may read (their own site reports and
// the network reports), so nobody has to hunt for the link.
import { useQueries } from '@tanstack/react-query';
import { LoadingBlock } from '../../../components/ui/spinner';
import { trialQueryOptions } from '../../../features/trials/api/get-trial';
import { useTrials } from '../../../features/trials/api/get-trials';
import { ReportList } from '../../../features/home/components/report-list';

export function GrowerReports({ networkIds }: { networkIds: readonly string[] }) {
  const trials = useTrials();
  const mine = (trials.data ?? []).filter((t) => networkIds.includes(t.networkId));
  const details = useQueries({
    queries: mine.map((t) => trialQueryOptions(t.id)),
    combine: (results) => (results.every((r) => r.data) ? results.map((r) => r.data!) : undefined),
  });
  return (
    <section
      aria-labelledby="grower-reports"
      className="mt-10 space-y-4"
      data-testid="grower-reports"
    >
      <h2 id="grower-reports" className="text-title text-ink">
        Reports you can read
      </h2>
      {details === undefined ? (
        <LoadingBlock label="Loading reports…" />
      ) : (
        <ReportList trials={details} />
      )}
    </section>
  );
}
