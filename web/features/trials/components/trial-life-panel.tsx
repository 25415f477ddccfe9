// Where the trial is in its life (draft → in the field → harvest in → closed) and what the
// coordinator can do next: close it, reopen it, delete a draft, download everything.
import { useNavigate } from 'react-router-dom';
import type { TrialDetail } from '../../../../shared/schemas/trial';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { Card } from '../../../components/ui/card';
import { errorSummary } from '../../../lib/form-errors';
import { formatDate } from '../../../lib/format';
import { useChangeTrialStatus, useDeleteTrial } from '../api/trial-life';

const STEPS = [
  { status: 'draft', label: 'Draft' },
  { status: 'in-field', label: 'In the field' },
  { status: 'harvest-in', label: 'Harvest in' },
  { status: 'closed', label: 'Closed' },
] as const;

export function TrialLifePanel({ trial }: { trial: TrialDetail }) {
  const change = useChangeTrialStatus(trial.id);
  const remove = useDeleteTrial(trial.id);
  const navigate = useNavigate();
  const coordinating = trial.viewerRole === 'admin' || trial.viewerRole === 'coordinator';
  const current = STEPS.findIndex((s) => s.status === trial.status);
  const waiting = trial.harvest.sites - trial.harvest.withYield - trial.harvest.lost;
  const error = change.error ?? remove.error;
  return (
    <Card className="space-y-4 p-4" data-testid="trial-life">
      <h2 className="text-heading text-ink">Where the trial stands</h2>
      <ol className="grid grid-cols-4 gap-1 text-caption" aria-label="Trial stages">
        {STEPS.map((step, i) => (
          <li
            key={step.status}
            aria-current={i === current ? 'step' : undefined}
            className={
              i === current
                ? 'rounded-field bg-accent px-1 py-1.5 text-center font-semibold text-on-accent'
                : i < current
                  ? 'rounded-field bg-accent-soft px-1 py-1.5 text-center text-ink'
                  : 'rounded-field bg-sunken px-1 py-1.5 text-center text-ink-muted'
            }
          >
            {step.label}
          </li>
        ))}
      </ol>
      {trial.status !== 'draft' ? (
        <p className="figures text-label text-ink-muted">
          {trial.harvest.withYield} of {trial.harvest.sites} sites have a yield
          {trial.harvest.lost ? `, ${trial.harvest.lost} marked lost` : ''}
          {waiting > 0 && trial.status !== 'closed' ? `; waiting for ${waiting}` : ''}.
          {trial.closedAt ? ` Closed ${formatDate(trial.closedAt.slice(0, 10))}.` : ''}
        </p>
      ) : null}
      {error ? <Alert tone="danger">{errorSummary(error)}</Alert> : null}
      {coordinating ? (
        <div className="flex flex-wrap gap-2">
          {trial.status === 'harvest-in' ? (
            <Button busy={change.isPending} onClick={() => change.mutate('closed')}>
              Close the trial
            </Button>
          ) : null}
          {trial.status === 'closed' ? (
            <Button
              variant="secondary"
              busy={change.isPending}
              onClick={() => change.mutate('in-field')}
            >
              Reopen
            </Button>
          ) : null}
          {trial.canDelete ? (
            <Button
              variant="danger"
              busy={remove.isPending}
              onClick={() => {
                if (window.confirm(`Delete the draft “${trial.name}”? This cannot be undone.`))
                  remove.mutate(undefined, { onSuccess: () => navigate('/', { replace: true }) });
              }}
            >
              Delete draft
            </Button>
          ) : null}
          {trial.status !== 'draft' ? (
            <a
              className="inline-flex min-h-11 items-center rounded-field px-3 text-label font-semibold text-accent hover:bg-accent-soft"
              href={`/api/trials/${trial.id}/archive.zip`}
              download
            >
              Download everything (.zip)
            </a>
          ) : null}
        </div>
      ) : null}
      {trial.status === 'closed' ? (
        <p className="text-caption text-ink-muted">
          A closed trial is read-only. Its reports stay where they are.
        </p>
      ) : null}
    </Card>
  );
}
