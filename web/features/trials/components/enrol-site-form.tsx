// Enrol a site: pick a network member as grower or type an e-mail address to invite.
import { useState } from 'react';
import { useWatch } from 'react-hook-form';
import { z } from 'zod';
import { CreateSiteInputSchema } from '../../../../shared/schemas/site';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import {
  FormSelectField,
  FormTextAreaField,
  FormTextField,
} from '../../../components/ui/form-controls';
import { errorSummary } from '../../../lib/form-errors';
import { applyServerErrors, Form, useZodForm } from '../../../lib/forms/zod-form';
import { useTrialPeople } from '../api/get-trial';
import { useEnrolSite } from '../api/trial-mutations';

const site = CreateSiteInputSchema.shape;

/** The boxes as typed; the grower is a chosen person or an e-mail, by the mode radio. */
const EnrolSiteFormSchema = z
  .object({
    mode: z.enum(['member', 'invite']),
    growerUserId: z.string(),
    growerEmail: z.string(),
    fieldName: site.fieldName,
    soil: site.soil,
    previousCrop: site.previousCrop,
    fertility: site.fertility,
    notes: site.notes,
  })
  .superRefine((v, ctx) => {
    if (v.mode === 'member' && !v.growerUserId)
      ctx.addIssue({ code: 'custom', message: 'Choose the grower', path: ['growerUserId'] });
    if (v.mode === 'invite' && !v.growerEmail.trim())
      ctx.addIssue({
        code: 'custom',
        message: 'Enter the grower’s e-mail address',
        path: ['growerEmail'],
      });
  })
  .transform(
    ({ mode, growerUserId, growerEmail, ...site }): z.input<typeof CreateSiteInputSchema> => ({
      ...site,
      ...(mode === 'member' ? { growerUserId } : { growerEmail }),
    }),
  )
  .pipe(CreateSiteInputSchema);

const EMPTY: z.input<typeof EnrolSiteFormSchema> = {
  mode: 'member',
  growerUserId: '',
  growerEmail: '',
  fieldName: '',
  soil: '',
  previousCrop: '',
  fertility: '',
  notes: '',
};

export function EnrolSiteForm({ trialId, onDone }: { trialId: string; onDone?: () => void }) {
  const people = useTrialPeople(trialId);
  const enrol = useEnrolSite(trialId);
  const form = useZodForm(EnrolSiteFormSchema, { defaultValues: EMPTY });
  const mode = useWatch({ control: form.control, name: 'mode' });
  const [done, setDone] = useState<string | null>(null);

  return (
    <Form
      form={form}
      onSubmit={(input) => {
        setDone(null);
        enrol.mutate(input, {
          onSuccess: () => {
            setDone(
              input.growerEmail
                ? `${input.fieldName} is enrolled and an invitation went to ${input.growerEmail}.`
                : `${input.fieldName} is enrolled.`,
            );
            form.reset(EMPTY);
            onDone?.();
          },
          onError: (error) => applyServerErrors(form, error),
        });
      }}
      className="space-y-4"
      aria-label="Enrol a site"
    >
      {enrol.isError ? <Alert tone="danger">{errorSummary(enrol.error)}</Alert> : null}
      {done ? <Alert tone="success">{done}</Alert> : null}
      <fieldset className="flex flex-wrap gap-4">
        <legend className="mb-2 text-label text-ink">Grower</legend>
        {(
          [
            ['member', 'Someone already in the network'],
            ['invite', 'Invite by e-mail'],
          ] as const
        ).map(([value, label]) => (
          <label key={value} className="flex min-h-11 items-center gap-2 text-label">
            <input
              type="radio"
              value={value}
              {...form.register('mode')}
              className="size-5 accent-[var(--sheaf-accent)]"
            />
            {label}
          </label>
        ))}
      </fieldset>
      <div className="grid gap-4 sm:grid-cols-2">
        {mode === 'member' ? (
          <FormSelectField name="growerUserId" label="Grower">
            <option value="">{people.isPending ? 'Loading people…' : 'Choose a person…'}</option>
            {(people.data ?? []).map((p) => (
              <option key={p.userId} value={p.userId}>
                {p.name} ({p.email})
              </option>
            ))}
          </FormSelectField>
        ) : (
          <FormTextField
            name="growerEmail"
            label="Grower’s e-mail"
            type="email"
            autoComplete="off"
            hint="They get an invitation; the site is theirs once they accept."
          />
        )}
        <FormTextField name="fieldName" label="Field name" required />
        <FormTextField name="soil" label="Soil" placeholder="e.g. silt loam" />
        <FormTextField name="previousCrop" label="Previous crop" />
        <FormTextField
          name="fertility"
          label="Fertility"
          placeholder="e.g. compost before sowing, no other fertiliser"
          containerClassName="sm:col-span-2"
        />
        <FormTextAreaField name="notes" label="Notes" containerClassName="sm:col-span-2" />
      </div>
      <Button type="submit" busy={enrol.isPending}>
        Enrol site
      </Button>
    </Form>
  );
}
