// How close the seeder is: percent of target with advice, the delivered and target figures, and
// for a grower on one of their sites, saving the check.
import { Link } from 'react-router-dom';
import type { z } from 'zod';
import type { SessionUser } from '../../../../shared/schemas/auth';
import type { SiteDetail } from '../../../../shared/schemas/site';
import type { CalibrationResult } from '../../../../shared/units/calibration';
import { countOf } from '../../../../shared/labels/labels';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { cn } from '../../../lib/cn';
import { errorSummary } from '../../../lib/form-errors';
import { useSaveCalibration } from '../api/calibration';
import type { CalibrationFormSchema, CalibrationUnits } from '../lib/calculator-forms';

const f1 = new Intl.NumberFormat('en', { maximumFractionDigits: 1 });

export interface CalibrationOutcome {
  input: z.output<typeof CalibrationFormSchema>;
  result: CalibrationResult;
  targetForRun: number;
}

function Figures({ outcome, units }: { outcome: CalibrationOutcome; units: CalibrationUnits }) {
  const { input, result, targetForRun } = outcome;
  const figures: [string, number][] = [
    [
      `Delivered per ${units.lengthWord} of row`,
      units.target.fromStored(result.deliveredSeedsPerFootOfRow),
    ],
    [`Delivered per ${units.area.unit}`, units.area.fromStored(result.deliveredSeedsPerSquareFoot)],
    ['Target per turn', result.targetSeedsPerTurn],
    [`Target for ${countOf(input.wheelTurns, 'turn')}`, targetForRun],
  ];
  return (
    <dl className="grid grid-cols-2 gap-3 text-label">
      {figures.map(([label, value]) => (
        <div key={label} className="rounded-field border border-line bg-surface p-3">
          <dt className="text-ink-muted">{label}</dt>
          <dd className="figures text-heading">{f1.format(value)}</dd>
        </div>
      ))}
    </dl>
  );
}

function SaveCheck({
  outcome,
  site,
  rateLabel,
}: {
  outcome: CalibrationOutcome;
  site: SiteDetail;
  rateLabel: string;
}) {
  const save = useSaveCalibration(site.id);
  const { input } = outcome;
  return (
    <div className="space-y-2">
      <Button
        busy={save.isPending}
        onClick={() =>
          save.mutate({
            wheelCircumferenceFt: input.wheelCircumferenceFt,
            turns: input.wheelTurns,
            seedsCounted: input.seedsCounted,
            targetSeedsPerFt: input.targetSeedsPerFootOfRow,
            rowSpacingIn: input.rowSpacingIn,
            rateLabel: rateLabel || null,
            note: '',
          })
        }
      >
        Save this check to {site.fieldName}
      </Button>
      {save.isSuccess ? (
        <Alert tone="success">
          Saved. {countOf(save.data.calibrations.length, 'check')} on record for this site.
        </Alert>
      ) : null}
      {save.isError ? <Alert tone="danger">{errorSummary(save.error)}</Alert> : null}
    </div>
  );
}

export function CalibrationResults({
  outcome,
  units,
  user,
  site,
  rateLabel,
}: {
  outcome: CalibrationOutcome | null;
  units: CalibrationUnits;
  user: SessionUser | null;
  site: SiteDetail | null;
  rateLabel: string;
}) {
  const onTarget = outcome ? Math.abs(outcome.result.percentOfTarget - 100) <= 5 : false;
  return (
    <section aria-labelledby="cal-results" aria-live="polite" className="min-w-0 space-y-4">
      <h2 id="cal-results" className="text-heading text-ink">
        How close are you?
      </h2>
      {outcome ? (
        <>
          <div
            className={cn(
              'rounded-card border-2 p-5',
              onTarget ? 'border-accent bg-accent-soft' : 'border-caution bg-caution-soft',
            )}
          >
            <p className="text-caption font-semibold uppercase tracking-wide text-ink-muted">
              Percent of target
            </p>
            <p className="figures text-display text-ink" data-testid="percent-of-target">
              {Math.round(outcome.result.percentOfTarget)} %
            </p>
            <p className="mt-2 font-medium text-ink">{outcome.result.advice}</p>
          </div>
          <Figures outcome={outcome} units={units} />
          {site ? <SaveCheck outcome={outcome} site={site} rateLabel={rateLabel} /> : null}
          {!user ? (
            <p className="text-caption text-ink-muted">
              Growers in a trial can <Link to="/sign-in?next=/calibrate">sign in</Link> to keep this
              check with their site.
            </p>
          ) : null}
        </>
      ) : (
        <p className="rounded-field border border-dashed border-line-strong bg-sunken p-4 text-ink-muted">
          Enter the seeds you counted to see how close the seeder is.
        </p>
      )}
    </section>
  );
}
