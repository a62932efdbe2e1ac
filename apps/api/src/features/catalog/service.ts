import { randomUUID } from 'node:crypto';
import type { ServiceInput, ServiceRow } from '@rinkwright/core';
import { AppError } from '../../http/errors';
import type { RinkContext } from '../../http/route';
import * as repo from './repository';

const toRow = (s: NonNullable<Awaited<ReturnType<typeof repo.findService>>>): ServiceRow => ({
  id: s.id,
  name: s.name,
  kind: s.kind,
  priceMinor: s.priceMinor,
  active: s.active === 1,
});

export async function listServices(ctx: RinkContext): Promise<{ services: ServiceRow[] }> {
  return { services: (await repo.listServices(ctx.tenantId)).map(toRow) };
}

export async function addService(ctx: RinkContext, input: ServiceInput): Promise<ServiceRow> {
  const id = randomUUID();
  await repo.insertService(ctx.tenantId, { id, ...input, active: input.active ? 1 : 0 });
  const made = await repo.findService(ctx.tenantId, id);
  if (!made) throw new AppError('internal', 'The service was not saved');
  return toRow(made);
}

/** Services are changed in place here; the billing work versions their prices for the payment service. */
export async function changeService(ctx: RinkContext, serviceId: string, input: ServiceInput): Promise<ServiceRow> {
  if (!(await repo.findService(ctx.tenantId, serviceId))) throw AppError.notFound('No such service at this rink');
  await repo.updateService(ctx.tenantId, serviceId, { ...input, active: input.active ? 1 : 0 });
  const saved = await repo.findService(ctx.tenantId, serviceId);
  if (!saved) throw AppError.notFound('No such service at this rink');
  return toRow(saved);
}
