// E-mail the development mail catcher received (admin only; the API hides it in production).
import { queryOptions, useQuery } from '@tanstack/react-query';
import { z } from 'zod';
import { CaughtMailSchema } from '../../../../shared/schemas/auth';
import { api } from '../../../lib/api-client';
import { adminKeys } from '../../../lib/query-keys';

export function caughtMailQueryOptions() {
  return queryOptions({
    queryKey: adminKeys.mail(),
    queryFn: ({ signal }) => api.get('/api/admin/mail', z.array(CaughtMailSchema), { signal }),
    staleTime: 10_000,
  });
}

export function useCaughtMail() {
  return useQuery(caughtMailQueryOptions());
}
