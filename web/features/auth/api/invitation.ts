// Reads an invitation by its token and accepts it, which creates the account and signs in.
import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import {
  InvitationPreviewSchema,
  SessionUserSchema,
  type InvitationAccept,
  type SessionUser,
} from '../../../../shared/schemas/auth';
import { api } from '../../../lib/api-client';
import { meQueryKey } from './get-me';

export function invitationQueryOptions(token: string) {
  return queryOptions({
    queryKey: ['invitations', token],
    queryFn: async ({ signal }) =>
      InvitationPreviewSchema.parse(
        await api.get(`/api/invitations/${encodeURIComponent(token)}`, { signal }),
      ),
    staleTime: Infinity,
  });
}

export function useInvitation(token: string) {
  return useQuery(invitationQueryOptions(token));
}

export async function acceptInvitation(input: InvitationAccept): Promise<SessionUser> {
  return SessionUserSchema.parse(await api.post('/api/invitations/accept', input));
}

export function useAcceptInvitation() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: acceptInvitation,
    onSuccess: (user) => {
      queryClient.removeQueries({ predicate: (q) => q.queryKey[0] !== 'auth' });
      queryClient.setQueryData(meQueryKey, user);
    },
  });
}
