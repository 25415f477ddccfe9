// Sign-up, confirmation, starting another network and deleting one.
import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { SessionUserSchema } from '../../../../shared/schemas/auth';
import {
  NetworkSummarySchema,
  SignUpStatusSchema,
  type CreateNetworkInput,
  type SignUpInput,
} from '../../../../shared/schemas/network';
import { api } from '../../../lib/api-client';
import { setCurrentNetwork } from '../lib/current-network';

/** The signed-in user's query key, as the auth feature names it. */
const meQueryKey = ['auth', 'me'] as const;

export function signUpStatusQueryOptions() {
  return queryOptions({
    queryKey: ['auth', 'sign-up'],
    queryFn: async ({ signal }) =>
      SignUpStatusSchema.parse(await api.get('/api/auth/sign-up', { signal })),
  });
}

export function useSignUpStatus() {
  return useQuery(signUpStatusQueryOptions());
}

export function useSignUp() {
  return useMutation({
    mutationFn: (input: SignUpInput) => api.post('/api/auth/sign-up', input),
  });
}

export function useConfirmSignUp() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: async (token: string) =>
      SessionUserSchema.parse(await api.post('/api/auth/sign-up/confirm', { token })),
    onSuccess: (user) => {
      const first = user.memberships[0];
      if (first) setCurrentNetwork(first.networkId);
      queryClient.setQueryData(meQueryKey, user);
    },
  });
}

export function useCreateNetwork() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: async (input: CreateNetworkInput) =>
      NetworkSummarySchema.parse(await api.post('/api/networks', input)),
    onSuccess: async (network) => {
      setCurrentNetwork(network.id);
      await queryClient.invalidateQueries({ queryKey: meQueryKey });
      await queryClient.invalidateQueries({ queryKey: ['trials'] });
    },
  });
}

export function useDeleteNetwork(networkId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (confirmName: string) => api.delete(`/api/networks/${networkId}`, { confirmName }),
    onSuccess: async () => {
      setCurrentNetwork(null);
      await queryClient.invalidateQueries();
    },
  });
}
