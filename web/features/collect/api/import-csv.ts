// POST /api/sites/:siteId/import: the CSV upload (all rows or nothing).
import { useMutation, useQueryClient } from '@tanstack/react-query';
import { ImportResultSchema } from '../../../../shared/schemas/import';
import { api } from '../../../lib/api-client';
import { collectKeys } from './site-strips';

export function useImportCsv(siteId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: async (file: File) => {
      const form = new FormData();
      form.append('file', file);
      return ImportResultSchema.parse(await api.post(`/api/sites/${siteId}/import`, form));
    },
    onSuccess: () => queryClient.invalidateQueries({ queryKey: collectKeys.site(siteId) }),
  });
}

export const templateUrl = (siteId: string) => `/api/sites/${siteId}/import-template.csv`;
