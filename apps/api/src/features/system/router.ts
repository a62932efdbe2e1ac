import { healthResponse, publicConfig } from '@rinkwright/core';
import { pingDb } from '@rinkwright/db';
import { z } from 'zod';
import type { Env } from '../../env';
import { defineRoute } from '../../http/route';

export function systemRoutes(env: Env, openApi: () => unknown) {
  return [
    defineRoute({
      method: 'get',
      path: '/api/health',
      summary: 'Liveness and database reachability (503 when the database is down)',
      access: 'public',
      response: healthResponse,
      async handle({ res }) {
        const up = await pingDb();
        if (!up) res.status(503);
        return { status: up ? 'ok' : 'degraded', db: up ? 'up' : 'down' } as const;
      },
    }),
    defineRoute({
      method: 'get',
      path: '/api/config',
      summary: 'Settings the web app needs before sign-in',
      access: 'public',
      response: publicConfig,
      handle: async () => ({ mailInboxUrl: env.MAIL_INBOX_URL ?? null }),
    }),
    defineRoute({
      method: 'get',
      path: '/api/openapi.json',
      summary: 'This API as an OpenAPI 3.1 document, generated from the route table',
      access: 'public',
      response: z.looseObject({ openapi: z.string() }),
      handle: async () => openApi() as { openapi: string },
    }),
  ];
}
