// Signs out: ends the server session, forgets the CSRF token and every cached answer.
import { useMutation, useQueryClient } from '@tanstack/react-query';
import { NoContent, api, resetCsrfToken } from '../../../lib/api-client';
import { forgetOfflineReads } from '../../../lib/offline-reads';
import { meQueryKey } from './get-me';

export async function logout(): Promise<void> {
  try {
    await api.post('/api/auth/logout', NoContent);
  } finally {
    // The server issues a new token after sign-out, whether or not this answer arrived.
    resetCsrfToken();
  }
}

export function useLogout() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: logout,
    onSettled: () => {
      void forgetOfflineReads();
      queryClient.clear();
      queryClient.setQueryData(meQueryKey, null);
    },
  });
}
