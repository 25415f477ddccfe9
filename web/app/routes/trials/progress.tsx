// `/trials/:trialId/progress`: which measurements are in at each site, and reminders.
import type { QueryClient } from '@tanstack/react-query';
import { useParams, useRouteError, type LoaderFunctionArgs } from 'react-router-dom';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { PageHeader } from '../../../components/ui/page-header';
import { LoadingBlock } from '../../../components/ui/spinner';
import { meQueryOptions } from '../../../features/auth/api/get-me';
import {
  trialProgressQueryOptions,
  useTrialProgress,
} from '../../../features/collect/api/trial-progress';
import { ProgressTable } from '../../../features/collect/components/progress-table';
import { errorSummary } from '../../../lib/form-errors';
import { isNotFound, NotFoundPanel } from '../../route-errors';

export const clientLoader =
  (queryClient: QueryClient) =>
  async ({ params }: LoaderFunctionArgs) => {
    const user = await queryClient.ensureQueryData(meQueryOptions());
    if (!user || !params.trialId) return null;
    await queryClient.ensureQueryData(trialProgressQueryOptions(params.trialId));
    return null;
  };

export default function ProgressPage() {
  const { trialId = '' } = useParams();
  const progress = useTrialProgress(trialId);
  if (progress.isError) {
    return (
      <Alert
        tone="danger"
        title="Could not load progress"
        action={
          <Button variant="secondary" onClick={() => void progress.refetch()}>
            Try again
          </Button>
        }
      >
        {errorSummary(progress.error)}
      </Alert>
    );
  }
  if (!progress.data) return <LoadingBlock label="Loading progress…" />;
  return (
    <>
      <PageHeader
        back={{ to: `/trials/${trialId}`, label: progress.data.trialName }}
        title="Numbers coming in"
        description="How many strips at each site have each measurement entered."
      />
      <ProgressTable progress={progress.data} />
    </>
  );
}

export function ErrorBoundary() {
  const error = useRouteError();
  if (!isNotFound(error)) throw error;
  return <NotFoundPanel title="Trial not found" />;
}
