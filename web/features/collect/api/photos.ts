// A site's photos (optionally one strip's) and the upload mutation.
import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { z } from 'zod';
import { PhotoSchema } from '../../../../shared/schemas/photo';
import { api } from '../../../lib/api-client';
import { collectKeys } from './site-strips';

export function sitePhotosQueryOptions(siteId: string) {
  return queryOptions({
    queryKey: collectKeys.photos(siteId),
    queryFn: async ({ signal }) =>
      z.array(PhotoSchema).parse(await api.get(`/api/sites/${siteId}/photos`, { signal })),
  });
}

export function useSitePhotos(siteId: string) {
  return useQuery(sitePhotosQueryOptions(siteId));
}

export function useUploadPhoto(siteId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: async (input: { file: File; stripId?: string; caption: string }) => {
      const form = new FormData();
      if (input.stripId) form.append('stripId', input.stripId);
      form.append('caption', input.caption);
      form.append('file', input.file);
      return PhotoSchema.parse(await api.post(`/api/sites/${siteId}/photos`, form));
    },
    onSuccess: () => queryClient.invalidateQueries({ queryKey: collectKeys.photos(siteId) }),
  });
}
