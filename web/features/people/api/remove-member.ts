// Take a person out of the network: their sites wait for a new grower.
import { useMutation, useQueryClient } from '@tanstack/react-query';
import { z } from 'zod';
import { api } from '../../../lib/api-client';

export function useRemoveMember(networkId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: async (userId: string) =>
      z
        .object({ sitesLeftWithoutGrower: z.number() })
        .parse(await api.delete(`/api/networks/${networkId}/members/${userId}`)),
    onSettled: () => queryClient.invalidateQueries({ queryKey: ['people', networkId] }),
  });
}
