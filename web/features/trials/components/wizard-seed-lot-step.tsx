// Wizard step 4: the seed lot (kernel weight or seeds per lb or kg, germination, expected emergence)
// and the seed and grain prices, in the trial's unit system.
import { useFormContext, useWatch } from 'react-hook-form';
import { CROPS } from '../../../../shared/units/crops';
import { FormNumberField } from '../../../components/ui/form-controls';
import { wizardUnits, type WizardValues } from './wizard-values';

export function SeedLotStep() {
  const { control, register } = useFormContext<WizardValues>();
  const [unitSystem, crop, customBushel, seedSize] = useWatch({
    control,
    name: ['unitSystem', 'crop', 'customBushel', 'seedSize'],
  });
  const units = wizardUnits({ unitSystem, crop, customBushel });
  const metric = unitSystem === 'metric';
  const sizeModes = [
    ['tkw', 'By weight (g per 1,000 seeds)'],
    ['seedsPerLb', `By count (seeds per ${metric ? 'kg' : 'lb'})`],
  ] as const;
  return (
    <div className="grid gap-4 sm:grid-cols-2">
      <fieldset className="min-w-0 space-y-3 sm:col-span-2">
        <legend className="text-label text-ink">Seed size of the lot you will sow</legend>
        <div className="flex flex-wrap gap-x-6 gap-y-1">
          {sizeModes.map(([value, label]) => (
            <label key={value} className="flex min-h-11 items-center gap-2 text-label">
              <input
                type="radio"
                value={value}
                {...register('seedSize')}
                className="size-5 accent-[var(--sheaf-accent)]"
              />
              {label}
            </label>
          ))}
        </div>
        {seedSize === 'tkw' ? (
          <FormNumberField
            name="tkw"
            label="Thousand-kernel weight"
            hint="Weigh 10 lots of 100 seeds and add them up."
            suffix="g"
            placeholder={
              crop && crop !== 'custom'
                ? `about ${CROPS[crop].typicalThousandKernelWeightGrams}`
                : undefined
            }
          />
        ) : (
          <FormNumberField
            name="seedsPerLb"
            whole
            label={metric ? 'Seeds per kg' : 'Seeds per lb'}
            // 1,000 g ÷ 20 g = 50; 453.59 g ÷ 20 g = 22.68.
            hint={`From the seed tag, or count a 20 g sample and multiply by ${metric ? '50' : '22.68'}.`}
          />
        )}
      </fieldset>
      <FormNumberField
        name="germinationPct"
        label="Germination"
        hint="From the seed tag."
        suffix="%"
      />
      <FormNumberField
        name="emergencePct"
        label="Expected emergence"
        hint="Share of live seeds that become plants; 80–90 % in a good seedbed."
        suffix="%"
      />
      <FormNumberField name="seedPrice" label="Seed price" suffix={units.seedPrice.unit} />
      <FormNumberField name="grainPrice" label="Grain price" suffix={units.grainPrice.unit} />
    </div>
  );
}
