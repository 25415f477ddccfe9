// Wizard step 1: network, name, question, crop, season, unit system and a custom crop's values.
import { useFormContext, useWatch } from 'react-hook-form';
import type { Membership } from '../../../../shared/schemas/auth';
import { CROP_KEYS, type CropKey, type UnitSystem } from '../../../../shared/schemas/trial';
import { CROP_LABELS } from '../../../../shared/labels/labels';
import { KG_PER_HA_PER_LB_PER_ACRE } from '../../../../shared/units/constants';
import { CROPS } from '../../../../shared/units/crops';
import {
  FormNumberField,
  FormSelectField,
  FormTextAreaField,
  FormTextField,
} from '../../../components/ui/form-controls';
import { switchUnitSystem, wizardUnits, type WizardValues } from './wizard-values';

const SYSTEMS: [UnitSystem, string][] = [
  ['imperial', 'Inches, feet, pounds, acres'],
  ['metric', 'Centimetres, metres, kilograms, hectares'],
];

function UnitSystemChoice() {
  const { getValues, setValue, control } = useFormContext<WizardValues>();
  const current = useWatch({ control, name: 'unitSystem' });
  function choose(next: UnitSystem) {
    const patch = switchUnitSystem(getValues(), next);
    for (const [key, value] of Object.entries(patch))
      setValue(key as keyof WizardValues, value as never, { shouldDirty: true });
  }
  return (
    <fieldset className="space-y-2 sm:col-span-2">
      <legend className="text-label text-ink">Units growers measure in</legend>
      <div className="flex flex-wrap gap-x-6 gap-y-1">
        {SYSTEMS.map(([value, label]) => (
          <label key={value} className="flex min-h-11 items-center gap-2 text-label">
            <input
              type="radio"
              name="unitSystem"
              value={value}
              checked={current === value}
              onChange={() => choose(value)}
              className="size-5 accent-[var(--sheaf-accent)]"
            />
            {label}
          </label>
        ))}
      </div>
    </fieldset>
  );
}

function CustomCropFields() {
  const { control } = useFormContext<WizardValues>();
  const values = useWatch({ control, name: ['unitSystem', 'crop', 'customBushel'] });
  const units = wizardUnits({ unitSystem: values[0], crop: values[1], customBushel: values[2] });
  return (
    <fieldset className="grid gap-4 rounded-field border border-line p-4 sm:col-span-2 sm:grid-cols-2">
      <legend className="px-1 text-label text-ink">Your crop’s values</legend>
      <FormTextField name="customName" label="Crop name" />
      <FormNumberField name="customTkw" label="Thousand-kernel weight" suffix="g" />
      <FormNumberField
        name="customBushel"
        label={units.system === 'metric' ? 'Test weight' : 'Bushel weight'}
        suffix={units.bushelWeight.unit}
      />
      <FormNumberField name="customMoisture" label="Standard moisture" suffix="%" />
    </fieldset>
  );
}

export function CropStep({ isNew, networks }: { isNew: boolean; networks: Membership[] }) {
  const { control, getValues, setValue } = useFormContext<WizardValues>();
  const crop = useWatch({ control, name: 'crop' });
  // A chosen crop fills in its usual full rate when none is typed yet (local advice may differ).
  function fillUsualRate(event: { target: { value: string } }) {
    const chosen = event.target.value as CropKey | '';
    const values = getValues();
    if (!chosen || chosen === 'custom' || values.referenceRate) return;
    const perAcre = CROPS[chosen].typicalReferenceRatePoundsPerAcre;
    const metric = values.referenceUnit === 'kg/ha';
    setValue(
      'referenceRate',
      String(metric ? Math.round(perAcre * KG_PER_HA_PER_LB_PER_ACRE) : perAcre),
    );
  }
  return (
    <div className="grid gap-4 sm:grid-cols-2">
      {isNew && networks.length > 1 ? (
        <FormSelectField name="networkId" label="Network" containerClassName="sm:col-span-2">
          {networks.map((m) => (
            <option key={m.networkId} value={m.networkId}>
              {m.networkName}
            </option>
          ))}
        </FormSelectField>
      ) : null}
      <FormTextField
        name="name"
        label="Trial name"
        required
        containerClassName="sm:col-span-2"
        placeholder="e.g. Oat seeding rate 2027"
      />
      <FormTextAreaField
        name="question"
        label="The question"
        hint="What the network wants to know, in one sentence."
        containerClassName="sm:col-span-2"
        placeholder="Does half the usual oat rate yield as well on our farms?"
      />
      <FormSelectField name="crop" label="Crop" registerOptions={{ onChange: fillUsualRate }}>
        <option value="">Choose a crop…</option>
        {CROP_KEYS.map((key) => (
          <option key={key} value={key}>
            {CROP_LABELS[key]}
          </option>
        ))}
      </FormSelectField>
      <FormTextField name="season" label="Season" required hint="e.g. 2027 or 2027–28" />
      <UnitSystemChoice />
      {crop === 'custom' ? <CustomCropFields /> : null}
    </div>
  );
}
