import { z } from 'zod';
import { STAFF_ROLES } from '../roles';
import { email, id } from './common';

export const staffRole = z.enum(STAFF_ROLES, 'Choose a role');

export const memberRow = z.object({
  id: z.string(),
  userId: z.string(),
  name: z.string(),
  email: z.string(),
  role: staffRole,
  joinedAt: z.iso.datetime(),
});
export type MemberRow = z.infer<typeof memberRow>;
export const memberList = z.object({ members: z.array(memberRow) });

export const memberParams = z.object({ rinkSlug: z.string(), memberId: id });
export const updateMemberInput = z.object({ role: staffRole });
export type UpdateMemberInput = z.infer<typeof updateMemberInput>;

export const inviteInput = z.object({ email, role: staffRole });
export type InviteInput = z.infer<typeof inviteInput>;

export const invitationRow = z.object({
  id: z.string(),
  email: z.string(),
  role: staffRole,
  status: z.enum(['pending', 'accepted', 'rejected', 'canceled']),
  invitedBy: z.string(),
  expiresAt: z.iso.datetime(),
  createdAt: z.iso.datetime(),
});
export type InvitationRow = z.infer<typeof invitationRow>;
export const invitationList = z.object({ invitations: z.array(invitationRow) });
export const invitationParams = z.object({ rinkSlug: z.string(), invitationId: id });

/** What the invitee sees before accepting (looked up by the invitation's id, which only the e-mail carries). */
export const invitationPreview = z.object({
  id: z.string(),
  rinkName: z.string(),
  role: staffRole,
  email: z.string(),
  status: z.enum(['pending', 'accepted', 'rejected', 'canceled', 'expired']),
});
export type InvitationPreview = z.infer<typeof invitationPreview>;
