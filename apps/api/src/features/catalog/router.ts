import { rinkParams, serviceInput, serviceList, serviceParams, serviceRow } from '@rinkwright/core';
import { defineRoute } from '../../http/route';
import * as catalog from './service';

export const catalogRoutes = [
  defineRoute({
    method: 'get',
    path: '/api/rinks/:rinkSlug/services',
    summary: "The rink's services (standard sharpening, profiling, new steel, add-ons) with prices",
    access: 'rink',
    permission: { service: ['read'] },
    params: rinkParams,
    response: serviceList,
    handle: ({ ctx }) => catalog.listServices(ctx),
  }),
  defineRoute({
    method: 'post',
    path: '/api/rinks/:rinkSlug/services',
    summary: 'Add a service',
    access: 'rink',
    permission: { service: ['manage'] },
    params: rinkParams,
    body: serviceInput,
    response: serviceRow,
    handle: ({ ctx, body }) => catalog.addService(ctx, body),
  }),
  defineRoute({
    method: 'put',
    path: '/api/rinks/:rinkSlug/services/:serviceId',
    summary: 'Change a service',
    access: 'rink',
    permission: { service: ['manage'] },
    params: serviceParams,
    body: serviceInput,
    response: serviceRow,
    handle: ({ ctx, params, body }) => catalog.changeService(ctx, params.serviceId, body),
  }),
];
