// `/trials/new`: the wizard for a new trial (coordinators and admins).
import { useRouteError } from 'react-router-dom';
import { Alert } from '../../../components/ui/alert';
import { PageHeader } from '../../../components/ui/page-header';
import { LoadingBlock } from '../../../components/ui/spinner';
import { useMe } from '../../../features/auth/api/get-me';
import { TrialWizard } from '../../../features/trials/components/trial-wizard';
import { isCoordinator } from '../../../lib/session';
import { isNotFound, NotFoundPanel } from '../../route-errors';

export default function NewTrialPage() {
  const { data: user } = useMe();
  if (!user) return <LoadingBlock />;
  return (
    <>
      <PageHeader
        eyebrow="New trial"
        title="Design a seeding-rate trial"
        description="Five short steps: crop, rates, strips, seed lot, then a summary with the seed for every rate. Each step saves a draft you can finish later."
      />
      {isCoordinator(user) ? (
        <TrialWizard user={user} />
      ) : (
        <Alert tone="info" title="Coordinators design trials">
          Ask your network’s coordinator to set up a trial; you will get a field packet once your
          site is enrolled.
        </Alert>
      )}
    </>
  );
}

export function ErrorBoundary() {
  const error = useRouteError();
  if (!isNotFound(error)) throw error;
  return <NotFoundPanel />;
}
