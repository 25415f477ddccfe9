// Starts a series: a name and the crop every linked trial must share.
import { CreateSeriesInputSchema } from '../../../../shared/schemas/series';
import { CROP_KEYS } from '../../../../shared/schemas/trial';
import { cropLabel } from '../../../../shared/labels/labels';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { FormSelectField, FormTextField } from '../../../components/ui/form-controls';
import { errorSummary } from '../../../lib/form-errors';
import { applyServerErrors, Form, useZodForm } from '../../../lib/forms/zod-form';
import { useCreateSeries } from '../api/series';

export function CreateSeriesForm({
  networkId,
  onCreated,
}: {
  networkId?: string;
  onCreated?: (seriesId: string) => void;
}) {
  const create = useCreateSeries();
  const form = useZodForm(CreateSeriesInputSchema, {
    defaultValues: { name: '', crop: 'hullessOats', ...(networkId ? { networkId } : {}) },
  });
  return (
    <Form
      form={form}
      onSubmit={(input) =>
        create.mutate(input, {
          onSuccess: (series) => {
            form.reset({ name: '', crop: input.crop, ...(networkId ? { networkId } : {}) });
            onCreated?.(series.id);
          },
          onError: (error) => applyServerErrors(form, error),
        })
      }
      className="space-y-4"
      aria-label="Start a series"
    >
      {create.error && !Object.keys(form.formState.errors).length ? (
        <Alert tone="danger">{errorSummary(create.error)}</Alert>
      ) : null}
      <FormTextField
        name="name"
        label="Series name"
        hint="For example “Hulless oat seeding rate, 2026 onwards”."
        required
      />
      <FormSelectField name="crop" label="Crop" hint="Every trial in the series grows this crop.">
        {CROP_KEYS.filter((crop) => crop !== 'custom').map((crop) => (
          <option key={crop} value={crop}>
            {cropLabel(crop)}
          </option>
        ))}
      </FormSelectField>
      <Button type="submit" disabled={create.isPending}>
        {create.isPending ? 'Starting…' : 'Start the series'}
      </Button>
    </Form>
  );
}
