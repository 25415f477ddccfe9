// The trial design wizard: crop, rates, strips, seed lot, then a summary with seed amounts and
// the replication planner. Every step saves the draft; "Send to the field" activates the trial.
import { useMemo, useState, type FormEvent } from 'react';
import { useNavigate } from 'react-router-dom';
import type { z } from 'zod';
import type { SessionUser } from '../../../../shared/schemas/auth';
import {
  CROP_KEYS,
  DEFAULT_RATE_LEVELS,
  RATE_UNITS,
  TrialDesignSchema,
  type CropKey,
  type RateUnit,
  type TrialDetail,
  type UpdateTrialInput,
} from '../../../../shared/schemas/trial';
import { rateTable } from '../../../../shared/design/rate-table';
import { CROPS } from '../../../../shared/units/crops';
import { GRAMS_PER_POUND } from '../../../../shared/units/constants';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { TextField } from '../../../components/ui/text-field';
import { apiFieldErrors, errorSummary } from '../../../lib/form-errors';
import { isApiError } from '../../../lib/api-client';
import { AmendDesignDialog } from './amend-design-dialog';
import { cn } from '../../../lib/cn';
import { useCreateTrial, useUpdateTrial } from '../api/trial-mutations';
import { SelectField, TextAreaField } from '../../../components/ui/form-fields';
import { PowerPlanner } from './power-planner';
import { RateSummaryTable } from './rate-summary-table';

export const UNIT_LABELS: Record<RateUnit, string> = {
  'lb/acre': 'lb per acre',
  'kg/ha': 'kg per hectare',
  'seeds/ft2': 'seeds per ft²',
  'seeds/m2': 'seeds per m²',
  'seeds/ft-row': 'seeds per foot of row',
};

export const CROP_LABELS: Record<CropKey, string> = {
  wheat: 'Winter wheat',
  springWheat: 'Spring wheat',
  oats: 'Oats',
  hullessOats: 'Hulless oats',
  barley: 'Barley',
  rye: 'Rye',
  custom: 'Another crop (enter its values)',
};

const STEPS = [
  'Crop and season',
  'Rates',
  'Strips and blocks',
  'Seed lot and prices',
  'Summary',
] as const;

const NUMBER_FIELDS = [
  'referenceRate',
  'blocksPerSite',
  'rowsPerStrip',
  'rowSpacingIn',
  'stripLengthFt',
  'borderRows',
  'germinationPct',
  'emergencePct',
  'seedPricePerLb',
  'grainPricePerBu',
] as const;
type NumberField = (typeof NUMBER_FIELDS)[number];

const STEP_FIELDS: (keyof z.infer<typeof TrialDesignSchema>)[][] = [
  ['name', 'question', 'crop', 'customCrop', 'season'],
  ['referenceRate', 'referenceUnit', 'rateLevels'],
  ['blocksPerSite', 'rowsPerStrip', 'rowSpacingIn', 'stripLengthFt', 'borderRows'],
  ['thousandKernelWeightG', 'germinationPct', 'emergencePct', 'seedPricePerLb', 'grainPricePerBu'],
];

interface FormState {
  name: string;
  question: string;
  crop: CropKey | '';
  season: string;
  customName: string;
  customTkw: string;
  customBushel: string;
  customMoisture: string;
  referenceUnit: RateUnit;
  levels: { multiplier: string; label: string }[];
  seedSize: 'tkw' | 'seedsPerLb';
  tkw: string;
  seedsPerLb: string;
  numbers: Record<NumberField, string>;
}

const text = (value: number | null | undefined) =>
  value === null || value === undefined ? '' : String(value);

function initialState(trial: TrialDetail | undefined): FormState {
  const numbers = Object.fromEntries(
    NUMBER_FIELDS.map((f) => [f, text(trial?.[f] as number | undefined)]),
  ) as Record<NumberField, string>;
  if (!trial)
    Object.assign(numbers, {
      blocksPerSite: '4',
      rowSpacingIn: '8',
      borderRows: '1',
      germinationPct: '',
      emergencePct: '85',
    });
  return {
    name: trial?.name ?? '',
    question: trial?.question ?? '',
    crop: trial?.crop ?? '',
    season: trial?.season ?? String(new Date().getFullYear() + 1),
    customName: trial?.customCrop?.name ?? '',
    customTkw: text(trial?.customCrop?.thousandKernelWeightG),
    customBushel: text(trial?.customCrop?.bushelWeightLb),
    customMoisture: text(trial?.customCrop?.standardMoisturePct),
    referenceUnit: trial?.referenceUnit ?? 'lb/acre',
    levels: (trial?.rateLevels.length ? trial.rateLevels : DEFAULT_RATE_LEVELS).map((l) => ({
      multiplier: String(l.multiplier),
      label: l.label,
    })),
    seedSize: 'tkw',
    tkw: text(trial?.thousandKernelWeightG),
    seedsPerLb: trial?.thousandKernelWeightG
      ? String(Math.round((1000 * GRAMS_PER_POUND) / trial.thousandKernelWeightG))
      : '',
    numbers,
  };
}

function toNumber(value: string): number | undefined {
  const trimmed = value.trim().replace(/,/g, '');
  if (trimmed === '') return undefined;
  const n = Number(trimmed);
  return Number.isFinite(n) ? n : Number.NaN;
}

/** The design as typed so far: empty fields left out, so a draft saves what exists. */
function toPayload(form: FormState): UpdateTrialInput {
  const payload: Record<string, unknown> = {
    name: form.name,
    question: form.question,
    season: form.season || undefined,
    crop: form.crop || undefined,
    referenceUnit: form.referenceUnit,
    rateLevels: form.levels.map((l) => ({
      multiplier: toNumber(l.multiplier) ?? Number.NaN,
      label: l.label,
    })),
  };
  if (form.crop === 'custom') {
    payload.customCrop = {
      name: form.customName,
      thousandKernelWeightG: toNumber(form.customTkw),
      bushelWeightLb: toNumber(form.customBushel),
      standardMoisturePct: toNumber(form.customMoisture),
    };
  }
  for (const field of NUMBER_FIELDS) payload[field] = toNumber(form.numbers[field]);
  const perLb = toNumber(form.seedsPerLb);
  payload.thousandKernelWeightG =
    form.seedSize === 'tkw'
      ? toNumber(form.tkw)
      : perLb === undefined
        ? undefined
        : perLb > 0
          ? Math.round(((1000 * GRAMS_PER_POUND) / perLb) * 100) / 100
          : Number.NaN;
  return Object.fromEntries(
    Object.entries(payload).filter(([, v]) => v !== undefined),
  ) as UpdateTrialInput;
}

function issuesToFields(error: z.ZodError): Record<string, string> {
  const fields: Record<string, string> = {};
  for (const issue of error.issues) {
    const key = issue.path.length ? issue.path.map(String).join('.') : 'form';
    const message =
      issue.code === 'invalid_type'
        ? issue.input === undefined
          ? 'Fill this in'
          : 'Enter a number'
        : issue.message;
    fields[key] ??= message;
  }
  return fields;
}

export function TrialWizard({
  trial,
  user,
  initialStep = 0,
}: {
  trial?: TrialDetail;
  user: SessionUser;
  initialStep?: number;
}) {
  const navigate = useNavigate();
  const [form, setForm] = useState<FormState>(() => initialState(trial));
  const [step, setStep] = useState(Math.min(Math.max(initialStep, 0), STEPS.length - 1));
  const [errors, setErrors] = useState<Record<string, string>>({});
  const [saved, setSaved] = useState<string | null>(null);
  const coordinating = user.memberships.filter(
    (m) => m.role === 'coordinator' || m.role === 'admin',
  );
  const [networkId, setNetworkId] = useState(trial?.networkId ?? coordinating[0]?.networkId ?? '');
  const create = useCreateTrial();
  const update = useUpdateTrial(trial?.id ?? '');
  const busy = create.isPending || update.isPending;
  const locked = trial?.designLocked ?? false;
  const payload = useMemo(() => toPayload(form), [form]);
  const table = useMemo(() => {
    try {
      return rateTable({
        ...payload,
        rateLevels: (payload.rateLevels ?? []).filter((l) => l.multiplier > 0),
      });
    } catch {
      return [];
    }
  }, [payload]);

  const set = (patch: Partial<FormState>) => setForm((f) => ({ ...f, ...patch }));
  const setNumber = (field: NumberField, value: string) =>
    setForm((f) => ({ ...f, numbers: { ...f.numbers, [field]: value } }));
  const err = (key: string) => errors[key];

  function chooseCrop(crop: CropKey | '') {
    const patch: Partial<FormState> = { crop };
    if (crop && crop !== 'custom' && !form.numbers.referenceRate) {
      patch.numbers = {
        ...form.numbers,
        referenceRate: String(CROPS[crop].typicalReferenceRatePoundsPerAcre),
      };
      patch.referenceUnit = 'lb/acre';
    }
    set(patch);
  }

  function validateStep(index: number): Record<string, string> {
    const keys = STEP_FIELDS[index];
    if (!keys) return {};
    const mask = Object.fromEntries(keys.map((k) => [k, true])) as Record<string, true>;
    const schema = TrialDesignSchema.pick(mask as never);
    const candidate = Object.fromEntries(
      keys.map((k) => [k, (payload as Record<string, unknown>)[k]]),
    );
    if (index === 0 && form.crop !== 'custom') delete candidate.customCrop;
    const result = (schema as unknown as z.ZodType).safeParse(candidate);
    const fields = result.success ? {} : issuesToFields(result.error);
    if (index === 0 && form.crop === 'custom' && !payload.customCrop)
      fields.customCrop = 'Enter the crop’s values';
    return fields;
  }

  const [amend, setAmend] = useState<{ extra: UpdateTrialInput; fields: string[] } | null>(null);

  async function save(extra: UpdateTrialInput = {}): Promise<TrialDetail | null> {
    setSaved(null);
    try {
      let result: TrialDetail;
      const body = { ...payload, ...extra };
      if (locked) {
        delete body.rateLevels;
        delete body.blocksPerSite;
      }
      if (!trial) {
        result = await create.mutateAsync({
          ...(body as object),
          networkId,
          name: form.name,
        } as never);
        navigate(`/trials/${result.id}/edit?step=${step + 1}`, { replace: true });
      } else {
        result = await update.mutateAsync(body);
      }
      setSaved(result.status === 'draft' ? 'Draft saved' : 'Changes saved');
      return result;
    } catch (error) {
      if (isApiError(error) && error.code === 'design_locked' && !extra.amendReason) {
        // Sown already: ask for a reason and resend the same change as an amendment.
        setAmend({ extra, fields: Object.keys(error.fields) });
        return null;
      }
      setErrors(apiFieldErrors(error));
      setSaved(null);
      return null;
    }
  }

  async function amendWith(reason: string) {
    if (!amend) return;
    const result = await save({ ...amend.extra, amendReason: reason });
    if (result) {
      setAmend(null);
      navigate(`/trials/${result.id}`);
    }
  }

  async function next(event: FormEvent) {
    event.preventDefault();
    const fields = validateStep(step);
    setErrors(fields);
    if (Object.keys(fields).length > 0) return;
    const result = await save();
    if (result) setStep((s) => Math.min(s + 1, STEPS.length - 1));
  }

  async function finish() {
    const all: Record<string, string> = {};
    for (let i = 0; i < STEP_FIELDS.length; i += 1) Object.assign(all, validateStep(i));
    setErrors(all);
    if (Object.keys(all).length > 0) return;
    const result = await save(trial?.status === 'draft' || !trial ? { status: 'in-field' } : {});
    if (result) navigate(`/trials/${result.id}`);
  }

  const mutationError = create.error ?? update.error;
  const stepErrors = Object.keys(errors).length > 0;

  return (
    <div className="grid grid-cols-1 gap-6 lg:grid-cols-[14rem_minmax(0,1fr)]">
      {amend ? (
        <AmendDesignDialog
          fields={amend.fields}
          busy={update.isPending}
          error={errors.amendReason}
          onAmend={(reason) => void amendWith(reason)}
          onCancel={() => setAmend(null)}
        />
      ) : null}
      <nav aria-label="Wizard steps" className="no-print min-w-0">
        <ol className="flex gap-2 overflow-x-auto pb-1 lg:flex-col lg:overflow-visible">
          {STEPS.map((name, index) => (
            <li key={name} className="shrink-0">
              <button
                type="button"
                onClick={() => (trial || index <= step ? setStep(index) : undefined)}
                aria-current={index === step ? 'step' : undefined}
                className={cn(
                  'flex min-h-11 w-full items-center gap-2 rounded-field px-3 text-left text-label',
                  index === step ? 'bg-accent text-on-accent' : 'text-ink hover:bg-sunken',
                )}
              >
                <span
                  aria-hidden="true"
                  className={cn(
                    'figures flex size-6 items-center justify-center rounded-full border text-caption font-bold',
                    index === step ? 'border-on-accent' : 'border-line-strong',
                  )}
                >
                  {index + 1}
                </span>
                {name}
              </button>
            </li>
          ))}
        </ol>
      </nav>

      <form onSubmit={next} noValidate className="min-w-0 space-y-6">
        <h2 className="text-heading text-ink">
          Step {step + 1} of {STEPS.length}: {STEPS[step]}
        </h2>
        {stepErrors && (errors.form || mutationError) ? (
          <Alert tone="danger" title="Some fields need another look">
            {errors.form ?? errorSummary(mutationError)}
          </Alert>
        ) : mutationError ? (
          <Alert tone="danger" title="Not saved">
            {errorSummary(mutationError)}
          </Alert>
        ) : null}

        {step === 0 ? (
          <div className="grid gap-4 sm:grid-cols-2">
            {!trial && coordinating.length > 1 ? (
              <SelectField
                label="Network"
                value={networkId}
                onChange={(e) => setNetworkId(e.target.value)}
                containerClassName="sm:col-span-2"
              >
                {coordinating.map((m) => (
                  <option key={m.networkId} value={m.networkId}>
                    {m.networkName}
                  </option>
                ))}
              </SelectField>
            ) : null}
            <TextField
              label="Trial name"
              required
              value={form.name}
              onChange={(e) => set({ name: e.target.value })}
              error={err('name')}
              containerClassName="sm:col-span-2"
              placeholder="e.g. Oat seeding rate 2027"
            />
            <TextAreaField
              label="The question"
              hint="What the network wants to know, in one sentence."
              value={form.question}
              onChange={(e) => set({ question: e.target.value })}
              error={err('question')}
              containerClassName="sm:col-span-2"
              placeholder="Does half the usual oat rate yield as well on our farms?"
            />
            <SelectField
              label="Crop"
              value={form.crop}
              onChange={(e) => chooseCrop(e.target.value as CropKey | '')}
              error={err('crop')}
            >
              <option value="">Choose a crop…</option>
              {CROP_KEYS.map((key) => (
                <option key={key} value={key}>
                  {CROP_LABELS[key]}
                </option>
              ))}
            </SelectField>
            <TextField
              label="Season"
              required
              value={form.season}
              onChange={(e) => set({ season: e.target.value })}
              error={err('season')}
              hint="e.g. 2027 or 2027–28"
            />
            {form.crop === 'custom' ? (
              <fieldset className="grid gap-4 rounded-field border border-line p-4 sm:col-span-2 sm:grid-cols-2">
                <legend className="px-1 text-label text-ink">Your crop’s values</legend>
                {err('customCrop') ? (
                  <p className="text-caption font-medium text-danger sm:col-span-2">
                    {err('customCrop')}
                  </p>
                ) : null}
                <TextField
                  label="Crop name"
                  value={form.customName}
                  onChange={(e) => set({ customName: e.target.value })}
                  error={err('customCrop.name')}
                />
                <TextField
                  label="Thousand-kernel weight"
                  suffix="g"
                  inputMode="decimal"
                  value={form.customTkw}
                  onChange={(e) => set({ customTkw: e.target.value })}
                  error={err('customCrop.thousandKernelWeightG')}
                />
                <TextField
                  label="Bushel weight"
                  suffix="lb"
                  inputMode="decimal"
                  value={form.customBushel}
                  onChange={(e) => set({ customBushel: e.target.value })}
                  error={err('customCrop.bushelWeightLb')}
                />
                <TextField
                  label="Standard moisture"
                  suffix="%"
                  inputMode="decimal"
                  value={form.customMoisture}
                  onChange={(e) => set({ customMoisture: e.target.value })}
                  error={err('customCrop.standardMoisturePct')}
                />
              </fieldset>
            ) : null}
          </div>
        ) : null}

        {step === 1 ? (
          <div className="space-y-5">
            {locked ? (
              <Alert tone="info" title="Rate levels are fixed">
                A site is already randomized with these levels, so they can no longer change.
              </Alert>
            ) : null}
            <div className="grid gap-4 sm:grid-cols-2">
              <TextField
                label="Reference (full) rate"
                hint={
                  form.crop && form.crop !== 'custom'
                    ? `A usual full rate for ${CROP_LABELS[form.crop].toLowerCase()} is about ${CROPS[form.crop].typicalReferenceRatePoundsPerAcre} lb/acre; use your local advice.`
                    : 'Your usual rate, as local advice recommends.'
                }
                inputMode="decimal"
                required
                value={form.numbers.referenceRate}
                onChange={(e) => setNumber('referenceRate', e.target.value)}
                error={err('referenceRate')}
              />
              <SelectField
                label="Unit"
                value={form.referenceUnit}
                onChange={(e) => set({ referenceUnit: e.target.value as RateUnit })}
                error={err('referenceUnit')}
              >
                {RATE_UNITS.map((u) => (
                  <option key={u} value={u}>
                    {UNIT_LABELS[u]}
                  </option>
                ))}
              </SelectField>
            </div>
            <fieldset disabled={locked} className="space-y-3">
              <legend className="text-label text-ink">
                Rate levels (multiples of the reference rate)
              </legend>
              <p className="text-caption text-ink-muted">
                Between 2 and 8 levels, each with its own multiplier and a short label growers will
                see on the map.
              </p>
              {err('rateLevels') ? (
                <p className="text-caption font-medium text-danger">{err('rateLevels')}</p>
              ) : null}
              <ul className="space-y-2">
                {form.levels.map((level, index) => (
                  <li key={index} className="grid grid-cols-[1fr_1.4fr_auto] items-end gap-2">
                    <TextField
                      label={`Level ${index + 1} multiplier`}
                      inputMode="decimal"
                      value={level.multiplier}
                      onChange={(e) =>
                        set({
                          levels: form.levels.map((l, i) =>
                            i === index ? { ...l, multiplier: e.target.value } : l,
                          ),
                        })
                      }
                      error={err(`rateLevels.${index}.multiplier`)}
                      suffix="×"
                    />
                    <TextField
                      label="Label"
                      value={level.label}
                      onChange={(e) =>
                        set({
                          levels: form.levels.map((l, i) =>
                            i === index ? { ...l, label: e.target.value } : l,
                          ),
                        })
                      }
                      error={err(`rateLevels.${index}.label`)}
                    />
                    <Button
                      variant="quiet"
                      aria-label={`Remove level ${index + 1}`}
                      disabled={form.levels.length <= 2}
                      onClick={() => set({ levels: form.levels.filter((_, i) => i !== index) })}
                    >
                      Remove
                    </Button>
                  </li>
                ))}
              </ul>
              <Button
                variant="secondary"
                disabled={form.levels.length >= 8}
                onClick={() => set({ levels: [...form.levels, { multiplier: '', label: '' }] })}
              >
                Add a level
              </Button>
            </fieldset>
          </div>
        ) : null}

        {step === 2 ? (
          <div className="grid gap-4 sm:grid-cols-2">
            <TextField
              label="Blocks per site"
              hint="Each block holds every rate once. 4 is a good start; 5–6 when small differences matter."
              inputMode="numeric"
              required
              disabled={locked}
              value={form.numbers.blocksPerSite}
              onChange={(e) => setNumber('blocksPerSite', e.target.value)}
              error={err('blocksPerSite')}
            />
            <TextField
              label="Rows per strip"
              inputMode="numeric"
              required
              value={form.numbers.rowsPerStrip}
              onChange={(e) => setNumber('rowsPerStrip', e.target.value)}
              error={err('rowsPerStrip')}
            />
            <TextField
              label="Row spacing"
              suffix="in"
              inputMode="decimal"
              required
              value={form.numbers.rowSpacingIn}
              onChange={(e) => setNumber('rowSpacingIn', e.target.value)}
              error={err('rowSpacingIn')}
            />
            <TextField
              label="Strip length"
              suffix="ft"
              inputMode="decimal"
              required
              value={form.numbers.stripLengthFt}
              onChange={(e) => setNumber('stripLengthFt', e.target.value)}
              error={err('stripLengthFt')}
            />
            <TextField
              label="Border rows"
              hint="Rows on each side of a strip that are sown but not counted or harvested."
              inputMode="numeric"
              value={form.numbers.borderRows}
              onChange={(e) => setNumber('borderRows', e.target.value)}
              error={err('borderRows')}
            />
            {toNumber(form.numbers.blocksPerSite) !== undefined &&
            (toNumber(form.numbers.blocksPerSite) as number) < 3 ? (
              <Alert tone="caution" title="Fewer than 3 blocks" className="sm:col-span-2">
                With 2 blocks a site has very few error degrees of freedom, so only large
                differences show. Use at least 3, better 4.
              </Alert>
            ) : null}
          </div>
        ) : null}

        {step === 3 ? (
          <div className="grid gap-4 sm:grid-cols-2">
            <fieldset className="space-y-3 sm:col-span-2">
              <legend className="text-label text-ink">Seed size of the lot you will sow</legend>
              <div className="flex flex-wrap gap-4">
                {(
                  [
                    ['tkw', 'By weight (g per 1,000 seeds)'],
                    ['seedsPerLb', 'By count (seeds per lb)'],
                  ] as const
                ).map(([value, label]) => (
                  <label key={value} className="flex min-h-11 items-center gap-2 text-label">
                    <input
                      type="radio"
                      name="seed-size"
                      value={value}
                      checked={form.seedSize === value}
                      onChange={() => set({ seedSize: value })}
                      className="size-5 accent-[var(--sheaf-accent)]"
                    />
                    {label}
                  </label>
                ))}
              </div>
              {form.seedSize === 'tkw' ? (
                <TextField
                  label="Thousand-kernel weight"
                  hint="Weigh 10 lots of 100 seeds and add them up."
                  suffix="g"
                  inputMode="decimal"
                  value={form.tkw}
                  onChange={(e) => set({ tkw: e.target.value })}
                  error={err('thousandKernelWeightG')}
                  placeholder={
                    form.crop && form.crop !== 'custom'
                      ? `about ${CROPS[form.crop].typicalThousandKernelWeightGrams}`
                      : undefined
                  }
                />
              ) : (
                <TextField
                  label="Seeds per lb"
                  hint="From the seed tag, or count a 20 g sample and multiply by 22.68."
                  inputMode="numeric"
                  value={form.seedsPerLb}
                  onChange={(e) => set({ seedsPerLb: e.target.value })}
                  error={err('thousandKernelWeightG')}
                />
              )}
            </fieldset>
            <TextField
              label="Germination"
              hint="From the seed tag."
              suffix="%"
              inputMode="decimal"
              value={form.numbers.germinationPct}
              onChange={(e) => setNumber('germinationPct', e.target.value)}
              error={err('germinationPct')}
            />
            <TextField
              label="Expected emergence"
              hint="Share of live seeds that become plants; 80–90 % in a good seedbed."
              suffix="%"
              inputMode="decimal"
              value={form.numbers.emergencePct}
              onChange={(e) => setNumber('emergencePct', e.target.value)}
              error={err('emergencePct')}
            />
            <TextField
              label="Seed price"
              suffix="$ / lb"
              inputMode="decimal"
              value={form.numbers.seedPricePerLb}
              onChange={(e) => setNumber('seedPricePerLb', e.target.value)}
              error={err('seedPricePerLb')}
            />
            <TextField
              label="Grain price"
              suffix="$ / bu"
              inputMode="decimal"
              value={form.numbers.grainPricePerBu}
              onChange={(e) => setNumber('grainPricePerBu', e.target.value)}
              error={err('grainPricePerBu')}
            />
          </div>
        ) : null}

        {step === 4 ? (
          <div className="space-y-6">
            <DesignSummary payload={payload} />
            {table.length > 0 ? (
              <div className="space-y-2">
                <h3 className="text-heading text-ink">Seed for every rate</h3>
                <p className="text-caption text-ink-muted">
                  Grams are for one strip of {form.numbers.rowsPerStrip} rows ×{' '}
                  {form.numbers.stripLengthFt} ft.
                </p>
                <RateSummaryTable rows={table} caption="Seed amounts per rate level" />
              </div>
            ) : (
              <Alert tone="caution" title="Seed amounts need the full design">
                Fill in the reference rate, strips and seed lot to see seeds per foot of row,
                seeds/ft², lb/acre, kg/ha and grams per strip.
              </Alert>
            )}
            <PowerPlanner
              rates={form.levels.length}
              blocksPerSite={toNumber(form.numbers.blocksPerSite) ?? null}
            />
            {Object.keys(errors).length > 0 ? (
              <Alert tone="danger" title="Not ready for the field yet">
                <ul className="list-disc pl-5">
                  {Object.entries(errors).map(([k, v]) => (
                    <li key={k}>
                      {k}: {v}
                    </li>
                  ))}
                </ul>
              </Alert>
            ) : null}
          </div>
        ) : null}

        <div className="no-print flex flex-wrap items-center gap-3 border-t border-line pt-5">
          {step > 0 ? (
            <Button variant="secondary" onClick={() => setStep((s) => s - 1)}>
              Back
            </Button>
          ) : null}
          {step < STEPS.length - 1 ? (
            <Button type="submit" busy={busy} disabled={!networkId}>
              Save and continue
            </Button>
          ) : (
            <Button onClick={finish} busy={busy}>
              {trial && trial.status !== 'draft' ? 'Save the design' : 'Send to the field'}
            </Button>
          )}
          {step === STEPS.length - 1 || trial ? (
            <Button
              variant="quiet"
              onClick={() => void save()}
              busy={busy}
              disabled={!networkId || !form.name.trim()}
            >
              Save draft
            </Button>
          ) : null}
          <span role="status" className="text-label text-accent">
            {saved}
          </span>
        </div>
      </form>
    </div>
  );
}

function DesignSummary({ payload }: { payload: UpdateTrialInput }) {
  const rows: [string, string][] = [
    [
      'Crop',
      payload.crop
        ? payload.crop === 'custom'
          ? (payload.customCrop?.name ?? 'Custom')
          : CROP_LABELS[payload.crop]
        : '—',
    ],
    ['Season', payload.season ?? '—'],
    [
      'Reference rate',
      payload.referenceRate
        ? `${payload.referenceRate} ${UNIT_LABELS[payload.referenceUnit ?? 'lb/acre']}`
        : '—',
    ],
    [
      'Rate levels',
      (payload.rateLevels ?? []).map((l) => `${l.label} ×${l.multiplier}`).join(', ') || '—',
    ],
    ['Blocks per site', payload.blocksPerSite !== undefined ? String(payload.blocksPerSite) : '—'],
    [
      'Strips',
      payload.rowsPerStrip && payload.stripLengthFt
        ? `${payload.rowsPerStrip} rows at ${payload.rowSpacingIn ?? '?'} in × ${payload.stripLengthFt} ft, ${payload.borderRows ?? 0} border row${payload.borderRows === 1 ? '' : 's'}`
        : '—',
    ],
    [
      'Seed lot',
      payload.thousandKernelWeightG
        ? `${payload.thousandKernelWeightG} g per 1,000 seeds, ${payload.germinationPct ?? '?'} % germination, ${payload.emergencePct ?? '?'} % expected emergence`
        : '—',
    ],
    [
      'Prices',
      `seed $${payload.seedPricePerLb ?? 0}/lb, grain $${payload.grainPricePerBu ?? 0}/bu`,
    ],
  ];
  return (
    <dl className="grid gap-x-6 gap-y-3 rounded-card border border-line bg-surface p-5 shadow-card sm:grid-cols-[12rem_1fr]">
      {rows.map(([k, v]) => (
        <div key={k} className="contents">
          <dt className="text-label text-ink-muted">{k}</dt>
          <dd className="text-body text-ink">{v}</dd>
        </div>
      ))}
    </dl>
  );
}
