// The seeder calibration helper: seeds counted over a number of wheel turns against the target,
// with what to change; a grower signed in can save the check to one of their sites.
import { useEffect, useMemo, useState } from 'react';
import { Link } from 'react-router-dom';
import type { SessionUser } from '../../../../shared/schemas/auth';
import { CalibrationCalcInputSchema } from '../../../../shared/schemas/calc';
import { rateTable } from '../../../../shared/design/rate-table';
import { calibrateSeeder } from '../../../../shared/units/calibration';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { SelectField } from '../../../components/ui/form-fields';
import { TextField } from '../../../components/ui/text-field';
import { errorSummary } from '../../../lib/form-errors';
import { cn } from '../../../lib/cn';
import { useSaveCalibration } from '../api/calibration';
import { useMySites, useSite } from '../../../lib/queries/sites';
import { numberFieldErrors, parseNumberInput as num } from '../lib/number-input';
import { fieldBinder } from '../../../lib/bind-field';

const f1 = new Intl.NumberFormat('en', { maximumFractionDigits: 1 });

export function CalibrationHelper({
  user,
  initialSiteId,
}: {
  user: SessionUser | null;
  initialSiteId: string | null;
}) {
  const [v, setV] = useState({
    wheelCircumferenceFt: '3',
    wheelTurns: '5',
    seedsCounted: '',
    rowSpacingIn: '8',
    targetSeedsPerFootOfRow: '10',
  });
  const [siteId, setSiteId] = useState<string | null>(initialSiteId);
  const [rateLabel, setRateLabel] = useState<string>('');
  const set = (patch: Partial<typeof v>) => setV((s) => ({ ...s, ...patch }));
  const mySites = useMySites(Boolean(user));
  const site = useSite(siteId);
  const save = useSaveCalibration(siteId ?? '');

  const targets = useMemo(
    () =>
      site.data ? rateTable({ ...site.data.trial, rateLevels: site.data.trial.rateLevels }) : [],
    [site.data],
  );

  useEffect(() => {
    if (site.data?.trial.rowSpacingIn)
      setV((s) => ({ ...s, rowSpacingIn: String(site.data.trial.rowSpacingIn) }));
  }, [site.data]);

  function chooseRate(label: string) {
    setRateLabel(label);
    const row = targets.find((r) => r.label === label);
    if (row)
      set({ targetSeedsPerFootOfRow: String(Math.round(row.seedsPerFootOfRow * 100) / 100) });
  }

  const { result, errors } = useMemo(() => {
    const parsed = CalibrationCalcInputSchema.safeParse({
      seedsCounted: num(v.seedsCounted),
      wheelTurns: num(v.wheelTurns),
      wheelCircumferenceFt: num(v.wheelCircumferenceFt),
      rowSpacingIn: num(v.rowSpacingIn),
      targetSeedsPerFootOfRow: num(v.targetSeedsPerFootOfRow),
    });
    if (!parsed.success) return { result: null, errors: numberFieldErrors(parsed.error) };
    const r = calibrateSeeder({
      seedsCounted: parsed.data.seedsCounted,
      wheelTurns: parsed.data.wheelTurns,
      circumferenceFeet: parsed.data.wheelCircumferenceFt,
      rowSpacingInches: parsed.data.rowSpacingIn,
      targetSeedsPerFootOfRow: parsed.data.targetSeedsPerFootOfRow,
    });
    return {
      result: { ...r, targetForRun: r.targetSeedsPerTurn * parsed.data.wheelTurns },
      errors: {} as Record<string, string>,
    };
  }, [v]);
  const field = fieldBinder(v, set, errors);

  const onTarget = result ? Math.abs(result.percentOfTarget - 100) <= 5 : false;
  const growerSites = mySites.data ?? [];

  return (
    <div className="grid grid-cols-1 gap-6 lg:grid-cols-2">
      <form
        className="space-y-5"
        onSubmit={(e) => e.preventDefault()}
        aria-label="Calibration inputs"
      >
        {user && growerSites.length > 0 ? (
          <div className="grid gap-3 rounded-card border border-line bg-surface p-4 sm:grid-cols-2">
            <SelectField
              label="Your site"
              value={siteId ?? ''}
              onChange={(e) => setSiteId(e.target.value || null)}
            >
              <option value="">No site (just calculate)</option>
              {growerSites.map((s) => (
                <option key={s.id} value={s.id}>
                  {s.fieldName} — {s.trialName}
                </option>
              ))}
            </SelectField>
            {targets.length > 0 ? (
              <SelectField
                label="Rate you are setting"
                value={rateLabel}
                onChange={(e) => chooseRate(e.target.value)}
              >
                <option value="">Choose a rate…</option>
                {targets.map((r) => (
                  <option key={r.label} value={r.label}>
                    {r.label} ×{r.multiplier} — {f1.format(r.seedsPerFootOfRow)} seeds/ft
                  </option>
                ))}
              </SelectField>
            ) : null}
          </div>
        ) : null}
        <ol className="list-decimal space-y-1 pl-5 text-label font-normal text-ink-muted">
          <li>Roll the drive wheel one turn on the floor and measure how far it went.</li>
          <li>
            Lift the seeder, put a bowl under one outlet, and turn the wheel a set number of times.
          </li>
          <li>Count the seeds in the bowl and enter them below.</li>
        </ol>
        <div className="grid grid-cols-2 gap-3">
          <TextField
            label="Wheel circumference"
            suffix="ft"
            inputMode="decimal"
            {...field('wheelCircumferenceFt')}
          />
          <TextField label="Wheel turns" inputMode="numeric" {...field('wheelTurns')} />
          <TextField label="Seeds counted" inputMode="numeric" {...field('seedsCounted')} />
          <TextField
            label="Row spacing"
            suffix="in"
            inputMode="decimal"
            {...field('rowSpacingIn')}
          />
          <TextField
            label="Target"
            suffix="seeds/ft"
            inputMode="decimal"
            {...field('targetSeedsPerFootOfRow')}
            containerClassName="col-span-2"
            hint="Seeds per foot of row for the rate you are setting (from your field packet)."
          />
        </div>
      </form>

      <section aria-labelledby="cal-results" aria-live="polite" className="space-y-4">
        <h2 id="cal-results" className="text-heading text-ink">
          How close are you?
        </h2>
        {result ? (
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
                {Math.round(result.percentOfTarget)} %
              </p>
              <p className="mt-2 font-medium text-ink">{result.advice}</p>
            </div>
            <dl className="grid grid-cols-2 gap-3 text-label">
              <div className="rounded-field border border-line bg-surface p-3">
                <dt className="text-ink-muted">Delivered per foot of row</dt>
                <dd className="figures text-heading">
                  {f1.format(result.deliveredSeedsPerFootOfRow)}
                </dd>
              </div>
              <div className="rounded-field border border-line bg-surface p-3">
                <dt className="text-ink-muted">Delivered per ft²</dt>
                <dd className="figures text-heading">
                  {f1.format(result.deliveredSeedsPerSquareFoot)}
                </dd>
              </div>
              <div className="rounded-field border border-line bg-surface p-3">
                <dt className="text-ink-muted">Target per turn</dt>
                <dd className="figures text-heading">{f1.format(result.targetSeedsPerTurn)}</dd>
              </div>
              <div className="rounded-field border border-line bg-surface p-3">
                <dt className="text-ink-muted">
                  Target for {v.wheelTurns} turn{v.wheelTurns.trim() === '1' ? '' : 's'}
                </dt>
                <dd className="figures text-heading">{f1.format(result.targetForRun)}</dd>
              </div>
            </dl>
            {user && siteId && site.data?.isGrower ? (
              <div className="space-y-2">
                <Button
                  busy={save.isPending}
                  onClick={() =>
                    save.mutate({
                      wheelCircumferenceFt: Number(v.wheelCircumferenceFt),
                      turns: Number(v.wheelTurns),
                      seedsCounted: Number(v.seedsCounted),
                      targetSeedsPerFt: Number(v.targetSeedsPerFootOfRow),
                      rowSpacingIn: Number(v.rowSpacingIn),
                      rateLabel: rateLabel || null,
                      note: '',
                    })
                  }
                >
                  Save this check to {site.data.fieldName}
                </Button>
                {save.isSuccess ? (
                  <Alert tone="success">
                    Saved. {save.data.calibrations.length} check(s) on record for this site.
                  </Alert>
                ) : null}
                {save.isError ? <Alert tone="danger">{errorSummary(save.error)}</Alert> : null}
              </div>
            ) : !user ? (
              <p className="text-caption text-ink-muted">
                Growers in a trial can <Link to="/sign-in?next=/calibrate">sign in</Link> to keep
                this check with their site.
              </p>
            ) : null}
          </>
        ) : (
          <p className="rounded-field border border-dashed border-line-strong bg-sunken p-4 text-ink-muted">
            Enter the seeds you counted to see how close the seeder is.
          </p>
        )}
      </section>
    </div>
  );
}
