import { platform } from '@rinkwright/db';
import { AppError } from '../../http/errors';

// The platform admin's brake: a suspended rink's staff routes, public page and checkout answer nothing but
// why, while its data, its skaters' credits and the payment service's webhooks carry on untouched.

export async function suspendRink(rinkId: string, reason: string, feeBps: number): Promise<{ ok: true }> {
  if (!(await platform.setSuspension(rinkId, { reason }, feeBps))) throw AppError.notFound('No such rink');
  return { ok: true };
}

export async function reactivateRink(rinkId: string, feeBps: number): Promise<{ ok: true }> {
  if (!(await platform.setSuspension(rinkId, null, feeBps))) throw AppError.notFound('No such rink');
  return { ok: true };
}
