import { and, asc, desc, eq } from 'drizzle-orm';
import { directory, invitation, member, scoped, user } from '@rinkwright/db';

export function listMembers(tenantId: string) {
  return scoped(tenantId).findJoined(member, {
    fields: { id: member.id, userId: member.userId, role: member.role, joinedAt: member.createdAt, name: user.name, email: user.email },
    joins: [{ table: user, on: eq(user.id, member.userId) }],
    orderBy: [asc(user.name)],
  });
}

export function findMember(tenantId: string, memberId: string) {
  return scoped(tenantId).findOne(member, eq(member.id, memberId));
}

export function countOwners(tenantId: string) {
  return scoped(tenantId).count(member, eq(member.role, 'owner'));
}

export function setMemberRole(tenantId: string, memberId: string, role: string) {
  return scoped(tenantId).update(member, { role }, eq(member.id, memberId));
}

export function removeMember(tenantId: string, memberId: string) {
  return scoped(tenantId).remove(member, eq(member.id, memberId));
}

export function listInvitations(tenantId: string) {
  return scoped(tenantId).findJoined(invitation, {
    fields: {
      id: invitation.id,
      email: invitation.email,
      role: invitation.role,
      status: invitation.status,
      expiresAt: invitation.expiresAt,
      createdAt: invitation.createdAt,
      invitedBy: user.name,
    },
    joins: [{ table: user, on: eq(user.id, invitation.inviterId) }],
    where: eq(invitation.status, 'pending'),
    orderBy: [desc(invitation.createdAt)],
  });
}

export function findInvitation(tenantId: string, invitationId: string) {
  return scoped(tenantId).findOne(invitation, eq(invitation.id, invitationId));
}

export function cancelInvitation(tenantId: string, invitationId: string) {
  return scoped(tenantId).update(invitation, { status: 'canceled' }, and(eq(invitation.id, invitationId), eq(invitation.status, 'pending'))!);
}

export function findMemberByEmail(tenantId: string, email: string) {
  return scoped(tenantId).findJoined(member, {
    fields: { id: member.id },
    joins: [{ table: user, on: eq(user.id, member.userId) }],
    where: eq(user.email, email),
    limit: 1,
  });
}

export const findInvitationPreview = (invitationId: string) => directory.findInvitationPreview(invitationId);
