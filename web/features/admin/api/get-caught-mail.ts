// E-mail the development mail catcher received (admin only; the API hides it in production).
import { queryOptions, useQuery } from '@tanstack/react-query';
import { z } from 'zod';
import { CaughtMailSchema } from '../../../../shared/schemas/auth';
import { api } from '../../../lib/api-client';

export function caughtMailQueryOptions() {
  return queryOptions({
    queryKey: ['admin', 'mail'],
    queryFn: async ({ signal }) =>
      z.array(CaughtMailSchema).parse(await api.get('/api/admin/mail', { signal })),
    staleTime: 10_000,
  });
}

export function useCaughtMail() {
  return useQuery(caughtMailQueryOptions());
}
