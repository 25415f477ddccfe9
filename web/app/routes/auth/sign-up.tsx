// /sign-up: start a network (or learn that this Sheaf is invite-only).
import { Link } from 'react-router-dom';
import { Alert } from '../../../components/ui/alert';
import { LoadingBlock } from '../../../components/ui/spinner';
import { AuthCard } from '../../../features/auth/components/auth-card';
import { useSignUpStatus } from '../../../features/networks/api/networks';
import { SignUpForm } from '../../../features/networks/components/sign-up-form';

export default function SignUpPage() {
  const status = useSignUpStatus();
  return (
    <AuthCard
      title="Start a network"
      intro="Sign up to run seeding-rate trials with your growers. You become the network’s admin and can invite coordinators, growers and members."
      footer={
        <Link to="/sign-in" className="text-accent underline">
          Already have an account? Sign in
        </Link>
      }
    >
      {status.data === undefined ? (
        <LoadingBlock />
      ) : status.data.open ? (
        <SignUpForm />
      ) : (
        <Alert tone="info" title="Joining is by invitation">
          This Sheaf is invite-only. Ask the coordinator of a network for an invitation.
        </Alert>
      )}
    </AuthCard>
  );
}
