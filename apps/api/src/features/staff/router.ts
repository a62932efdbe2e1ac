import {
  invitationList,
  invitationParams,
  invitationPreview,
  inviteInput,
  memberList,
  memberParams,
  okResponse,
  rinkParams,
  rinkSlug,
  updateMemberInput,
} from '@rinkwright/core';
import { z } from 'zod';
import type { Auth } from '../../auth';
import { defineRoute } from '../../http/route';
import * as staff from './service';

const invitationIdParams = z.object({ invitationId: z.string().min(1).max(36) });

export function staffRoutes(auth: Auth) {
  return [
    defineRoute({
      method: 'get',
      path: '/api/rinks/:rinkSlug/members',
      summary: 'Staff and league managers of the rink',
      access: 'rink',
      permission: { member: ['read'] },
      params: rinkParams,
      response: memberList,
      handle: ({ ctx }) => staff.listStaff(ctx),
    }),
    defineRoute({
      method: 'patch',
      path: '/api/rinks/:rinkSlug/members/:memberId',
      summary: "Change a member's role (only an owner changes an owner; a rink keeps one owner)",
      access: 'rink',
      permission: { member: ['update'] },
      params: memberParams,
      body: updateMemberInput,
      response: memberList,
      handle: ({ ctx, params, body }) => staff.changeRole(ctx, params.memberId, body),
    }),
    defineRoute({
      method: 'delete',
      path: '/api/rinks/:rinkSlug/members/:memberId',
      summary: 'Remove a member from the rink',
      access: 'rink',
      permission: { member: ['delete'] },
      params: memberParams,
      response: okResponse,
      handle: ({ ctx, params }) => staff.removeFromRink(ctx, params.memberId),
    }),
    defineRoute({
      method: 'get',
      path: '/api/rinks/:rinkSlug/invitations',
      summary: 'Pending invitations',
      access: 'rink',
      permission: { invitation: ['read'] },
      params: rinkParams,
      response: invitationList,
      handle: ({ ctx }) => staff.listPendingInvitations(ctx),
    }),
    defineRoute({
      method: 'post',
      path: '/api/rinks/:rinkSlug/invitations',
      summary: 'Invite someone by e-mail with a role',
      access: 'rink',
      permission: { invitation: ['create'] },
      params: rinkParams,
      body: inviteInput,
      response: invitationList,
      handle: ({ ctx, body, req }) => staff.invite(auth, req, ctx, body),
    }),
    defineRoute({
      method: 'delete',
      path: '/api/rinks/:rinkSlug/invitations/:invitationId',
      summary: 'Revoke a pending invitation',
      access: 'rink',
      permission: { invitation: ['cancel'] },
      params: invitationParams,
      response: okResponse,
      handle: ({ ctx, params }) => staff.revokeInvitation(ctx, params.invitationId),
    }),
    defineRoute({
      method: 'get',
      path: '/api/invitations/:invitationId',
      summary: 'What an invitation offers, for its accept page',
      access: 'public',
      params: invitationIdParams,
      response: invitationPreview,
      handle: ({ params }) => staff.previewInvitation(params.invitationId),
    }),
    defineRoute({
      method: 'post',
      path: '/api/invitations/:invitationId/accept',
      summary: 'Accept an invitation as the signed-in invitee',
      access: 'user',
      params: invitationIdParams,
      response: z.object({ slug: rinkSlug }),
      status: 200,
      handle: ({ ctx, params, req }) => staff.acceptInvitation(auth, req, ctx, params.invitationId),
    }),
  ];
}
