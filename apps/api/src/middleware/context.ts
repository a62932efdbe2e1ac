import type { Request, Response } from 'express';
import { fromNodeHeaders } from 'better-auth/node';
import { directory } from '@rinkwright/db';
import { STAFF_ROLES, type StaffRole } from '@rinkwright/core';
import { getCookies } from 'better-auth/cookies';
import type { Auth } from '../auth';
import { SessionMemo } from './session-memo';
import { AppError } from '../http/errors';
import type { RinkContext, UserContext } from '../http/route';

/** How the API knows who is calling: better-auth, and what this process already verified (session-memo.ts). */
export interface Callers {
  auth: Auth;
  memo: SessionMemo;
}

export function callersOf(auth: Auth): Callers {
  return { auth, memo: new SessionMemo(getCookies(auth.options).sessionData.name) };
}

/**
 * The signed-in user. The session is read from its signed cache cookie while that is fresh (auth.ts), else from
 * the database; whatever cookies better-auth renews on the way are passed on to the browser.
 */
export async function findCaller({ auth, memo }: Callers, req: Request, res: Response): Promise<UserContext | null> {
  const cookieHeader = req.headers.cookie;
  const known = memo.recall(cookieHeader);
  if (known) return known;
  const { headers, response: found } = await auth.api.getSession({ headers: fromNodeHeaders(req.headers), returnHeaders: true });
  const renewed = headers.getSetCookie();
  for (const cookie of renewed) res.append('Set-Cookie', cookie);
  if (!found) return null;
  const { user } = found;
  const caller = { userId: user.id, email: user.email, name: user.name, platformAdmin: user.role === 'admin' };
  if (renewed.length === 0) memo.remember(cookieHeader, caller);
  return caller;
}

export async function requireCaller(callers: Callers, req: Request, res: Response): Promise<UserContext> {
  const caller = await findCaller(callers, req, res);
  if (!caller) throw new AppError('unauthenticated', 'Sign in to continue');
  return caller;
}

const NOT_FOUND = 'No such rink, or you are not one of its staff';

/**
 * Resolves /api/rinks/:rinkSlug to the caller's membership. A rink the caller is not a member of answers
 * exactly like a rink that does not exist, so nobody can probe for another rink's slugs or ids.
 */
export type RinkStanding = NonNullable<Awaited<ReturnType<typeof directory.findRinkBySlug>>>['standing'];

/** The caller's context at the rink of the slug, and the rink's standing with the platform. */
export async function resolveRink(caller: UserContext, slug: string): Promise<{ ctx: RinkContext; standing: RinkStanding }> {
  const found = await directory.findRinkBySlug(slug, caller.userId);
  const membership = found?.membership;
  if (!found || !membership || !isStaffRole(membership.role)) throw AppError.notFound(NOT_FOUND);
  return { ctx: { ...caller, tenantId: found.id, rinkSlug: found.slug, rinkName: found.name, role: membership.role, memberId: membership.id }, standing: found.standing };
}

function isStaffRole(role: string): role is StaffRole {
  return (STAFF_ROLES as readonly string[]).includes(role);
}
