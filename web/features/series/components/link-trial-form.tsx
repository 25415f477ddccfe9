// Adds a trial of the series' crop to the series (coordinators), or takes one out.
import { z } from 'zod';
import type { SeriesDetail } from '../../../../shared/schemas/series';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { FormSelectField } from '../../../components/ui/form-controls';
import { errorSummary } from '../../../lib/form-errors';
import { applyServerErrors, Form, useZodForm } from '../../../lib/forms/zod-form';
import { useLinkTrial } from '../api/series';

const LinkFormSchema = z.object({ trialId: z.uuid('Choose a trial') });

const trialText = (trial: { name: string; season: string | null }) =>
  `${trial.name}${trial.season ? ` (${trial.season})` : ''}`;

export function LinkTrialForm({ series }: { series: SeriesDetail }) {
  const link = useLinkTrial();
  const form = useZodForm(LinkFormSchema, { defaultValues: { trialId: '' } });
  if (series.candidates.length === 0)
    return (
      <p className="text-label text-ink-muted">
        Every trial of this crop in the network is in the series already.
      </p>
    );
  return (
    <Form
      form={form}
      onSubmit={({ trialId }) =>
        link.mutate(
          { trialId, seriesId: series.id },
          {
            onSuccess: () => form.reset({ trialId: '' }),
            onError: (error) => applyServerErrors(form, error, { seriesId: 'trialId' }),
          },
        )
      }
      className="flex flex-col gap-3 sm:flex-row sm:items-end"
      aria-label="Add a trial to the series"
    >
      <FormSelectField name="trialId" label="Add a trial" containerClassName="sm:flex-1">
        <option value="">Choose a trial…</option>
        {series.candidates.map((trial) => (
          <option key={trial.id} value={trial.id}>
            {trialText(trial)}
          </option>
        ))}
      </FormSelectField>
      <Button type="submit" disabled={link.isPending}>
        {link.isPending ? 'Adding…' : 'Add to series'}
      </Button>
      {link.error && !form.formState.errors.trialId ? (
        <Alert tone="danger">{errorSummary(link.error)}</Alert>
      ) : null}
    </Form>
  );
}
