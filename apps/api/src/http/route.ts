import type { Request, Response } from 'express';
import type { StaffRole } from '@rinkwright/core';
import type { z } from 'zod';
import type { Scope } from '@rinkwright/db';
import type { Permission } from '../access';

export type Method = 'get' | 'post' | 'patch' | 'put' | 'delete';

export interface UserContext {
  userId: string;
  email: string;
  name: string;
  platformAdmin: boolean;
}

export interface RinkContext extends UserContext {
  tenantId: string;
  rinkSlug: string;
  rinkName: string;
  role: StaffRole;
  memberId: string;
}

interface Contexts {
  public: { user: UserContext | null };
  user: UserContext;
  platform: UserContext;
  rink: RinkContext;
}
export type AccessKind = keyof Contexts;

type Schema = z.ZodType;
type Infer<S> = S extends z.ZodType ? z.infer<S> : undefined;

export interface RouteSpec<K extends AccessKind, P, Q, B, R extends Schema> {
  method: Method;
  path: string;
  summary: string;
  access: K;
  /** Required for rink routes: checked against the caller's role before the handler runs. */
  permission?: K extends 'rink' ? Permission : never;
  params?: P;
  query?: Q;
  body?: B;
  response: R;
  status?: number;
  /** 'csv': the handler returns the file's text, sent as text/csv (an export) instead of JSON. */
  produces?: 'json' | 'csv';
  /**
   * A counter write: requires an Idempotency-Key header, and a repeat of the key gets the first answer.
   * 'optional' honours a key when the client sends one (the web app always does) and works without one.
   */
  idempotent?: K extends 'rink' ? boolean | 'optional' : never;
  /**
   * With `idempotent: true`: the handler's writes and the key's stored answer commit as one transaction, and `scope`
   * is that transaction (middleware/idempotency.ts). Only for handlers that call nothing outside the database.
   */
  atomic?: K extends 'rink' ? true : never;
  handle(input: {
    ctx: Contexts[K];
    /** The rink's scope (the request's transaction when the route is atomic); undefined outside rink routes. */
    scope: K extends 'rink' ? Scope : undefined;
    params: Infer<P>;
    query: Infer<Q>;
    body: Infer<B>;
    req: Request;
    res: Response;
  }): Promise<z.input<R>>;
}

export interface Route {
  method: Method;
  path: string;
  summary: string;
  access: AccessKind;
  permission?: Permission;
  params?: Schema;
  query?: Schema;
  body?: Schema;
  response: Schema;
  status: number;
  produces?: 'json' | 'csv';
  idempotent?: boolean | 'optional';
  atomic?: true;
  handle(input: { ctx: unknown; scope: Scope | undefined; params: unknown; query: unknown; body: unknown; req: Request; res: Response }): Promise<unknown>;
}

/** Declares one route: its shape is the single source for validation, the OpenAPI document and the tenancy sweep. */
export function defineRoute<K extends AccessKind, P extends Schema | undefined, Q extends Schema | undefined, B extends Schema | undefined, R extends Schema>(
  spec: RouteSpec<K, P, Q, B, R>,
): Route {
  if (spec.access === 'rink' && !spec.permission) throw new Error(`${spec.path}: rink routes need a permission`);
  if (spec.atomic && spec.idempotent !== true) throw new Error(`${spec.path}: an atomic route is an idempotent one`);
  if (spec.access === 'rink' && !spec.path.startsWith('/api/rinks/:rinkSlug')) {
    throw new Error(`${spec.path}: rink routes live under /api/rinks/:rinkSlug`);
  }
  return { ...spec, status: spec.status ?? (spec.method === 'post' ? 201 : 200) } as unknown as Route;
}
