// The signed-in user: `null` when nobody is signed in, so guards can branch without catching.
import { queryOptions, useQuery } from '@tanstack/react-query';
import { SessionUserSchema, type SessionUser } from '../../../../shared/schemas/auth';
import { api, isApiError } from '../../../lib/api-client';
import { authKeys } from '../../../lib/query-keys';

export const meQueryKey = authKeys.me();

export async function getMe(signal?: AbortSignal): Promise<SessionUser | null> {
  try {
    return await api.get('/api/auth/me', SessionUserSchema, { signal });
  } catch (error) {
    if (isApiError(error, 401)) return null;
    throw error;
  }
}

export function meQueryOptions() {
  return queryOptions({
    queryKey: meQueryKey,
    queryFn: ({ signal }) => getMe(signal),
    staleTime: 5 * 60_000,
  });
}

export function useMe() {
  return useQuery(meQueryOptions());
}
