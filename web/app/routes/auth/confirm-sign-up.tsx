// /sign-up/confirm/:token: the link from the sign-up e-mail creates the account and network.
import { useEffect, useRef } from 'react';
import { Link, useNavigate, useParams } from 'react-router-dom';
import { Alert } from '../../../components/ui/alert';
import { LoadingBlock } from '../../../components/ui/spinner';
import { AuthCard } from '../../../features/auth/components/auth-card';
import { useConfirmSignUp } from '../../../features/networks/api/networks';
import { errorSummary } from '../../../lib/form-errors';

export default function ConfirmSignUpPage() {
  const { token = '' } = useParams();
  const confirm = useConfirmSignUp();
  const navigate = useNavigate();
  const sent = useRef(false);
  useEffect(() => {
    if (sent.current) return;
    sent.current = true;
    confirm.mutate(token, { onSuccess: () => navigate('/', { replace: true }) });
  }, [confirm, navigate, token]);
  return (
    <AuthCard title="Confirming your e-mail" intro="One moment while Sheaf starts your network.">
      {confirm.error ? (
        <Alert tone="danger" title="This link did not work">
          {errorSummary(confirm.error)}{' '}
          <Link to="/sign-up" className="underline">
            Sign up again
          </Link>
        </Alert>
      ) : (
        <LoadingBlock label="Starting your network…" />
      )}
    </AuthCard>
  );
}
