// The seeder calibration helper: seeds counted over a number of wheel turns against the target,
// with what to change; a grower signed in can save the check to one of their sites.
import { useEffect, useMemo, useState } from 'react';
import { useWatch } from 'react-hook-form';
import type { SessionUser } from '../../../../shared/schemas/auth';
import { calibrateSeeder } from '../../../../shared/units/calibration';
import { FormNumberField } from '../../../components/ui/form-controls';
import { Form, useZodForm } from '../../../lib/forms/zod-form';
import { useSite } from '../../../lib/queries/sites';
import {
  CALIBRATION_DEFAULTS,
  CalibrationFormSchema,
  type CalibrationFormValues,
} from '../lib/calculator-forms';
import { CalibrationResults, type CalibrationOutcome } from './calibration-results';
import { CalibrationSitePicker } from './calibration-site-picker';

function useCalibration(values: CalibrationFormValues): CalibrationOutcome | null {
  return useMemo(() => {
    const parsed = CalibrationFormSchema.safeParse(values);
    if (!parsed.success) return null;
    const input = parsed.data;
    const result = calibrateSeeder({
      seedsCounted: input.seedsCounted,
      wheelTurns: input.wheelTurns,
      circumferenceFeet: input.wheelCircumferenceFt,
      rowSpacingInches: input.rowSpacingIn,
      targetSeedsPerFootOfRow: input.targetSeedsPerFootOfRow,
    });
    return { input, result, targetForRun: result.targetSeedsPerTurn * input.wheelTurns };
  }, [values]);
}

export function CalibrationHelper({
  user,
  initialSiteId,
}: {
  user: SessionUser | null;
  initialSiteId: string | null;
}) {
  // Errors show once a box is changed: nothing is wrong before anything is typed.
  const form = useZodForm(CalibrationFormSchema, {
    defaultValues: CALIBRATION_DEFAULTS,
    mode: 'onChange',
  });
  const values = useWatch({ control: form.control }) as CalibrationFormValues;
  const outcome = useCalibration(values);
  const [siteId, setSiteId] = useState<string | null>(initialSiteId);
  const [rateLabel, setRateLabel] = useState('');
  const site = useSite(siteId);
  const { setValue } = form;

  useEffect(() => {
    const spacing = site.data?.trial.rowSpacingIn;
    if (spacing) setValue('rowSpacingIn', String(spacing));
  }, [site.data, setValue]);

  return (
    <div className="grid grid-cols-1 gap-6 lg:grid-cols-2">
      <Form
        form={form}
        onSubmit={() => undefined}
        className="min-w-0 space-y-5"
        aria-label="Calibration inputs"
      >
        {user ? (
          <CalibrationSitePicker
            site={site.data ?? null}
            siteId={siteId}
            onSite={setSiteId}
            rateLabel={rateLabel}
            onRate={(label, seedsPerFoot) => {
              setRateLabel(label);
              if (seedsPerFoot !== null)
                setValue('targetSeedsPerFootOfRow', String(Math.round(seedsPerFoot * 100) / 100), {
                  shouldValidate: true,
                });
            }}
          />
        ) : null}
        <ol className="list-decimal space-y-1 pl-5 text-label font-normal text-ink-muted">
          <li>Roll the drive wheel one turn on the floor and measure how far it went.</li>
          <li>
            Lift the seeder, put a bowl under one outlet, and turn the wheel a set number of times.
          </li>
          <li>Count the seeds in the bowl and enter them below.</li>
        </ol>
        <div className="grid grid-cols-2 gap-3">
          <FormNumberField name="wheelCircumferenceFt" label="Wheel circumference" suffix="ft" />
          <FormNumberField name="wheelTurns" whole label="Wheel turns" />
          <FormNumberField name="seedsCounted" whole label="Seeds counted" />
          <FormNumberField name="rowSpacingIn" label="Row spacing" suffix="in" />
          <FormNumberField
            name="targetSeedsPerFootOfRow"
            label="Target"
            suffix="seeds/ft"
            containerClassName="col-span-2"
            hint="Seeds per foot of row for the rate you are setting (from your field packet)."
          />
        </div>
      </Form>
      <CalibrationResults
        outcome={outcome}
        user={user}
        site={siteId && site.data?.isGrower ? site.data : null}
        rateLabel={rateLabel}
      />
    </div>
  );
}
