// The people of a network: members with their roles, open invitations, and role changes.
import { z } from 'zod';
import { RoleSchema } from './common';

export const NetworkMemberSchema = z.object({
  userId: z.uuid(),
  name: z.string(),
  email: z.string(),
  role: RoleSchema,
  /** Sites this person grows in the network's trials. */
  siteCount: z.number().int().nonnegative(),
});
export type NetworkMember = z.infer<typeof NetworkMemberSchema>;

export const OpenInvitationSchema = z.object({
  id: z.uuid(),
  email: z.string(),
  role: RoleSchema,
  expiresAt: z.string(),
  createdAt: z.string(),
});
export type OpenInvitation = z.infer<typeof OpenInvitationSchema>;

export const NetworkPeopleSchema = z.object({
  members: z.array(NetworkMemberSchema),
  invitations: z.array(OpenInvitationSchema),
});
export type NetworkPeople = z.infer<typeof NetworkPeopleSchema>;

/** POST /api/networks/:networkId/invitations: the invitation just sent. */
export const InvitationCreatedSchema = z.object({
  id: z.uuid(),
  email: z.string(),
  role: RoleSchema,
  expiresAt: z.string(),
});
export type InvitationCreated = z.infer<typeof InvitationCreatedSchema>;

export const MemberRoleUpdateSchema = z.object({
  role: RoleSchema,
});
export type MemberRoleUpdate = z.infer<typeof MemberRoleUpdateSchema>;

/** Roles a coordinator may give or take away; admin and coordinator need an admin. */
export const COORDINATOR_GRANTABLE_ROLES = ['grower', 'member'] as const;

/** The roles someone with `viewerRole` in a network may grant, invite to, or change from. */
export function grantableRoles(
  viewerRole: z.infer<typeof RoleSchema> | undefined,
): z.infer<typeof RoleSchema>[] {
  if (viewerRole === 'admin') return ['admin', 'coordinator', 'grower', 'member'];
  if (viewerRole === 'coordinator') return [...COORDINATOR_GRANTABLE_ROLES];
  return [];
}
