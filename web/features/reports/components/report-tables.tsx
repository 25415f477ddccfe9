// The report tables: ANOVA, rate means, differences from the reference, components, economics.
import type { ReactNode } from 'react';
import type {
  AnovaRow,
  PooledMean,
  RateDifference,
  RateMean,
} from '../../../../shared/analysis/types';
import {
  formatMoney,
  formatNumber,
  formatP,
  squaredDecimals,
} from '../../../../shared/reports/format-numbers';
import {
  comparisonVerdict,
  intervalKindWords,
  signedNumber,
  verdictWords,
  type Comparison,
} from '../../../../shared/reports/plain-words';
import type { ComponentRow, EconomicsRow } from '../../../../shared/schemas/report';
import type { UnitConversion } from '../../../../shared/units/design-units';
import { DataTable } from '../../../components/ui/data-table';

const pValue = (p: number | undefined) =>
  p === undefined ? '' : formatP(p).replace('p = ', '').replace('p < ', '< ');
const SOURCES: Record<string, string> = {
  block: 'Blocks',
  rate: 'Seeding rate',
  error: 'Error (strips)',
  total: 'Total',
  site: 'Sites',
  'block(site)': 'Blocks within sites',
  'site:rate': 'Site × rate',
};

export function AnovaTable({
  anova,
  digits,
  caption = 'Analysis of variance',
}: {
  anova: AnovaRow[];
  digits: number;
  caption?: ReactNode;
}) {
  return (
    <DataTable
      caption={caption}
      head={['Source', 'df', 'Sum of squares', 'Mean square', 'F', 'p']}
      rows={anova.map((row) => [
        SOURCES[row.source] ?? row.source,
        row.df,
        formatNumber(row.ss, squaredDecimals(digits)),
        'ms' in row ? formatNumber(row.ms, squaredDecimals(digits)) : '',
        'f' in row ? formatNumber(row.f, 2) : '',
        'p' in row ? pValue(row.p) : '',
      ])}
    />
  );
}

export function MeansTable({
  means,
  label,
  unit,
  digits,
  details = false,
  caption = 'Rate means',
}: {
  means: (RateMean | PooledMean)[];
  label: (rate: string) => string;
  unit: string;
  digits: number;
  /** The statistician's view: standard errors and Tukey group letters. */
  details?: boolean;
  caption?: string;
}) {
  const letters = details && means.some((m) => 'group' in m);
  return (
    <DataTable
      caption={caption}
      head={[
        'Rate',
        'Strips',
        `Mean (${unit})`,
        '95 % interval, this rate alone',
        ...(details ? ['Standard error'] : []),
        ...(letters ? ['Tukey group'] : []),
      ]}
      rows={means.map((m) => [
        label(m.rate),
        m.n,
        formatNumber(m.mean, digits),
        `${formatNumber(m.ciLow, digits)} – ${formatNumber(m.ciHigh, digits)}`,
        ...(details ? [formatNumber(m.se, digits + 1)] : []),
        ...(letters ? [(m as RateMean).group] : []),
      ])}
    />
  );
}

/** Differences from the reference for the grower: the Dunnett-adjusted interval and a verdict. */
export function PlainDifferencesTable({
  comparisons,
  rates,
  label,
  referenceLabel,
  unit,
  digits,
}: {
  comparisons: Comparison[];
  rates: string[];
  label: (rate: string) => string;
  referenceLabel: string;
  unit: string;
  digits: number;
}) {
  const kind = comparisons[0]?.kind ?? 'dunnett';
  return (
    <DataTable
      caption={`Difference from the ${referenceLabel} rate`}
      head={[
        'Rate',
        `Difference (${unit})`,
        `95 % interval, ${intervalKindWords(kind)}`,
        'What it means',
      ]}
      rows={comparisons.map((c, i) => [
        label(rates[i] ?? ''),
        signedNumber(c.estimate, digits),
        `${signedNumber(c.low, digits)} to ${signedNumber(c.high, digits)}`,
        verdictWords(comparisonVerdict(c), c.reference),
      ])}
    />
  );
}

/** Differences from the reference for the statistician: each test alone and Dunnett's. */
export function DifferencesDetailTable({
  differences,
  label,
  referenceLabel,
  unit,
  digits,
  caption = `Difference from the ${referenceLabel} rate: one comparison and all comparisons`,
}: {
  differences: RateDifference[];
  label: (rate: string) => string;
  referenceLabel: string;
  unit: string;
  digits: number;
  caption?: string;
}) {
  const adjusted = differences.some((d) => d.pAdjusted !== undefined);
  return (
    <DataTable
      caption={caption}
      head={[
        'Rate',
        `Difference (${unit})`,
        'Standard error',
        '95 % interval, one comparison',
        'p, one comparison',
        ...(adjusted
          ? ['95 % interval, all comparisons (Dunnett)', 'p, all comparisons (Dunnett)']
          : []),
      ]}
      rows={differences.map((d) => [
        label(d.rate),
        signedNumber(d.diff, digits),
        formatNumber(d.se, digits + 1),
        `${signedNumber(d.ciLow, digits)} to ${signedNumber(d.ciHigh, digits)}`,
        pValue(d.p),
        ...(adjusted
          ? [
              d.ciLowAdjusted === undefined || d.ciHighAdjusted === undefined
                ? '–'
                : `${signedNumber(d.ciLowAdjusted, digits)} to ${signedNumber(d.ciHighAdjusted, digits)}`,
              pValue(d.pAdjusted),
            ]
          : []),
      ])}
    />
  );
}

export function DifferencesTable({
  differences,
  label,
  referenceLabel,
  unit,
  digits,
}: {
  differences: RateDifference[];
  label: (rate: string) => string;
  referenceLabel: string;
  unit: string;
  digits: number;
}) {
  return (
    <DataTable
      caption={`Difference from the ${referenceLabel} rate (each comparison on its own, not adjusted)`}
      head={['Rate', `Difference (${unit})`, '95 % interval, one comparison', 'p, one comparison']}
      rows={differences.map((d) => [
        label(d.rate),
        signedNumber(d.diff, digits),
        `${signedNumber(d.ciLow, digits)} to ${signedNumber(d.ciHigh, digits)}`,
        pValue(d.p),
      ])}
    />
  );
}

export function ComponentsTable({
  rows,
  seedUnit,
  yieldUnit,
  moneyUnit,
  perArea,
  digits,
}: {
  rows: ComponentRow[];
  seedUnit: string;
  yieldUnit: string;
  moneyUnit: string;
  /** Counts are stored per ft²; a metric trial shows them per m². */
  perArea: UnitConversion;
  digits: number;
}) {
  const area = (value: number | null) => (value === null ? null : perArea.fromStored(value));
  return (
    <DataTable
      caption="Yield components and seed economics (means over strips)"
      head={[
        'Rate',
        `Seed (${seedUnit})`,
        `Plants/${perArea.unit}`,
        'Establishment',
        'Tillers/plant',
        `Heads/${perArea.unit}`,
        `Yield (${yieldUnit})`,
        'Seed return',
        `Return over seed (${moneyUnit})`,
      ]}
      rows={rows.map((c) => [
        c.label,
        formatNumber(c.seedRate, 1),
        formatNumber(area(c.plantsPerSquareFoot), perArea.unit === 'm²' ? 0 : 1),
        c.establishmentPercent === null ? '–' : `${formatNumber(c.establishmentPercent, 0)} %`,
        formatNumber(c.tillersPerPlant, 2),
        formatNumber(area(c.headsPerSquareFoot), perArea.unit === 'm²' ? 0 : 1),
        formatNumber(c.yield, digits),
        c.seedReturn === null ? '–' : `${formatNumber(c.seedReturn, 1)}×`,
        formatMoney(c.returnOverSeedCost),
      ])}
    />
  );
}

export function EconomicsTable({
  rows,
  seedUnit,
  yieldUnit,
  moneyUnit,
  referenceLabel,
  digits,
}: {
  rows: EconomicsRow[];
  seedUnit: string;
  yieldUnit: string;
  moneyUnit: string;
  referenceLabel: string;
  digits: number;
}) {
  return (
    <DataTable
      caption="Return over seed cost, averaged over sites"
      head={[
        'Rate',
        `Seed (${seedUnit})`,
        `Seed cost (${moneyUnit})`,
        `Yield (${yieldUnit})`,
        `Grain value (${moneyUnit})`,
        'Return over seed',
        `Versus ${referenceLabel}`,
      ]}
      rows={rows.map((e) => [
        e.label,
        formatNumber(e.seedRate, 1),
        formatMoney(e.seedCost),
        formatNumber(e.meanYield, digits),
        formatMoney(e.grainValue),
        formatMoney(e.returnOverSeedCost),
        e.versusReference === null
          ? '–'
          : `${e.versusReference > 0.005 ? '+' : ''}${formatMoney(e.versusReference)}`,
      ])}
    />
  );
}
