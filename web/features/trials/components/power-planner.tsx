// Replication planner: blocks per site and sites needed to detect a difference at a given CV.
import { FormProvider, useWatch } from 'react-hook-form';
import { z } from 'zod';
import { blocksNeeded, sitesNeeded } from '../../../../shared/analysis';
import { parseDecimal } from '../../../../shared/units/parse-decimal';
import { FormNumberField } from '../../../components/ui/form-controls';
import { numberText } from '../../../lib/forms/number-text';
import { useZodForm } from '../../../lib/forms/zod-form';

const percent = z.number().positive('Must be above 0').max(100, 'At most 100 %');
const PlannerSchema = z.object({
  cv: numberText(percent),
  difference: numberText(percent),
  siteByRate: numberText(z.number().min(0, 'At least 0').max(100, 'At most 100 %')),
});

const valueOf = (text: string) => {
  const read = parseDecimal(text);
  return read.ok && read.value !== null ? read.value : Number.NaN;
};

function tryNumber<T>(compute: () => T): T | string {
  try {
    return compute();
  } catch (error) {
    return error instanceof Error ? error.message : 'Cannot compute';
  }
}

export function PowerPlanner({
  rates,
  blocksPerSite,
}: {
  rates: number;
  blocksPerSite: number | null;
}) {
  const form = useZodForm(PlannerSchema, {
    defaultValues: { cv: '10', difference: '10', siteByRate: '5' },
    mode: 'onChange',
  });
  const [cv, difference, siteByRate] = useWatch({
    control: form.control,
    name: ['cv', 'difference', 'siteByRate'],
  });
  const cvValue = valueOf(cv);
  const differenceValue = valueOf(difference);
  const interaction = valueOf(siteByRate);
  const ready = cvValue > 0 && differenceValue > 0 && interaction >= 0 && rates >= 2;
  const blocks = ready
    ? tryNumber(() => blocksNeeded({ cvPercent: cvValue, difference: differenceValue, rates }))
    : null;
  const usedBlocks = blocksPerSite ?? 4;
  const sites = ready
    ? tryNumber(() =>
        sitesNeeded({
          cvPercent: cvValue,
          difference: differenceValue,
          rates,
          blocksPerSite: usedBlocks,
          siteByRateCvPercent: interaction,
        }),
      )
    : null;

  return (
    <section
      aria-labelledby="planner-title"
      className="rounded-card border border-line bg-surface p-5 shadow-card"
    >
      <h3 id="planner-title" className="text-heading text-ink">
        How many blocks and sites?
      </h3>
      <p className="mt-1 max-w-prose text-label font-normal text-ink-muted">
        With the strip-to-strip variation you expect (CV) and the smallest yield difference worth
        finding, this estimates the replication for a two-sided test at 5 % with 80 % power. Strip
        CVs of 5–15 % are usual; a past season’s site reports give your own.
      </p>
      {/* Inside the wizard's own form: a nested <form> is not allowed, so only the context. */}
      <FormProvider {...form}>
        <div className="mt-4 grid gap-4 sm:grid-cols-3">
          <FormNumberField name="cv" label="Expected CV" suffix="%" />
          <FormNumberField name="difference" label="Difference to detect" suffix="% of mean" />
          <FormNumberField
            name="siteByRate"
            label="Site × rate CV"
            hint="How much rate effects vary between farms"
            suffix="%"
          />
        </div>
      </FormProvider>
      <dl className="mt-5 grid gap-3 sm:grid-cols-2" aria-live="polite">
        <div className="rounded-field bg-sunken p-4">
          <dt className="text-caption font-semibold uppercase tracking-wide text-ink-muted">
            Blocks per site
          </dt>
          <dd className="figures mt-1 text-title text-ink" data-testid="blocks-needed">
            {blocks === null ? '—' : typeof blocks === 'string' ? 'More than 200' : blocks.blocks}
          </dd>
          <dd className="text-caption text-ink-muted">
            {typeof blocks === 'object' && blocks
              ? `to find ${difference} % at a single site${blocks.blocks > usedBlocks ? ` (this design has ${usedBlocks}: lean on the pooled analysis)` : ''}`
              : 'Fill in CV and difference'}
          </dd>
        </div>
        <div className="rounded-field bg-sunken p-4">
          <dt className="text-caption font-semibold uppercase tracking-wide text-ink-muted">
            Sites, with {usedBlocks} blocks each
          </dt>
          <dd className="figures mt-1 text-title text-ink" data-testid="sites-needed">
            {sites === null ? '—' : typeof sites === 'string' ? 'More than 500' : sites.sites}
          </dd>
          <dd className="text-caption text-ink-muted">
            to find {difference} % in the pooled analysis over farms
          </dd>
        </div>
      </dl>
      <p className="mt-3 text-caption text-ink-muted">
        Planning figures, not promises: the site × rate CV is a guess until a first season is
        pooled. Extension guides on strip trials suggest at least 4 blocks, and 4–6 farms when each
        has one replicate.
      </p>
    </section>
  );
}
