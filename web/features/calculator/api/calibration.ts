// Saves a seeder check to one of the signed-in grower's sites (the sites themselves come from
// web/lib/queries/sites.ts).
import { useMutation, useQueryClient } from '@tanstack/react-query';
import { z } from 'zod';
import { CalibrationRecordSchema, type CalibrationInput } from '../../../../shared/schemas/site';
import { api } from '../../../lib/api-client';
import { siteKeys } from '../../../lib/query-keys';

const SavedCalibrationsSchema = z.object({ calibrations: z.array(CalibrationRecordSchema) });

export function useSaveCalibration(siteId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: CalibrationInput) =>
      api.post(`/api/sites/${siteId}/calibrations`, SavedCalibrationsSchema, input),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: siteKeys.detail(siteId) }),
  });
}
