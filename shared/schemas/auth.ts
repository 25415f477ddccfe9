// Sign-in, session user, password reset and invitation contracts.
import { z } from 'zod';
import { RoleSchema } from './common';

// Mail servers take at most 254 characters in an address and 64 before the @ (RFC 5321 4.5.3.1).
export const EmailSchema = z
  .email('Enter a valid e-mail address')
  .max(254, 'An e-mail address has at most 254 characters')
  .refine((email) => email.indexOf('@') <= 64, 'The part before the @ has at most 64 characters')
  .trim()
  .toLowerCase();
export const PasswordSchema = z
  .string()
  .min(8, 'Use at least 8 characters')
  .max(200, 'Use at most 200 characters');

export const LoginInputSchema = z.object({
  email: EmailSchema,
  password: z.string().min(1, 'Enter your password').max(200),
});
export type LoginInput = z.infer<typeof LoginInputSchema>;

export const MembershipSchema = z.object({
  networkId: z.uuid(),
  networkName: z.string(),
  role: RoleSchema,
});
export type Membership = z.infer<typeof MembershipSchema>;

export const SessionUserSchema = z.object({
  id: z.uuid(),
  email: z.string(),
  name: z.string(),
  memberships: z.array(MembershipSchema),
});
export type SessionUser = z.infer<typeof SessionUserSchema>;

export const CsrfTokenSchema = z.object({ csrfToken: z.string() });

export const PasswordResetRequestSchema = z.object({ email: EmailSchema });
export const PasswordResetCompleteSchema = z.object({
  token: z.string().min(10, 'The reset link is incomplete'),
  password: PasswordSchema,
});

export const InvitationCreateSchema = z.object({
  email: EmailSchema,
  role: RoleSchema,
});
export type InvitationCreate = z.infer<typeof InvitationCreateSchema>;

export const InvitationPreviewSchema = z.object({
  email: z.string(),
  role: RoleSchema,
  networkName: z.string(),
  expiresAt: z.string(),
});
export type InvitationPreview = z.infer<typeof InvitationPreviewSchema>;

export const InvitationAcceptSchema = z.object({
  token: z.string().min(10, 'The invitation link is incomplete'),
  name: z.string().trim().min(1, 'Enter your name').max(120),
  password: PasswordSchema,
});
export type InvitationAccept = z.infer<typeof InvitationAcceptSchema>;

export const CaughtMailSchema = z.object({
  id: z.string(),
  to: z.array(z.string()),
  from: z.string(),
  subject: z.string(),
  text: z.string(),
  html: z.string().nullable(),
  receivedAt: z.string(),
});
export type CaughtMail = z.infer<typeof CaughtMailSchema>;
