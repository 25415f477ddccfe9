// Signs in with e-mail and password; the session user goes straight into the cache.
import { useMutation, useQueryClient } from '@tanstack/react-query';
import {
  SessionUserSchema,
  type LoginInput,
  type SessionUser,
} from '../../../../shared/schemas/auth';
import { api } from '../../../lib/api-client';
import { authKeys } from '../../../lib/query-keys';
import { meQueryKey } from './get-me';

export async function login(input: LoginInput): Promise<SessionUser> {
  return api.post('/api/auth/login', SessionUserSchema, input);
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
