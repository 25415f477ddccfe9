// Frame for pages anyone may read: the full app shell when signed in, a plain header otherwise.
import type { QueryClient } from '@tanstack/react-query';
import { Outlet } from 'react-router-dom';
import { meQueryOptions, useMe } from '../../../features/auth/api/get-me';
import { AppShell } from '../../layout/app-shell';

export const clientLoader = (queryClient: QueryClient) => async () => {
  await queryClient.ensureQueryData(meQueryOptions());
  return null;
};

export default function OpenLayout() {
  const { data: user } = useMe();
  return (
    <AppShell user={user ?? null}>
      <Outlet />
    </AppShell>
  );
}
