// Signs in with e-mail and password; the session user goes straight into the cache.
import { useMutation, useQueryClient } from '@tanstack/react-query';
import {
  SessionUserSchema,
  type LoginInput,
  type SessionUser,
} from '../../../../shared/schemas/auth';
import { api } from '../../../lib/api-client';
import { forgetOfflineReads } from '../../../lib/offline-reads';
import { authKeys } from '../../../lib/query-keys';
import { meQueryKey } from './get-me';

export async function login(input: LoginInput): Promise<SessionUser> {
  const user = await api.post('/api/auth/login', SessionUserSchema, input);
  // Another account may have used this browser: its offline copies go before anything is shown.
  await forgetOfflineReads();
  return user;
}

export function useLogin() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: login,
    onSuccess: (user) => {
      // Another account may have used this browser: drop its cached data first.
      queryClient.removeQueries({ predicate: (q) => q.queryKey[0] !== authKeys.all[0] });
      queryClient.setQueryData(meQueryKey, user);
    },
  });
}
