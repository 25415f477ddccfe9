// The signed-in area: sends signed-out visitors to /sign-in (keeping where they were going).
import type { QueryClient } from '@tanstack/react-query';
import { Navigate, Outlet, redirect, type LoaderFunctionArgs } from 'react-router-dom';
import { meQueryOptions, useMe } from '../../../features/auth/api/get-me';
import { signInPath } from '../../../lib/redirects';
import { AppShell } from '../../layout/app-shell';

export const clientLoader =
  (queryClient: QueryClient) =>
  async ({ request }: LoaderFunctionArgs) => {
    const user = await queryClient.ensureQueryData(meQueryOptions());
    if (!user) throw redirect(signInPath(new URL(request.url)));
    return null;
  };

export default function AppLayout() {
  const { data: user } = useMe();
  // After sign-out the cached user becomes null: leave the signed-in area.
  if (!user) return <Navigate to="/sign-in" replace />;
  return (
    <AppShell user={user}>
      <Outlet />
    </AppShell>
  );
}
