// Reads an invitation by its token and accepts it, which creates the account and signs in.
import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import {
  InvitationPreviewSchema,
  SessionUserSchema,
  type InvitationAccept,
  type SessionUser,
} from '../../../../shared/schemas/auth';
import { api } from '../../../lib/api-client';
import { authKeys, invitationKeys } from '../../../lib/query-keys';
import { meQueryKey } from './get-me';

export function invitationQueryOptions(token: string) {
  return queryOptions({
    queryKey: invitationKeys.detail(token),
    queryFn: ({ signal }) =>
      api.get(`/api/invitations/${encodeURIComponent(token)}`, InvitationPreviewSchema, {
        signal,
      }),
    staleTime: Infinity,
  });
}

export function useInvitation(token: string) {
  return useQuery(invitationQueryOptions(token));
}

export async function acceptInvitation(input: InvitationAccept): Promise<SessionUser> {
  return api.post('/api/invitations/accept', SessionUserSchema, input);
}

export function useAcceptInvitation() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: acceptInvitation,
    onSuccess: (user) => {
      queryClient.removeQueries({ predicate: (q) => q.queryKey[0] !== authKeys.all[0] });
      queryClient.setQueryData(meQueryKey, user);
    },
  });
}
