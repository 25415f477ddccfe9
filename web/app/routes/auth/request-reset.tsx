// /reset: ask for an e-mail with a link to set a new password.
import { Link } from 'react-router-dom';
import { AuthCard } from '../../../features/auth/components/auth-card';
import { RequestResetForm } from '../../../features/auth/components/request-reset-form';

export default function RequestResetPage() {
  return (
    <AuthCard
      title="Forgot your password?"
      intro="Enter the address you sign in with. We will e-mail you a link to choose a new password."
      footer={
        <Link to="/sign-in" className="text-accent underline">
          Back to sign in
        </Link>
      }
    >
      <RequestResetForm />
    </AuthCard>
  );
}
