import type { Request } from 'express';
import { fromNodeHeaders } from 'better-auth/node';
import type { CreateRinkInput, RinkSummary, UpdateRinkInput } from '@rinkwright/core';
import { permissionsOf } from '../../access';
import type { Auth } from '../../auth';
import { AppError, fromAuthError } from '../../http/errors';
import type { RinkContext } from '../../http/route';
import { findRinkBySlug, readRinkWithCounts, updateRink } from './repository';

/** Self-service sign-up of a rink: the caller becomes its owner. */
export async function createRink(auth: Auth, req: Request, input: CreateRinkInput): Promise<{ slug: string }> {
  if (await findRinkBySlug(input.slug)) throw AppError.field('slug', 'That address is taken; try another');
  try {
    await auth.api.createOrganization({ headers: fromNodeHeaders(req.headers), body: { ...input, keepCurrentActiveOrganization: true } });
  } catch (error) {
    if (await findRinkBySlug(input.slug)) throw AppError.field('slug', 'That address is taken; try another');
    throw fromAuthError(error);
  }
  return { slug: input.slug };
}

export async function summarizeRink(ctx: RinkContext): Promise<RinkSummary> {
  const found = await readRinkWithCounts(ctx.tenantId);
  if (!found) throw AppError.notFound();
  const { rink, counts } = found;
  return {
    id: rink.id,
    slug: rink.slug,
    name: rink.name,
    timeZone: rink.timeZone,
    currency: rink.currency,
    unitPreference: rink.unitPreference,
    role: ctx.role,
    permissions: permissionsOf(ctx.role),
    counts,
    createdAt: rink.createdAt.toISOString(),
  };
}

export async function changeRinkSettings(ctx: RinkContext, input: UpdateRinkInput): Promise<RinkSummary> {
  if (Object.keys(input).length > 0) await updateRink(ctx.tenantId, input);
  return summarizeRink(ctx);
}
