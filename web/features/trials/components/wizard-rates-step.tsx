// Wizard step 2: the reference (full) rate and its unit, and the rate levels as multiples of it.
import { useFieldArray, useFormContext, useFormState, useWatch, get } from 'react-hook-form';
import { RATE_UNITS } from '../../../../shared/schemas/trial';
import { CROP_LABELS, rateUnitLabel } from '../../../../shared/labels/labels';
import { KG_PER_HA_PER_LB_PER_ACRE } from '../../../../shared/units/constants';
import { CROPS } from '../../../../shared/units/crops';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { GroupError } from '../../../components/ui/field-error';
import {
  FormNumberField,
  FormSelectField,
  FormTextField,
} from '../../../components/ui/form-controls';
import type { WizardValues } from './wizard-values';

function usualRateHint(crop: WizardValues['crop'], metric: boolean): string {
  if (!crop || crop === 'custom') return 'Your usual rate, as local advice recommends.';
  const perAcre = CROPS[crop].typicalReferenceRatePoundsPerAcre;
  const usual = metric
    ? `${Math.round(perAcre * KG_PER_HA_PER_LB_PER_ACRE)} kg/ha`
    : `${perAcre} lb/acre`;
  return `A usual full rate for ${CROP_LABELS[crop].toLowerCase()} is about ${usual}; use your local advice.`;
}

function RateLevels({ locked }: { locked: boolean }) {
  const { control } = useFormContext<WizardValues>();
  const { fields, append, remove } = useFieldArray({ control, name: 'levels' });
  const { errors } = useFormState({ control, name: 'levels' });
  const listError = (get(errors, 'levels.root') ?? get(errors, 'levels')) as
    { message?: string } | undefined;
  return (
    <fieldset disabled={locked} className="min-w-0 space-y-3">
      <legend className="text-label text-ink">Rate levels (multiples of the full rate)</legend>
      <p className="text-caption text-ink-muted">
        Between 2 and 8 levels, each with its own multiplier and a short label growers will see on
        the map. 0.5 means half the full rate, 2 means double.
      </p>
      <GroupError message={listError?.message} />
      <ul className="space-y-3">
        {fields.map((field, index) => (
          <li
            key={field.id}
            className="grid grid-cols-2 items-start gap-2 sm:grid-cols-[1fr_1.4fr_auto]"
          >
            <FormNumberField
              name={`levels.${index}.multiplier`}
              label={`Level ${index + 1}: times the full rate`}
              disabled={locked}
            />
            <FormTextField name={`levels.${index}.label`} label="Label" disabled={locked} />
            <Button
              variant="quiet"
              aria-label={`Remove level ${index + 1}`}
              disabled={locked || fields.length <= 2}
              onClick={() => remove(index)}
              className="col-span-2 justify-self-start sm:col-span-1 sm:mt-7"
            >
              Remove
            </Button>
          </li>
        ))}
      </ul>
      <Button
        variant="secondary"
        disabled={locked || fields.length >= 8}
        onClick={() => append({ multiplier: '', label: '' })}
      >
        Add a level
      </Button>
    </fieldset>
  );
}

export function RatesStep({ locked }: { locked: boolean }) {
  const { control } = useFormContext<WizardValues>();
  const [crop, unitSystem] = useWatch({ control, name: ['crop', 'unitSystem'] });
  return (
    <div className="space-y-5">
      {locked ? (
        <Alert tone="info" title="Rate levels are fixed">
          A site is already randomized with these levels, so they can no longer change.
        </Alert>
      ) : null}
      <div className="grid gap-4 sm:grid-cols-2">
        <FormNumberField
          name="referenceRate"
          label="Reference (full) rate"
          hint={usualRateHint(crop, unitSystem === 'metric')}
          required
        />
        <FormSelectField name="referenceUnit" label="Unit">
          {RATE_UNITS.map((u) => (
            <option key={u} value={u}>
              {rateUnitLabel(u)}
            </option>
          ))}
        </FormSelectField>
      </div>
      <RateLevels locked={locked} />
    </div>
  );
}
