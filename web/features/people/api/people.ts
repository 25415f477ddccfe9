// A network's people for coordinators: members and open invitations, role changes, invitations.
import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { InvitationCreate } from '../../../../shared/schemas/auth';
import type { Role } from '../../../../shared/schemas/common';
import { NetworkMemberSchema, NetworkPeopleSchema } from '../../../../shared/schemas/people';
import { InvitationCreatedSchema } from '../../../../shared/schemas/people';
import { NoContent, api } from '../../../lib/api-client';
import { peopleKeys } from '../../../lib/query-keys';

const peopleKey = peopleKeys.network;

export function networkPeopleQueryOptions(networkId: string) {
  return queryOptions({
    queryKey: peopleKey(networkId),
    queryFn: ({ signal }) =>
      api.get(`/api/networks/${networkId}/people`, NetworkPeopleSchema, { signal }),
    staleTime: 30_000,
  });
}

export function useNetworkPeople(networkId: string) {
  return useQuery(networkPeopleQueryOptions(networkId));
}

export function useChangeRole(networkId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: { userId: string; role: Role }) =>
      api.patch(`/api/networks/${networkId}/members/${input.userId}`, NetworkMemberSchema, {
        role: input.role,
      }),
    onSettled: () => queryClient.invalidateQueries({ queryKey: peopleKey(networkId) }),
  });
}

export function useInvite(networkId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: InvitationCreate) =>
      api.post(`/api/networks/${networkId}/invitations`, InvitationCreatedSchema, input),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: peopleKey(networkId) }),
  });
}

export function useRevokeInvitation(networkId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (invitationId: string) =>
      api.delete(`/api/networks/${networkId}/invitations/${invitationId}`, NoContent),
    onSettled: () => queryClient.invalidateQueries({ queryKey: peopleKey(networkId) }),
  });
}
