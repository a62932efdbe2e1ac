import type { Request } from 'express';
import { fromNodeHeaders } from 'better-auth/node';
import {
  assignableRoles,
  type InvitationPreview,
  type InvitationRow,
  type InviteInput,
  type MemberRow,
  type StaffRole,
  type UpdateMemberInput,
} from '@rinkwright/core';
import type { Auth } from '../../auth';
import { AppError, fromAuthError } from '../../http/errors';
import type { RinkContext, UserContext } from '../../http/route';
import * as repo from './repository';

const MEMBER_NOT_FOUND = 'No such member at this rink';

export async function listStaff(ctx: RinkContext): Promise<{ members: MemberRow[] }> {
  const rows = await repo.listMembers(ctx.tenantId);
  return { members: rows.map((r) => ({ ...r, role: r.role as StaffRole, joinedAt: r.joinedAt.toISOString() })) };
}

async function targetOf(ctx: RinkContext, memberId: string) {
  const target = await repo.findMember(ctx.tenantId, memberId);
  if (!target) throw AppError.notFound(MEMBER_NOT_FOUND);
  // Only an owner may change or remove an owner.
  if (target.role === 'owner' && ctx.role !== 'owner') throw new AppError('forbidden', 'Only an owner can change an owner');
  return target;
}

async function keepOneOwner(ctx: RinkContext, target: { role: string }) {
  if (target.role === 'owner' && (await repo.countOwners(ctx.tenantId)) <= 1) {
    throw new AppError('conflict', 'A rink needs at least one owner: make someone else owner first');
  }
}

export async function changeRole(ctx: RinkContext, memberId: string, input: UpdateMemberInput): Promise<{ members: MemberRow[] }> {
  const target = await targetOf(ctx, memberId);
  if (!assignableRoles(ctx.role).includes(input.role)) throw AppError.field('role', 'Your role cannot give that role');
  if (input.role !== 'owner') await keepOneOwner(ctx, target);
  await repo.setMemberRole(ctx.tenantId, memberId, input.role);
  return listStaff(ctx);
}

export async function removeFromRink(ctx: RinkContext, memberId: string): Promise<{ ok: true }> {
  const target = await targetOf(ctx, memberId);
  await keepOneOwner(ctx, target);
  await repo.removeMember(ctx.tenantId, memberId);
  return { ok: true };
}

export async function listPendingInvitations(ctx: RinkContext): Promise<{ invitations: InvitationRow[] }> {
  const rows = await repo.listInvitations(ctx.tenantId);
  return {
    invitations: rows.map((r) => ({
      ...r,
      role: (r.role ?? 'technician') as StaffRole,
      status: r.status as InvitationRow['status'],
      expiresAt: r.expiresAt.toISOString(),
      createdAt: r.createdAt.toISOString(),
    })),
  };
}

export async function invite(auth: Auth, req: Request, ctx: RinkContext, input: InviteInput): Promise<{ invitations: InvitationRow[] }> {
  if (!assignableRoles(ctx.role).includes(input.role)) throw AppError.field('role', 'Your role cannot give that role');
  if ((await repo.findMemberByEmail(ctx.tenantId, input.email)).length > 0) {
    throw AppError.field('email', 'This person is already on the staff of this rink');
  }
  try {
    await auth.api.createInvitation({
      headers: fromNodeHeaders(req.headers),
      body: { email: input.email, role: input.role, organizationId: ctx.tenantId, resend: true },
    });
  } catch (error) {
    throw fromAuthError(error);
  }
  return listPendingInvitations(ctx);
}

export async function revokeInvitation(ctx: RinkContext, invitationId: string): Promise<{ ok: true }> {
  const found = await repo.findInvitation(ctx.tenantId, invitationId);
  if (!found) throw AppError.notFound('No such invitation at this rink');
  if (found.status !== 'pending') throw new AppError('conflict', `This invitation is already ${found.status}`);
  await repo.cancelInvitation(ctx.tenantId, invitationId);
  return { ok: true };
}

export async function previewInvitation(invitationId: string): Promise<InvitationPreview> {
  const found = await repo.findInvitationPreview(invitationId);
  if (!found) throw AppError.notFound('No such invitation');
  const expired = found.status === 'pending' && found.expiresAt.getTime() < Date.now();
  return {
    id: found.id,
    rinkName: found.rinkName,
    role: (found.role ?? 'technician') as StaffRole,
    email: found.email,
    status: expired ? 'expired' : (found.status as InvitationPreview['status']),
  };
}

export async function acceptInvitation(auth: Auth, req: Request, caller: UserContext, invitationId: string): Promise<{ slug: string }> {
  const found = await repo.findInvitationPreview(invitationId);
  if (!found) throw AppError.notFound('No such invitation');
  if (found.email !== caller.email.toLowerCase()) {
    throw new AppError('forbidden', `This invitation is for ${found.email}; sign in with that address to accept it`);
  }
  try {
    await auth.api.acceptInvitation({ headers: fromNodeHeaders(req.headers), body: { invitationId } });
  } catch (error) {
    throw fromAuthError(error);
  }
  return { slug: found.rinkSlug };
}
