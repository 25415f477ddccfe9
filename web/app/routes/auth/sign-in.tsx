// /sign-in: e-mail and password, then on to the page the person was heading for.
import { Link, Navigate, useNavigate, useSearchParams } from 'react-router-dom';
import { AuthCard } from '../../../features/auth/components/auth-card';
import { SignInForm } from '../../../features/auth/components/sign-in-form';
import { useMe } from '../../../features/auth/api/get-me';
import { safeNext } from '../../../lib/redirects';

// No loader: the form shows at once instead of one round trip later, while the entry's own
// "who is signed in" request is still on its way; someone already signed in is sent on when it
// answers.
export default function SignInPage() {
  const [params] = useSearchParams();
  const navigate = useNavigate();
  const next = safeNext(params.get('next'));
  const me = useMe();
  if (me.data) return <Navigate to={next} replace />;
  return (
    <AuthCard
      title="Sign in"
      intro="Trials, field packets and reports for your grower network."
      footer={
        <>
          New to a network? Use the link in your invitation e-mail, or{' '}
          <Link to="/sign-up" className="text-accent underline">
            start a network
          </Link>
          .
        </>
      }
    >
      <SignInForm onSignedIn={() => navigate(next, { replace: true })} />
    </AuthCard>
  );
}
