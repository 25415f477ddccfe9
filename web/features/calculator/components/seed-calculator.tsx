// The seed calculator: type a rate (or a target stand) and a seed lot; every other unit, grams per
// row and strip and seeds per wheel turn update as you type, in the units the reader chose.
import { useMemo } from 'react';
import { useWatch } from 'react-hook-form';
import { calculateSeeding } from '../../../../shared/design/seeding-calc';
import { rateUnitLabel } from '../../../../shared/labels/labels';
import type { UnitSystem } from '../../../../shared/schemas/trial';
import { designUnits } from '../../../../shared/units/design-units';
import { FormNumberField, FormSelectField } from '../../../components/ui/form-controls';
import { SelectField } from '../../../components/ui/form-fields';
import { Form, useZodForm } from '../../../lib/forms/zod-form';
import { useUnitPreference } from '../../../lib/unit-preference';
import {
  calcUnitsFor,
  seedCalcDefaults,
  seedCalcFormSchema,
  type SeedCalcFormValues,
} from '../lib/calculator-forms';
import { SeedCalculatorResults } from './seed-calculator-results';

/** The result for the boxes as they stand, or null while one of them is not ready. */
function useSeedingResult(values: SeedCalcFormValues, system: UnitSystem) {
  return useMemo(() => {
    const parsed = seedCalcFormSchema(system).safeParse(values);
    if (!parsed.success) return { result: null, problem: null };
    try {
      return { result: calculateSeeding(parsed.data), problem: null };
    } catch (error) {
      return { result: null, problem: error instanceof Error ? error.message : 'Cannot compute' };
    }
  }, [values, system]);
}

/** The calculator in the reader's units (remembered in this browser); the boxes start again on a change. */
export function SeedCalculator() {
  const [system, setSystem] = useUnitPreference();
  return <SeedCalculatorForm key={system} system={system} onSystem={setSystem} />;
}

function SeedCalculatorForm({
  system,
  onSystem,
}: {
  system: UnitSystem;
  onSystem: (system: UnitSystem) => void;
}) {
  // Errors show as soon as a box is changed; untouched boxes stay quiet.
  const form = useZodForm(seedCalcFormSchema(system), {
    defaultValues: seedCalcDefaults(system),
    mode: 'onChange',
  });
  const values = useWatch({ control: form.control }) as SeedCalcFormValues;
  const { result, problem } = useSeedingResult(values, system);
  const units = designUnits(system);
  const weight = system === 'metric' ? 'kg' : 'lb';
  const sizeModes = [
    ['tkw', 'By weight (g per 1,000 seeds)'],
    ['seedsPerLb', `By count (seeds per ${weight})`],
  ] as const;

  return (
    <div className="grid grid-cols-1 gap-6 lg:grid-cols-[minmax(0,1fr)_minmax(0,1fr)]">
      <Form
        form={form}
        onSubmit={() => undefined}
        className="min-w-0 space-y-5"
        aria-label="Seed calculator inputs"
      >
        <SelectField
          label="Measure in"
          value={system}
          onChange={(e) => onSystem(e.target.value as UnitSystem)}
        >
          <option value="imperial">Imperial: lb/acre, feet, inches</option>
          <option value="metric">Metric: kg/ha, metres, centimetres</option>
        </SelectField>
        <fieldset className="grid min-w-0 grid-cols-[1fr_1.3fr] gap-3">
          <legend className="mb-1.5 text-label text-ink">Rate</legend>
          <FormNumberField name="value" label="Amount" />
          <FormSelectField name="unit" label="Unit">
            {calcUnitsFor(system).map((u) => (
              <option key={u} value={u}>
                {rateUnitLabel(u)}
              </option>
            ))}
          </FormSelectField>
        </fieldset>
        <fieldset className="min-w-0 space-y-3">
          <legend className="mb-1.5 text-label text-ink">Seed lot</legend>
          <div className="flex flex-wrap gap-x-6 gap-y-1">
            {sizeModes.map(([mode, label]) => (
              <label key={mode} className="flex min-h-11 items-center gap-2 text-label">
                <input
                  type="radio"
                  value={mode}
                  {...form.register('sizeMode', { onChange: () => form.trigger() })}
                  className="size-5 accent-[var(--sheaf-accent)]"
                />
                {label}
              </label>
            ))}
          </div>
          {values.sizeMode === 'tkw' ? (
            <FormNumberField
              name="thousandKernelWeightG"
              label="Thousand-kernel weight"
              suffix="g"
            />
          ) : (
            <FormNumberField name="seedsPerLb" whole label={`Seeds per ${weight}`} />
          )}
          <div className="grid grid-cols-2 gap-3">
            <FormNumberField name="germinationPct" label="Germination" suffix="%" />
            <FormNumberField name="emergencePct" label="Expected emergence" suffix="%" />
          </div>
        </fieldset>
        <fieldset className="grid min-w-0 grid-cols-2 gap-3">
          <legend className="mb-1.5 text-label text-ink">Rows, strip and seeder</legend>
          <FormNumberField name="rowSpacingIn" label="Row spacing" suffix={units.rowSpacing.unit} />
          <FormNumberField name="rowsPerStrip" whole label="Rows per strip" />
          <FormNumberField
            name="stripLengthFt"
            label="Strip length"
            suffix={units.stripLength.unit}
          />
          <FormNumberField
            name="wheelCircumferenceFt"
            label="Wheel circumference"
            suffix={units.stripLength.unit}
          />
        </fieldset>
      </Form>
      <SeedCalculatorResults result={result} unit={values.unit} system={system} problem={problem} />
    </div>
  );
}
