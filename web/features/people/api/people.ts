// A network's people for coordinators: members and open invitations, role changes, invitations.
import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { InvitationCreate } from '../../../../shared/schemas/auth';
import type { Role } from '../../../../shared/schemas/common';
import { NetworkMemberSchema, NetworkPeopleSchema } from '../../../../shared/schemas/people';
import { api } from '../../../lib/api-client';

const peopleKey = (networkId: string) => ['people', networkId] as const;

export function networkPeopleQueryOptions(networkId: string) {
  return queryOptions({
    queryKey: peopleKey(networkId),
    queryFn: async ({ signal }) =>
      NetworkPeopleSchema.parse(await api.get(`/api/networks/${networkId}/people`, { signal })),
    staleTime: 30_000,
  });
}

export function useNetworkPeople(networkId: string) {
  return useQuery(networkPeopleQueryOptions(networkId));
}

export function useChangeRole(networkId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: async (input: { userId: string; role: Role }) =>
      NetworkMemberSchema.parse(
        await api.patch(`/api/networks/${networkId}/members/${input.userId}`, { role: input.role }),
      ),
    onSettled: () => queryClient.invalidateQueries({ queryKey: peopleKey(networkId) }),
  });
}

export function useInvite(networkId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: InvitationCreate) =>
      api.post<{ id: string; email: string; role: Role; expiresAt: string }>(
        `/api/networks/${networkId}/invitations`,
        input,
      ),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: peopleKey(networkId) }),
  });
}

export function useRevokeInvitation(networkId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (invitationId: string) =>
      api.delete<void>(`/api/networks/${networkId}/invitations/${invitationId}`),
    onSettled: () => queryClient.invalidateQueries({ queryKey: peopleKey(networkId) }),
  });
}
