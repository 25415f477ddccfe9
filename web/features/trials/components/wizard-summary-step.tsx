// Wizard step 5: the design in plain lines, seed for every rate, and the replication planner.
import { useMemo } from 'react';
import { useFormContext, useWatch } from 'react-hook-form';
import { rateTable } from '../../../../shared/design/rate-table';
import { parseDecimal } from '../../../../shared/units/parse-decimal';
import { Alert } from '../../../components/ui/alert';
import { PowerPlanner } from './power-planner';
import { RateSummaryTable } from './rate-summary-table';
import { TrialDesignSummary } from './trial-design-summary';
import { toPayload, type WizardValues } from './wizard-values';

export function SummaryStep() {
  const { control } = useFormContext<WizardValues>();
  const values = useWatch({ control }) as WizardValues;
  const payload = useMemo(() => toPayload(values), [values]);
  const table = useMemo(() => {
    try {
      return rateTable({ ...payload, rateLevels: payload.rateLevels ?? [] });
    } catch {
      return [];
    }
  }, [payload]);
  const blocks = parseDecimal(values.blocksPerSite ?? '');
  return (
    <div className="space-y-6">
      <TrialDesignSummary
        design={payload}
        className="rounded-card border border-line bg-surface p-5 shadow-card"
      />
      {table.length > 0 ? (
        <div className="space-y-2">
          <h3 className="text-heading text-ink">Seed for every rate</h3>
          <p className="text-caption text-ink-muted">
            Grams are for one strip of {values.rowsPerStrip} rows × {values.stripLength}{' '}
            {values.unitSystem === 'metric' ? 'm' : 'ft'}.
          </p>
          <RateSummaryTable
            rows={table}
            caption="Seed amounts per rate level"
            unitSystem={values.unitSystem}
          />
        </div>
      ) : (
        <Alert tone="caution" title="Seed amounts need the full design">
          Fill in the reference rate, strips and seed lot to see seeds per{' '}
          {values.unitSystem === 'metric'
            ? 'metre of row, seeds/m², kg/ha'
            : 'foot of row, seeds/ft², lb/acre, kg/ha'}{' '}
          and grams per strip.
        </Alert>
      )}
      <PowerPlanner
        rates={values.levels?.length ?? 0}
        blocksPerSite={blocks.ok ? blocks.value : null}
      />
    </div>
  );
}
