// PATCH /api/sites/:siteId: the dates that apply to every strip of a site, and its notes.
import { useMutation, useQueryClient } from '@tanstack/react-query';
import {
  SiteContextSchema,
  type SiteStrips,
  type UpdateSiteDataInput,
} from '../../../../shared/schemas/strip';
import { api } from '../../../lib/api-client';
import { collectKeys } from './site-strips';

export function useUpdateSiteData(siteId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: async (input: UpdateSiteDataInput) =>
      SiteContextSchema.parse(await api.patch(`/api/sites/${siteId}`, input)),
    onSuccess: (site) => {
      queryClient.setQueryData<SiteStrips>(collectKeys.site(siteId), (old) =>
        old ? { ...old, site } : old,
      );
    },
  });
}
