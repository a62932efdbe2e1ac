import { meResponse } from '@rinkwright/core';
import { defineRoute } from '../../http/route';
import { describeCaller } from './service';

export const meRoutes = [
  defineRoute({
    method: 'get',
    path: '/api/me',
    summary: 'The signed-in user, their rinks with their role in each, and the rinks where they are a customer',
    access: 'user',
    response: meResponse,
    handle: ({ ctx }) => describeCaller(ctx),
  }),
];
