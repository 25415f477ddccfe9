// Asks for a reset link by e-mail, and sets a new password from that link.
import { useMutation } from '@tanstack/react-query';
import type { z } from 'zod';
import type {
  PasswordResetCompleteSchema,
  PasswordResetRequestSchema,
} from '../../../../shared/schemas/auth';
import { NoContent, api } from '../../../lib/api-client';

export type PasswordResetRequest = z.infer<typeof PasswordResetRequestSchema>;
export type PasswordResetComplete = z.infer<typeof PasswordResetCompleteSchema>;

export function requestPasswordReset(input: PasswordResetRequest): Promise<void> {
  return api.post('/api/auth/password-reset', NoContent, input);
}

export function completePasswordReset(input: PasswordResetComplete): Promise<void> {
  return api.post('/api/auth/password-reset/complete', NoContent, input);
}

export function useRequestPasswordReset() {
  return useMutation({ mutationFn: requestPasswordReset });
}

export function useCompletePasswordReset() {
  return useMutation({ mutationFn: completePasswordReset });
}
