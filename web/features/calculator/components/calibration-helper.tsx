// The seeder calibration helper: seeds counted over a number of wheel turns against the target,
// with what to change; a grower signed in can save the check to one of their sites. A metric
// trial's site (or the units chosen without a site) gives metres, centimetres and seeds per metre.
import { useEffect, useMemo, useState } from 'react';
import { useWatch } from 'react-hook-form';
import type { SessionUser } from '../../../../shared/schemas/auth';
import type { SiteDetail } from '../../../../shared/schemas/site';
import type { UnitSystem } from '../../../../shared/schemas/trial';
import { calibrateSeeder } from '../../../../shared/units/calibration';
import { SelectField } from '../../../components/ui/form-fields';
import { FormNumberField } from '../../../components/ui/form-controls';
import { Form, useZodForm } from '../../../lib/forms/zod-form';
import { useSite } from '../../../lib/queries/sites';
import {
  calibrationDefaults,
  calibrationFormSchema,
  calibrationUnits,
  type CalibrationFormValues,
} from '../lib/calculator-forms';
import { CalibrationResults, type CalibrationOutcome } from './calibration-results';
import { CalibrationSitePicker } from './calibration-site-picker';

const tenth = (value: number) => String(Math.round(value * 10) / 10);

function useCalibration(
  values: CalibrationFormValues,
  system: UnitSystem,
): CalibrationOutcome | null {
  return useMemo(() => {
    const parsed = calibrationFormSchema(system).safeParse(values);
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
  }, [values, system]);
}

interface SiteChoice {
  site: SiteDetail | null;
  siteId: string | null;
  onSite: (siteId: string | null) => void;
  rateLabel: string;
  onRateLabel: (label: string) => void;
}

function CalibrationForm({
  system,
  onSystem,
  user,
  choice,
}: {
  system: UnitSystem;
  onSystem: (system: UnitSystem) => void;
  user: SessionUser | null;
  choice: SiteChoice;
}) {
  const units = calibrationUnits(system);
  // Errors show once a box is changed: nothing is wrong before anything is typed.
  const form = useZodForm(calibrationFormSchema(system), {
    defaultValues: calibrationDefaults(system),
    mode: 'onChange',
  });
  const values = useWatch({ control: form.control }) as CalibrationFormValues;
  const outcome = useCalibration(values, system);
  const { setValue } = form;
  const { site } = choice;

  useEffect(() => {
    const spacing = site?.trial.rowSpacingIn;
    if (spacing) setValue('rowSpacingIn', tenth(units.rowSpacing.fromStored(spacing)));
  }, [site, setValue, units.rowSpacing]);

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
            site={site}
            siteId={choice.siteId}
            onSite={choice.onSite}
            rateLabel={choice.rateLabel}
            onRate={(label, seedsPerFoot) => {
              choice.onRateLabel(label);
              if (seedsPerFoot !== null)
                setValue('targetSeedsPerFootOfRow', tenth(units.target.fromStored(seedsPerFoot)), {
                  shouldValidate: true,
                });
            }}
          />
        ) : null}
        {site ? null : (
          <SelectField
            label="Units"
            value={system}
            onChange={(e) => onSystem(e.target.value as UnitSystem)}
          >
            <option value="imperial">Feet, inches, seeds per foot</option>
            <option value="metric">Metres, centimetres, seeds per metre</option>
          </SelectField>
        )}
        <ol className="list-decimal space-y-1 pl-5 text-label font-normal text-ink-muted">
          <li>Roll the drive wheel one turn on the floor and measure how far it went.</li>
          <li>
            Lift the seeder, put a bowl under one outlet, and turn the wheel a set number of times.
          </li>
          <li>Count the seeds in the bowl and enter them below.</li>
        </ol>
        <div className="grid grid-cols-2 gap-3">
          <FormNumberField
            name="wheelCircumferenceFt"
            label="Wheel circumference"
            suffix={units.circumference.unit}
          />
          <FormNumberField name="wheelTurns" whole label="Wheel turns" />
          <FormNumberField name="seedsCounted" whole label="Seeds counted" />
          <FormNumberField name="rowSpacingIn" label="Row spacing" suffix={units.rowSpacing.unit} />
          <FormNumberField
            name="targetSeedsPerFootOfRow"
            label="Target"
            suffix={units.target.unit}
            containerClassName="col-span-2"
            hint={`Seeds per ${units.lengthWord} of row for the rate you are setting (from your field packet).`}
          />
        </div>
      </Form>
      <CalibrationResults
        outcome={outcome}
        units={units}
        user={user}
        site={choice.siteId && site?.isGrower ? site : null}
        rateLabel={choice.rateLabel}
      />
    </div>
  );
}

export function CalibrationHelper({
  user,
  initialSiteId,
}: {
  user: SessionUser | null;
  initialSiteId: string | null;
}) {
  const [siteId, setSiteId] = useState<string | null>(initialSiteId);
  const [rateLabel, setRateLabel] = useState('');
  const [chosenSystem, setChosenSystem] = useState<UnitSystem>('imperial');
  const site = useSite(siteId);
  // A site's trial sets the units; the boxes start again in them when it changes.
  const system = site.data?.trial.unitSystem ?? chosenSystem;
  return (
    <CalibrationForm
      key={system}
      system={system}
      onSystem={setChosenSystem}
      user={user}
      choice={{
        site: siteId ? (site.data ?? null) : null,
        siteId,
        onSite: setSiteId,
        rateLabel,
        onRateLabel: setRateLabel,
      }}
    />
  );
}
