// Starting a network: sign-up with e-mail confirmation, a second network for a signed-in
// person, and deleting a network after typing its name.
import { z } from 'zod';
import { EmailSchema, PasswordSchema } from './auth';

export const NetworkNameSchema = z
  .string()
  .trim()
  .min(3, 'Name the network (at least 3 characters)')
  .max(120, 'At most 120 characters');

export const SignUpInputSchema = z.object({
  name: z.string().trim().min(1, 'Enter your name').max(120, 'At most 120 characters'),
  email: EmailSchema,
  password: PasswordSchema,
  networkName: NetworkNameSchema,
});
export type SignUpInput = z.infer<typeof SignUpInputSchema>;

export const SignUpConfirmSchema = z.object({
  token: z.string().min(10, 'The confirmation link is incomplete').max(200),
});

export const SignUpStatusSchema = z.object({
  /** False when the instance owner set SIGNUP=invite-only. */
  open: z.boolean(),
});
export type SignUpStatus = z.infer<typeof SignUpStatusSchema>;

export const CreateNetworkInputSchema = z.object({ name: NetworkNameSchema });
export type CreateNetworkInput = z.infer<typeof CreateNetworkInputSchema>;

export const DeleteNetworkInputSchema = z.object({
  /** The network's name typed again, so a slip of the mouse cannot delete it. */
  confirmName: z.string().trim().min(1, 'Type the network’s name to confirm'),
});
export type DeleteNetworkInput = z.infer<typeof DeleteNetworkInputSchema>;

export const NetworkSummarySchema = z.object({
  id: z.uuid(),
  name: z.string(),
  role: z.enum(['admin', 'coordinator', 'grower', 'member']),
});
export type NetworkSummary = z.infer<typeof NetworkSummarySchema>;
