import { okResponse, platformRinkList, platformRinkParams, suspensionInput } from '@rinkwright/core';
import type { Env } from '../../env';
import { defineRoute } from '../../http/route';
import { listAllRinks } from './service';
import { reactivateRink, suspendRink } from './suspension';

export const platformRoutes = (env: Env) => [
  defineRoute({
    method: 'get',
    path: '/api/platform/rinks',
    summary: 'Every rink on the platform (platform admin only)',
    access: 'platform',
    response: platformRinkList,
    handle: () => listAllRinks(),
  }),
  defineRoute({
    method: 'post',
    path: '/api/platform/rinks/:rinkId/suspension',
    summary: 'Suspend a rink: its staff routes, public page and checkout answer 403 suspended (platform admin only)',
    access: 'platform',
    params: platformRinkParams,
    body: suspensionInput,
    response: okResponse,
    status: 200,
    handle: ({ params, body }) => suspendRink(params.rinkId, body.reason, env.PLATFORM_FEE_BPS),
  }),
  defineRoute({
    method: 'post',
    path: '/api/platform/rinks/:rinkId/reactivation',
    summary: 'Reactivate a suspended rink (platform admin only)',
    access: 'platform',
    params: platformRinkParams,
    response: okResponse,
    status: 200,
    handle: ({ params }) => reactivateRink(params.rinkId, env.PLATFORM_FEE_BPS),
  }),
];
