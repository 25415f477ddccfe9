// The wizard's step list (a row that scrolls on a phone, a column on a desk) and its buttons.
import { useFormContext, useWatch } from 'react-hook-form';
import type { TrialDetail } from '../../../../shared/schemas/trial';
import { Button } from '../../../components/ui/button';
import { cn } from '../../../lib/cn';
import { STEPS, type WizardValues } from './wizard-values';

export function WizardNav({
  step,
  canJump,
  onGo,
}: {
  step: number;
  canJump: (index: number) => boolean;
  onGo: (index: number) => void;
}) {
  return (
    <nav aria-label="Wizard steps" className="no-print min-w-0">
      <ol className="flex gap-2 overflow-x-auto pb-1 lg:flex-col lg:overflow-visible">
        {STEPS.map((name, index) => (
          <li key={name} className="shrink-0">
            <button
              type="button"
              onClick={() => (canJump(index) ? onGo(index) : undefined)}
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
  );
}

export function WizardActions({
  step,
  busy,
  existing,
  saved,
  onBack,
  onFinish,
  onSaveDraft,
}: {
  step: number;
  busy: boolean;
  existing: TrialDetail | undefined;
  saved: string | null;
  onBack: () => void;
  onFinish: () => void;
  onSaveDraft: () => void;
}) {
  const { control } = useFormContext<WizardValues>();
  const [networkId, name] = useWatch({ control, name: ['networkId', 'name'] });
  const last = step === STEPS.length - 1;
  return (
    <div className="no-print flex flex-wrap items-center gap-3 border-t border-line pt-5">
      {step > 0 ? (
        <Button variant="secondary" onClick={onBack}>
          Back
        </Button>
      ) : null}
      {!last ? (
        <Button type="submit" busy={busy} disabled={!networkId}>
          Save and continue
        </Button>
      ) : (
        <Button onClick={onFinish} busy={busy}>
          {existing && existing.status !== 'draft' ? 'Save the design' : 'Send to the field'}
        </Button>
      )}
      {last || existing ? (
        <Button
          variant="quiet"
          onClick={onSaveDraft}
          busy={busy}
          disabled={!networkId || !name.trim()}
        >
          Save draft
        </Button>
      ) : null}
      <span role="status" className="text-label text-accent">
        {saved}
      </span>
    </div>
  );
}
