import { createRinkInput, rinkParams, rinkSlug, rinkSummary, updateRinkInput } from '@rinkwright/core';
import { z } from 'zod';
import type { Auth } from '../../auth';
import { defineRoute } from '../../http/route';
import { changeRinkSettings, createRink, summarizeRink } from './service';

export function rinkRoutes(auth: Auth) {
  return [
    defineRoute({
      method: 'post',
      path: '/api/rinks',
      summary: 'Create a rink; the caller becomes its owner',
      access: 'user',
      body: createRinkInput,
      response: z.object({ slug: rinkSlug }),
      handle: ({ req, body }) => createRink(auth, req, body),
    }),
    defineRoute({
      method: 'get',
      path: '/api/rinks/:rinkSlug',
      summary: 'The rink summary, with the caller role and permissions',
      access: 'rink',
      permission: { rink: ['read'] },
      params: rinkParams,
      response: rinkSummary,
      handle: ({ ctx }) => summarizeRink(ctx),
    }),
    defineRoute({
      method: 'patch',
      path: '/api/rinks/:rinkSlug',
      summary: 'Change the rink name, time zone, currency or unit preference',
      access: 'rink',
      permission: { rink: ['update'] },
      params: rinkParams,
      body: updateRinkInput,
      response: rinkSummary,
      handle: ({ ctx, body }) => changeRinkSettings(ctx, body),
    }),
  ];
}
