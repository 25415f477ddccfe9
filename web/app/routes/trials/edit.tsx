// `/trials/:trialId/edit`: the wizard on an existing trial (draft or active).
import type { QueryClient } from '@tanstack/react-query';
import {
  Link,
  useParams,
  useRouteError,
  useSearchParams,
  type LoaderFunctionArgs,
} from 'react-router-dom';
import { Alert } from '../../../components/ui/alert';
import { PageHeader } from '../../../components/ui/page-header';
import { LoadingBlock } from '../../../components/ui/spinner';
import { useMe } from '../../../features/auth/api/get-me';
import { trialQueryOptions, useTrial } from '../../../features/trials/api/get-trial';
import { TrialWizard } from '../../../features/trials/components/trial-wizard';
import { isNotFound, NotFoundPanel } from '../../route-errors';

export const clientLoader =
  (queryClient: QueryClient) =>
  async ({ params }: LoaderFunctionArgs) => {
    await queryClient.ensureQueryData(trialQueryOptions(params.trialId!));
    return null;
  };

export default function EditTrialPage() {
  const { trialId } = useParams();
  const [search] = useSearchParams();
  const { data: user } = useMe();
  const trial = useTrial(trialId!);
  if (!user || !trial.data) return <LoadingBlock />;
  return (
    <>
      <PageHeader
        eyebrow={trial.data.status === 'draft' ? 'Draft trial' : 'Trial design'}
        title={trial.data.name}
        description={<Link to={`/trials/${trial.data.id}`}>Back to the trial page</Link>}
      />
      {trial.data.canEdit ? (
        <TrialWizard
          key={trial.data.id}
          trial={trial.data}
          user={user}
          initialStep={Number(search.get('step') ?? 0)}
        />
      ) : (
        <Alert tone="info">Only the trial’s coordinators change its design.</Alert>
      )}
    </>
  );
}

export function ErrorBoundary() {
  const error = useRouteError();
  if (!isNotFound(error)) throw error;
  return <NotFoundPanel title="No such trial" />;
}
