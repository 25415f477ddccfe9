// The trial design wizard: crop, rates, strips, seed lot, then a summary with seed amounts and
// the replication planner. Every step saves the draft; "Send to the field" activates the trial.
import { zodResolver } from '@hookform/resolvers/zod';
import { useEffect, useRef, useState } from 'react';
import { FormProvider, useForm, type Resolver } from 'react-hook-form';
import { useNavigate } from 'react-router-dom';
import type { SessionUser } from '../../../../shared/schemas/auth';
import type { TrialDetail, UpdateTrialInput } from '../../../../shared/schemas/trial';
import { Alert } from '../../../components/ui/alert';
import { isApiError } from '../../../lib/api-client';
import { errorSummary } from '../../../lib/form-errors';
import { applyServerErrors } from '../../../lib/forms/zod-form';
import { useCreateTrial, useUpdateTrial } from '../api/trial-mutations';
import { AmendDesignDialog } from './amend-design-dialog';
import { CropStep } from './wizard-crop-step';
import { RatesStep } from './wizard-rates-step';
import { SeedLotStep } from './wizard-seed-lot-step';
import { StripsStep } from './wizard-strips-step';
import { SummaryStep } from './wizard-summary-step';
import { WizardActions, WizardNav } from './wizard-nav';
import {
  STEPS,
  firstInvalidStep,
  initialValues,
  stepSchema,
  toPayload,
  type WizardValues,
} from './wizard-values';

/** API field names → the wizard's boxes, so a server message lands on the right box. */
const SERVER_FIELDS: Record<string, string> = {
  rowSpacingIn: 'rowSpacing',
  stripLengthFt: 'stripLength',
  seedPricePerLb: 'seedPrice',
  grainPricePerBu: 'grainPrice',
  thousandKernelWeightG: 'tkw',
  'customCrop.name': 'customName',
  'customCrop.thousandKernelWeightG': 'customTkw',
  'customCrop.bushelWeightLb': 'customBushel',
  'customCrop.standardMoisturePct': 'customMoisture',
  rateLevels: 'levels',
};

function useWizardForm(trial: TrialDetail | undefined, networkId: string, step: number) {
  const stepRef = useRef(step);
  stepRef.current = step;
  const [defaults] = useState(() => initialValues(trial, networkId));
  const resolver: Resolver<WizardValues> = (values, context, options) => {
    const schema = stepSchema(stepRef.current, values);
    if (!schema) return { values, errors: {} };
    return (zodResolver(schema) as unknown as Resolver<WizardValues>)(values, context, options);
  };
  return useForm<WizardValues>({
    defaultValues: defaults,
    resolver,
    mode: 'onSubmit',
    reValidateMode: 'onChange',
    shouldFocusError: true,
  });
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
  const coordinating = user.memberships.filter(
    (m) => m.role === 'coordinator' || m.role === 'admin',
  );
  const [step, setStep] = useState(Math.min(Math.max(initialStep, 0), STEPS.length - 1));
  const form = useWizardForm(trial, trial?.networkId ?? coordinating[0]?.networkId ?? '', step);
  const [saved, setSaved] = useState<string | null>(null);
  const [checkAfterJump, setCheckAfterJump] = useState(false);
  const create = useCreateTrial();
  const update = useUpdateTrial(trial?.id ?? '');
  const locked = trial?.designLocked ?? false;

  // After "Send to the field" jumps to a step that is not ready, show its messages there.
  useEffect(() => {
    if (!checkAfterJump) return;
    setCheckAfterJump(false);
    void form.trigger(undefined, { shouldFocus: true });
  }, [checkAfterJump, form]);

  const [amend, setAmend] = useState<{ extra: UpdateTrialInput; fields: string[] } | null>(null);
  const [amendError, setAmendError] = useState<string | undefined>();

  async function save(extra: UpdateTrialInput = {}): Promise<TrialDetail | null> {
    setSaved(null);
    const values = form.getValues();
    const body: UpdateTrialInput = { ...toPayload(values), ...extra };
    if (locked) {
      delete body.rateLevels;
      delete body.blocksPerSite;
    }
    try {
      const result = trial
        ? await update.mutateAsync(body)
        : await create.mutateAsync({ ...body, networkId: values.networkId, name: values.name });
      if (!trial) navigate(`/trials/${result.id}/edit?step=${step + 1}`, { replace: true });
      setSaved(result.status === 'draft' ? 'Draft saved' : 'Changes saved');
      return result;
    } catch (error) {
      if (isApiError(error) && error.code === 'design_locked' && !extra.amendReason) {
        // Sown already: ask for a reason and resend the same change as an amendment.
        setAmend({ extra, fields: Object.keys(error.fields) });
        return null;
      }
      if (isApiError(error) && error.fields.amendReason) {
        setAmendError(error.fields.amendReason);
        return null;
      }
      applyServerErrors(form, error, SERVER_FIELDS);
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

  const next = form.handleSubmit(async () => {
    if (await save()) setStep((s) => Math.min(s + 1, STEPS.length - 1));
  });

  async function finish() {
    const bad = firstInvalidStep(form.getValues());
    if (bad !== null) {
      setStep(bad);
      setCheckAfterJump(true);
      return;
    }
    const result = await save(trial?.status === 'draft' || !trial ? { status: 'in-field' } : {});
    if (result) navigate(`/trials/${result.id}`);
  }

  const mutationError = create.error ?? update.error;
  return (
    <div className="grid grid-cols-1 gap-6 lg:grid-cols-[14rem_minmax(0,1fr)]">
      {amend ? (
        <AmendDesignDialog
          fields={amend.fields}
          busy={update.isPending}
          error={amendError}
          onAmend={(reason) => void amendWith(reason)}
          onCancel={() => setAmend(null)}
        />
      ) : null}
      <WizardNav step={step} canJump={(index) => Boolean(trial) || index <= step} onGo={setStep} />
      <FormProvider {...form}>
        <form onSubmit={next} noValidate className="min-w-0 space-y-6">
          <h2 className="text-heading text-ink">
            Step {step + 1} of {STEPS.length}: {STEPS[step]}
          </h2>
          {mutationError ? (
            <Alert tone="danger" title="Not saved">
              {errorSummary(mutationError)}
            </Alert>
          ) : null}
          {step === 0 ? <CropStep isNew={!trial} networks={coordinating} /> : null}
          {step === 1 ? <RatesStep locked={locked} /> : null}
          {step === 2 ? <StripsStep locked={locked} /> : null}
          {step === 3 ? <SeedLotStep /> : null}
          {step === 4 ? <SummaryStep /> : null}
          <WizardActions
            step={step}
            busy={create.isPending || update.isPending}
            existing={trial}
            saved={saved}
            onBack={() => setStep((s) => s - 1)}
            onFinish={() => void finish()}
            onSaveDraft={() => void save()}
          />
        </form>
      </FormProvider>
    </div>
  );
}
