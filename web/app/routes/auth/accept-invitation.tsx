// /invite/:token: see which network and role an invitation is for, then create the account.
import type { QueryClient } from '@tanstack/react-query';
import {
  Link,
  useNavigate,
  useParams,
  useRouteError,
  type LoaderFunctionArgs,
} from 'react-router-dom';
import { Alert } from '../../../components/ui/alert';
import { LoadingBlock } from '../../../components/ui/spinner';
import { invitationQueryOptions, useInvitation } from '../../../features/auth/api/invitation';
import { AcceptInvitationForm } from '../../../features/auth/components/accept-invitation-form';
import { AuthCard } from '../../../features/auth/components/auth-card';
import { isApiError } from '../../../lib/api-client';
import { errorSummary } from '../../../lib/form-errors';
import { isNotFound } from '../../route-errors';

export const clientLoader =
  (queryClient: QueryClient) =>
  async ({ params }: LoaderFunctionArgs) => {
    await queryClient.ensureQueryData(invitationQueryOptions(params.token ?? ''));
    return null;
  };

export default function AcceptInvitationPage() {
  const { token = '' } = useParams();
  const navigate = useNavigate();
  const invitation = useInvitation(token);
  return (
    <AuthCard
      title="You are invited"
      intro="Finish setting up your Sheaf account to join the network."
    >
      {invitation.data ? (
        <AcceptInvitationForm
          token={token}
          invitation={invitation.data}
          onAccepted={() => navigate('/', { replace: true })}
        />
      ) : invitation.isError ? (
        <Alert tone="danger">{errorSummary(invitation.error)}</Alert>
      ) : (
        <LoadingBlock label="Reading the invitation…" />
      )}
    </AuthCard>
  );
}

export function ErrorBoundary() {
  const error = useRouteError();
  // A malformed token is refused by validation (400): to the reader it is the same broken link.
  if (!isNotFound(error) && !isApiError(error, 400)) throw error;
  return (
    <AuthCard title="This invitation does not work">
      <Alert tone="caution">
        The link may be mistyped, already used, or past its date. Ask your coordinator to send a new
        invitation.
      </Alert>
      <p className="mt-5 text-center text-label">
        Already have an account?{' '}
        <Link to="/sign-in" className="text-accent underline">
          Sign in
        </Link>
      </p>
    </AuthCard>
  );
}
