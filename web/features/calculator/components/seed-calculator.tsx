// The seed calculator: type a rate (or a target stand) and a seed lot; every other unit, grams per
// row and strip and seeds per wheel turn update as you type.
import { useMemo, useState } from 'react';
import { CALC_UNITS, SeedingCalcInputSchema, type CalcUnit } from '../../../../shared/schemas/calc';
import { calculateSeeding } from '../../../../shared/design/seeding-calc';
import { SelectField } from '../../../components/ui/form-fields';
import { TextField } from '../../../components/ui/text-field';
import { cn } from '../../../lib/cn';
import { numberFieldErrors, parseNumberInput } from '../lib/number-input';
import { fieldBinder } from '../../../lib/bind-field';

const UNIT_NAMES: Record<CalcUnit, string> = {
  'lb/acre': 'lb per acre',
  'kg/ha': 'kg per hectare',
  'seeds/ft2': 'seeds per ft²',
  'seeds/m2': 'seeds per m²',
  'seeds/ft-row': 'seeds per foot of row',
  'plants/ft2': 'target plants per ft²',
  'plants/m2': 'target plants per m²',
  'plants/acre': 'target plants per acre',
};

const fmt = (digits: number) => new Intl.NumberFormat('en', { maximumFractionDigits: digits });
const f1 = fmt(1);
const f0 = fmt(0);

// Commas are read as thousands separators here: "12,000" is 12000.
const num = (value: string) => parseNumberInput(value.replace(/,/g, ''));

export function SeedCalculator() {
  const [v, setV] = useState({
    value: '96',
    unit: 'lb/acre' as CalcUnit,
    sizeMode: 'tkw' as 'tkw' | 'seedsPerLb',
    tkw: '32',
    seedsPerLb: '',
    germinationPct: '95',
    emergencePct: '85',
    rowSpacingIn: '8',
    rowsPerStrip: '6',
    stripLengthFt: '100',
    wheelCircumferenceFt: '3',
  });
  const set = (patch: Partial<typeof v>) => setV((s) => ({ ...s, ...patch }));

  const { result, errors } = useMemo(() => {
    const candidate = {
      value: num(v.value),
      unit: v.unit,
      thousandKernelWeightG: v.sizeMode === 'tkw' ? num(v.tkw) : undefined,
      seedsPerLb: v.sizeMode === 'seedsPerLb' ? num(v.seedsPerLb) : undefined,
      germinationPct: num(v.germinationPct),
      emergencePct: num(v.emergencePct),
      rowSpacingIn: num(v.rowSpacingIn),
      rowsPerStrip: num(v.rowsPerStrip),
      stripLengthFt: num(v.stripLengthFt),
      wheelCircumferenceFt: num(v.wheelCircumferenceFt),
    };
    const parsed = SeedingCalcInputSchema.safeParse(candidate);
    if (!parsed.success) return { result: null, errors: numberFieldErrors(parsed.error) };
    try {
      return { result: calculateSeeding(parsed.data), errors: {} as Record<string, string> };
    } catch (error) {
      return {
        result: null,
        errors: { form: error instanceof Error ? error.message : 'Cannot compute' },
      };
    }
  }, [v]);
  const field = fieldBinder(v, set, errors);

  const plantMode = v.unit.startsWith('plants');
  const sizeError = errors.thousandKernelWeightG ?? errors.seedsPerLb;

  return (
    <div className="grid grid-cols-1 gap-6 lg:grid-cols-[minmax(0,1fr)_minmax(0,1fr)]">
      <form
        className="space-y-5"
        onSubmit={(e) => e.preventDefault()}
        aria-label="Seed calculator inputs"
      >
        <fieldset className="grid grid-cols-[1fr_1.3fr] gap-3">
          <legend className="mb-1.5 text-label text-ink">Rate</legend>
          <TextField label="Amount" inputMode="decimal" {...field('value')} />
          <SelectField
            label="Unit"
            value={v.unit}
            onChange={(e) => set({ unit: e.target.value as CalcUnit })}
          >
            {CALC_UNITS.map((u) => (
              <option key={u} value={u}>
                {UNIT_NAMES[u]}
              </option>
            ))}
          </SelectField>
        </fieldset>
        <fieldset className="space-y-3">
          <legend className="mb-1.5 text-label text-ink">Seed lot</legend>
          <div className="flex flex-wrap gap-4">
            {(
              [
                ['tkw', 'By weight (g per 1,000 seeds)'],
                ['seedsPerLb', 'By count (seeds per lb)'],
              ] as const
            ).map(([mode, label]) => (
              <label key={mode} className="flex min-h-11 items-center gap-2 text-label">
                <input
                  type="radio"
                  name="calc-size"
                  checked={v.sizeMode === mode}
                  onChange={() => set({ sizeMode: mode })}
                  className="size-5 accent-[var(--sheaf-accent)]"
                />
                {label}
              </label>
            ))}
          </div>
          {v.sizeMode === 'tkw' ? (
            <TextField
              label="Thousand-kernel weight"
              suffix="g"
              inputMode="decimal"
              value={v.tkw}
              onChange={(e) => set({ tkw: e.target.value })}
              error={sizeError}
            />
          ) : (
            <TextField
              label="Seeds per lb"
              inputMode="numeric"
              value={v.seedsPerLb}
              onChange={(e) => set({ seedsPerLb: e.target.value })}
              error={sizeError}
            />
          )}
          <div className="grid grid-cols-2 gap-3">
            <TextField
              label="Germination"
              suffix="%"
              inputMode="decimal"
              {...field('germinationPct')}
            />
            <TextField
              label="Expected emergence"
              suffix="%"
              inputMode="decimal"
              {...field('emergencePct')}
            />
          </div>
        </fieldset>
        <fieldset className="grid grid-cols-2 gap-3">
          <legend className="mb-1.5 text-label text-ink">Rows, strip and seeder</legend>
          <TextField
            label="Row spacing"
            suffix="in"
            inputMode="decimal"
            {...field('rowSpacingIn')}
          />
          <TextField label="Rows per strip" inputMode="numeric" {...field('rowsPerStrip')} />
          <TextField
            label="Strip length"
            suffix="ft"
            inputMode="decimal"
            {...field('stripLengthFt')}
          />
          <TextField
            label="Wheel circumference"
            suffix="ft"
            inputMode="decimal"
            {...field('wheelCircumferenceFt')}
          />
        </fieldset>
      </form>

      <section aria-labelledby="calc-results" aria-live="polite" className="space-y-4">
        <h2 id="calc-results" className="text-heading text-ink">
          Results
        </h2>
        {result ? (
          <>
            <dl className="grid grid-cols-2 gap-3" data-testid="calc-results">
              {(
                [
                  [
                    'Seeds per foot of row',
                    f1.format(result.seedsPerFootOfRow),
                    v.unit === 'seeds/ft-row',
                  ],
                  ['Seeds per ft²', f1.format(result.seedsPerSquareFoot), v.unit === 'seeds/ft2'],
                  ['Seeds per m²', f0.format(result.seedsPerSquareMetre), v.unit === 'seeds/m2'],
                  ['lb per acre', f1.format(result.poundsPerAcre), v.unit === 'lb/acre'],
                  ['kg per hectare', f1.format(result.kilogramsPerHectare), v.unit === 'kg/ha'],
                  ['Seeds per acre', f0.format(result.seedsPerAcre), false],
                ] as const
              ).map(([label, value, given]) => (
                <div
                  key={label}
                  className={cn(
                    'rounded-field border p-3',
                    given ? 'border-accent bg-accent-soft' : 'border-line bg-surface',
                  )}
                >
                  <dt className="text-caption text-ink-muted">{label}</dt>
                  <dd className="figures text-heading text-ink">{value}</dd>
                </div>
              ))}
            </dl>
            <dl className="grid gap-2 rounded-card border border-line bg-surface p-4 text-label sm:grid-cols-2">
              <div>
                <dt className="text-ink-muted">Per row of the strip</dt>
                <dd className="figures font-semibold">
                  {result.perRow
                    ? `${f1.format(result.perRow.grams)} g · ${f0.format(result.perRow.seeds)} seeds`
                    : '—'}
                </dd>
              </div>
              <div>
                <dt className="text-ink-muted">Per strip</dt>
                <dd className="figures font-semibold">
                  {result.perStrip
                    ? `${f1.format(result.perStrip.grams)} g · ${f0.format(result.perStrip.seeds)} seeds`
                    : '—'}
                </dd>
              </div>
              <div>
                <dt className="text-ink-muted">Seeds per wheel turn</dt>
                <dd className="figures font-semibold">
                  {result.seedsPerWheelTurn === null ? '—' : f1.format(result.seedsPerWheelTurn)}
                </dd>
              </div>
              <div>
                <dt className="text-ink-muted">Expected plants</dt>
                <dd className="figures font-semibold">
                  {f1.format(result.expectedPlantsPerSquareFoot)} /ft² ·{' '}
                  {f0.format(result.expectedPlantsPerSquareMetre)} /m²
                </dd>
              </div>
              <div>
                <dt className="text-ink-muted">Seed size</dt>
                <dd className="figures font-semibold">
                  {f1.format(result.thousandKernelWeightG)} g/1,000 · {f0.format(result.seedsPerLb)}{' '}
                  seeds/lb
                </dd>
              </div>
            </dl>
            <p className="text-caption text-ink-muted">
              {plantMode
                ? 'From a target stand, seeds to sow = plants ÷ (germination × emergence). '
                : 'A rate is taken as seeds sown; expected plants = seeds × germination × emergence. '}
              Stand loss grows with the rate, so count the stand rather than trust the estimate.
            </p>
          </>
        ) : (
          <p className="rounded-field border border-dashed border-line-strong bg-sunken p-4 text-ink-muted">
            {errors.form ?? 'Fill in the highlighted fields to see the results.'}
          </p>
        )}
      </section>
    </div>
  );
}
