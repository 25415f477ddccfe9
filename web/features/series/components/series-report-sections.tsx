// The series report's sections: plain words first, each season beside the pool, then the statistics.
import {
  decimalsFor,
  formatNumber,
  formatP,
  formatVariance,
} from '../../../../shared/reports/format-numbers';
import type { SeriesReport } from '../../../../shared/schemas/series';
import { SeriesSection, SeriesTable } from './series-table';

const interval = (low: number, high: number, digits: number) =>
  `${formatNumber(low, digits)} to ${formatNumber(high, digits)}`;
const signed = (value: number | null, digits: number) =>
  value === null ? '–' : `${value > 0 ? '+' : ''}${formatNumber(value, digits)}`;

export function digitsOf(report: SeriesReport): number {
  const first = report.means.rows.find((row) => row.pooled)?.pooled?.mean;
  return decimalsFor(first ?? 50);
}

export function SeriesFindings({ findings }: { findings: string[] }) {
  const [lead, ...rest] = findings;
  return (
    <section
      aria-labelledby="series-findings-title"
      className="rounded-card border border-line border-l-4 border-l-straw-500 bg-surface p-5 shadow-card sm:p-6"
    >
      <h2 id="series-findings-title" className="text-heading text-ink">
        What the seasons say together
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

export function SeasonsBesidePool({ report }: { report: SeriesReport }) {
  const digits = digitsOf(report);
  const seasons = report.seasons.map((s) => s.season);
  return (
    <SeriesSection
      id="beside-the-pool"
      title="Each season beside the pool"
      intro={report.means.seasonCaption}
    >
      <SeriesTable
        caption={report.means.caption}
        head={[
          'Rate',
          `All seasons (${report.unit})`,
          ...seasons.map((season) => `${season} alone`),
          '95 % interval, all seasons',
        ]}
        rows={report.means.rows.map((row) => [
          row.label,
          row.pooled ? formatNumber(row.pooled.mean, digits) : '–',
          ...row.seasons.map((value) => formatNumber(value, digits)),
          row.pooled ? interval(row.pooled.ciLow, row.pooled.ciHigh, digits) : '–',
        ])}
      />
      {report.differences.rows.length > 0 ? (
        <SeriesTable
          caption={report.differences.caption}
          head={[
            'Rate',
            `All seasons (${report.unit})`,
            ...seasons.map((season) => `${season} alone`),
            'Seasons as good as the reference',
            '95 % interval, one comparison',
            '95 % interval, all comparisons (Dunnett)',
          ]}
          rows={report.differences.rows.map((row) => [
            row.label,
            signed(row.estimate, digits),
            ...row.seasons.map((value) => signed(value, digits)),
            `${row.asWell} of ${row.compared}`,
            interval(row.ciLow, row.ciHigh, digits),
            interval(row.ciLowAdjusted, row.ciHighAdjusted, digits),
          ])}
        />
      ) : null}
    </SeriesSection>
  );
}

export function SeasonsList({ report }: { report: SeriesReport }) {
  return (
    <SeriesSection id="seasons" title="The seasons in this series">
      <ul className="space-y-2">
        {report.seasons.map((season) => (
          <li key={season.trialId} className="rounded-card border border-line bg-surface p-4">
            <p className="font-semibold text-ink">
              {season.season}: {season.trialName}
            </p>
            <p className="text-label text-ink-muted">
              {season.sites} {season.sites === 1 ? 'farm' : 'farms'} pooled
              {season.leftOut.length > 0
                ? `; left out: ${season.leftOut.map((l) => `${l.name} (${l.reason})`).join('; ')}`
                : ''}
              .{season.note ? ` ${season.note}` : ''}
            </p>
          </li>
        ))}
      </ul>
      {report.unpublishedTrials > 0 ? (
        <p className="text-label text-ink-muted">
          {report.unpublishedTrials === 1
            ? 'One more season joins'
            : `${report.unpublishedTrials} more seasons join`}{' '}
          this report once the coordinator publishes its network report.
        </p>
      ) : null}
    </SeriesSection>
  );
}

export function SeriesStatistics({ report }: { report: SeriesReport }) {
  const stats = report.statistician;
  return (
    <SeriesSection
      id="for-the-statistician"
      title="For the statistician"
      intro="Mixed model over every farm-season, fitted by REML; Kenward–Roger standard errors and degrees of freedom; Dunnett adjustment by the multivariate t with each comparison’s own df."
    >
      {stats.varianceComponents.length > 0 ? (
        <SeriesTable
          caption={`Variance components (REML estimates, (${report.unit})²)`}
          head={['Source of variation', 'Variance']}
          rows={stats.varianceComponents.map((c) => [c.label, formatVariance(c.value)])}
        />
      ) : null}
      <SeriesTable
        caption="Test of equal rate means (Kenward–Roger F), pooled and in each season alone"
        head={['Model', 'F', 'df', 'p']}
        rows={[
          ...(stats.rateTest ? [['All seasons', stats.rateTest] as const] : []),
          ...stats.seasonTests.map((t) => [`${t.season} alone`, t] as const),
        ].map(([name, t]) => [
          name,
          formatNumber(t.f, 2),
          `${t.df1} and ${formatNumber(t.df2, 1)}`,
          formatP(t.p),
        ])}
      />
      {stats.notes.length > 0 ? (
        <ul className="list-disc space-y-1 pl-5 text-label text-ink-muted">
          {stats.notes.map((note, i) => (
            <li key={i}>{note}</li>
          ))}
        </ul>
      ) : null}
    </SeriesSection>
  );
}
