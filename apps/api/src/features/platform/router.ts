import { platformRinkList } from '@rinkwright/core';
import { defineRoute } from '../../http/route';
import { listAllRinks } from './service';

export const platformRoutes = [
  defineRoute({
    method: 'get',
    path: '/api/platform/rinks',
    summary: 'Every rink on the platform (platform admin only)',
    access: 'platform',
    response: platformRinkList,
    handle: () => listAllRinks(),
  }),
];
