import type { Express, Request, Response } from 'express';
import { graceLapsed } from '@rinkwright/core';
import type { z } from 'zod';
import type { Auth } from '../auth';
import { roleAllows } from '../access';
import { callersOf, findCaller, requireCaller, resolveRink, type Callers } from '../middleware/context';
import { AppError, fieldsOf } from './errors';
import { idempotencyKeyOf, once, requestHash, type StoredAnswer } from '../middleware/idempotency';
import type { RinkContext, Route } from './route';
import { scoped, type Scope } from '@rinkwright/db';

function parsePart(schema: z.ZodType | undefined, value: unknown, part: 'params' | 'query' | 'body'): unknown {
  if (!schema) return undefined;
  const parsed = schema.safeParse(value ?? (part === 'body' ? {} : value));
  if (!parsed.success) {
    throw new AppError('validation_failed', 'Some fields need attention', fieldsOf(parsed.error, part === 'body' ? undefined : part));
  }
  return parsed.data;
}

async function contextFor(route: Route, callers: Callers, req: Request, res: Response): Promise<unknown> {
  switch (route.access) {
    case 'public':
      return { user: await findCaller(callers, req, res) };
    case 'user':
      return requireCaller(callers, req, res);
    case 'platform': {
      const caller = await requireCaller(callers, req, res);
      if (!caller.platformAdmin) throw AppError.notFound('No such page');
      return caller;
    }
    case 'rink': {
      const caller = await requireCaller(callers, req, res);
      const { ctx, standing } = await resolveRink(caller, String(req.params.rinkSlug));
      if (route.permission && !roleAllows(ctx.role, route.permission)) {
        throw new AppError('forbidden', 'Your role at this rink does not allow this');
      }
      // A rink the platform suspended answers its staff nothing but why, until it is reactivated.
      if (standing.suspendedAt) {
        throw new AppError('suspended', `The platform has suspended this rink${standing.suspendedReason ? `: ${standing.suspendedReason}` : ''}. Contact the platform to have it reactivated.`);
      }
      // An unpaid plan past its grace leaves the rink readable, and only its billing can change (to pay it).
      if (route.method !== 'get' && !route.permission?.billing) {
        const lapsed = standing.planState === 'read_only' || graceLapsed(standing.planState, standing.graceUntil, new Date());
        if (lapsed) throw new AppError('read_only', 'This rink is read-only until its Rinkwright plan is paid');
      }
      return ctx;
    }
  }
}

/** Mounts the route table: context (sign-in, tenant, role) first, then validation, handler, response shape. */
export function mountRoutes(app: Express, routes: Route[], auth: Auth): void {
  const callers = callersOf(auth);
  for (const route of routes) {
    app[route.method](route.path, async (req, res) => {
      const ctx = await contextFor(route, callers, req, res);
      const keyed = route.idempotent === true || (route.idempotent === 'optional' && req.get('idempotency-key') !== undefined);
      if (keyed) idempotencyKeyOf(req);
      const params = parsePart(route.params, req.params, 'params');
      const query = parsePart(route.query, req.query, 'query');
      const body = parsePart(route.body, req.body, 'body');
      const rinkCtx = route.access === 'rink' ? (ctx as RinkContext) : undefined;
      // The response schema is the contract: it also strips anything a handler should not have returned.
      const run = async (scope: Scope | undefined): Promise<StoredAnswer> => {
        const result = await route.handle({ ctx, scope, params, query, body, req, res });
        // A handler may answer with a status of its own (health answers 503); otherwise the route's status.
        return { status: res.statusCode === 200 ? route.status : res.statusCode, body: route.response.parse(result) };
      };
      let answer: StoredAnswer;
      if (keyed && rinkCtx) {
        const key = idempotencyKeyOf(req);
        const claim = { key, route: `${route.method} ${route.path}`, hash: requestHash(route.path, params, body), atomic: route.atomic === true };
        answer = await once(rinkCtx.tenantId, claim, run);
        res.setHeader('Idempotency-Key', key);
      } else {
        answer = await run(rinkCtx && scoped(rinkCtx.tenantId));
      }
      if (route.produces === 'csv') res.status(answer.status).type('text/csv; charset=utf-8').send(answer.body);
      else res.status(answer.status).json(answer.body);
    });
  }
}
