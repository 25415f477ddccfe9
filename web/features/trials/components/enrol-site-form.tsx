// Enrol a site: pick a network member as grower or type an e-mail address to invite.
import { useState, type FormEvent } from 'react';
import { CreateSiteInputSchema } from '../../../../shared/schemas/site';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { TextField } from '../../../components/ui/text-field';
import { apiFieldErrors, errorSummary } from '../../../lib/form-errors';
import { useTrialPeople } from '../api/get-trial';
import { useEnrolSite } from '../api/trial-mutations';
import { SelectField, TextAreaField } from '../../../components/ui/form-fields';
import { fieldBinder } from '../../../lib/bind-field';

const EMPTY = {
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
  const [mode, setMode] = useState<'member' | 'invite'>('member');
  const [form, setForm] = useState(EMPTY);
  const [errors, setErrors] = useState<Record<string, string>>({});
  const [done, setDone] = useState<string | null>(null);

  async function submit(event: FormEvent) {
    event.preventDefault();
    setDone(null);
    const candidate = {
      fieldName: form.fieldName,
      soil: form.soil,
      previousCrop: form.previousCrop,
      fertility: form.fertility,
      notes: form.notes,
      ...(mode === 'member'
        ? { growerUserId: form.growerUserId || undefined }
        : { growerEmail: form.growerEmail || undefined }),
    };
    const parsed = CreateSiteInputSchema.safeParse(candidate);
    if (!parsed.success) {
      const fields: Record<string, string> = {};
      for (const issue of parsed.error.issues)
        fields[String(issue.path[0] ?? 'form')] ??= issue.message;
      if (mode === 'member' && fields.growerEmail) fields.growerUserId = 'Choose the grower';
      setErrors(fields);
      return;
    }
    setErrors({});
    try {
      await enrol.mutateAsync(parsed.data);
      setDone(
        mode === 'invite'
          ? `${form.fieldName} is enrolled and an invitation went to ${form.growerEmail}.`
          : `${form.fieldName} is enrolled.`,
      );
      setForm(EMPTY);
      onDone?.();
    } catch (error) {
      setErrors(apiFieldErrors(error));
    }
  }

  const set = (patch: Partial<typeof EMPTY>) => setForm((f) => ({ ...f, ...patch }));
  const field = fieldBinder(form, set, errors);

  return (
    <form onSubmit={submit} noValidate className="space-y-4" aria-label="Enrol a site">
      {enrol.isError && Object.keys(errors).length === 0 ? (
        <Alert tone="danger">{errorSummary(enrol.error)}</Alert>
      ) : null}
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
              name="grower-mode"
              checked={mode === value}
              onChange={() => setMode(value)}
              className="size-5 accent-[var(--sheaf-accent)]"
            />
            {label}
          </label>
        ))}
      </fieldset>
      <div className="grid gap-4 sm:grid-cols-2">
        {mode === 'member' ? (
          <SelectField label="Grower" {...field('growerUserId')}>
            <option value="">{people.isPending ? 'Loading people…' : 'Choose a person…'}</option>
            {(people.data ?? []).map((p) => (
              <option key={p.userId} value={p.userId}>
                {p.name} ({p.email})
              </option>
            ))}
          </SelectField>
        ) : (
          <TextField
            label="Grower’s e-mail"
            type="email"
            autoComplete="off"
            hint="They get an invitation; the site is theirs once they accept."
            {...field('growerEmail')}
          />
        )}
        <TextField label="Field name" required {...field('fieldName')} />
        <TextField label="Soil" {...field('soil')} placeholder="e.g. silt loam" />
        <TextField label="Previous crop" {...field('previousCrop')} />
        <TextField
          label="Fertility"
          {...field('fertility')}
          placeholder="e.g. compost 3 t/acre"
          containerClassName="sm:col-span-2"
        />
        <TextAreaField label="Notes" {...field('notes')} containerClassName="sm:col-span-2" />
      </div>
      <Button type="submit" busy={enrol.isPending}>
        Enrol site
      </Button>
    </form>
  );
}
