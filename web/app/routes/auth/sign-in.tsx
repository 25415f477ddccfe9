// /sign-in: e-mail and password, then on to the page the person was heading for.
import type { QueryClient } from '@tanstack/react-query';
import {
  Link,
  redirect,
  useNavigate,
  useSearchParams,
  type LoaderFunctionArgs,
} from 'react-router-dom';
import { AuthCard } from '../../../features/auth/components/auth-card';
import { SignInForm } from '../../../features/auth/components/sign-in-form';
import { meQueryOptions } from '../../../features/auth/api/get-me';
import { safeNext } from '../../../lib/redirects';

export const clientLoader =
  (queryClient: QueryClient) =>
  async ({ request }: LoaderFunctionArgs) => {
    const user = await queryClient.ensureQueryData(meQueryOptions());
    if (user) throw redirect(safeNext(new URL(request.url).searchParams.get('next')));
    return null;
  };

export default function SignInPage() {
  const [params] = useSearchParams();
  const navigate = useNavigate();
  const next = safeNext(params.get('next'));
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
