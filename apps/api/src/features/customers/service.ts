import { randomUUID } from 'node:crypto';
import { type CreateCustomerInput, type CustomerRow, type SkateProfileInput, type SkateProfileRow } from '@rinkwright/core';
import { scoped } from '@rinkwright/db';
import { AppError } from '../../http/errors';
import type { RinkContext } from '../../http/route';
import { insertNewCustomer } from '../../lib/customers';
import * as repo from './repository';

type Customer = NonNullable<Awaited<ReturnType<typeof repo.findCustomer>>>;

export const toCustomerRow = (c: Customer): CustomerRow => ({
  id: c.id,
  name: c.name,
  email: c.email,
  phone: c.phone,
  memberCode: c.memberCode,
  linked: c.userId !== null,
  createdAt: c.createdAt.toISOString(),
});

const toProfileRow = (p: NonNullable<Awaited<ReturnType<typeof repo.findProfile>>>): SkateProfileRow => ({
  id: p.id,
  label: p.label,
  bladeWidthNm: p.bladeWidthNm,
  preferredHollowNm: p.preferredHollowNm,
  profileRadiusNm: p.profileRadiusNm,
  notes: p.notes,
  updatedAt: p.updatedAt.toISOString(),
});

export async function findCustomers(ctx: RinkContext, q: string): Promise<{ customers: CustomerRow[] }> {
  return { customers: (await repo.searchCustomers(ctx.tenantId, q)).map(toCustomerRow) };
}

export async function requireCustomer(ctx: RinkContext, customerId: string): Promise<Customer> {
  const found = await repo.findCustomer(ctx.tenantId, customerId);
  if (!found) throw AppError.notFound('No such customer at this rink');
  return found;
}

/** A walk-up in two fields. If an account with this e-mail is verified, the record is linked to it at once. */
export async function addCustomer(ctx: RinkContext, input: CreateCustomerInput): Promise<CustomerRow> {
  const id = await insertNewCustomer(scoped(ctx.tenantId), { name: input.name, email: input.email ?? null, phone: input.phone ?? null });
  return toCustomerRow(await requireCustomer(ctx, id));
}

export async function describeCustomer(ctx: RinkContext, customerId: string) {
  const found = await requireCustomer(ctx, customerId);
  const [profiles, tickets] = await Promise.all([repo.profilesOf(ctx.tenantId, customerId), repo.ticketsOf(ctx.tenantId, customerId)]);
  return {
    customer: toCustomerRow(found),
    profiles: profiles.map(toProfileRow),
    tickets: tickets.map((t) => ({ id: t.id, number: t.number, state: t.state, droppedAt: t.droppedAt.toISOString(), readyAt: t.readyAt?.toISOString() ?? null })),
  };
}

export async function addProfile(ctx: RinkContext, customerId: string, input: SkateProfileInput): Promise<SkateProfileRow> {
  await requireCustomer(ctx, customerId);
  const id = randomUUID();
  await repo.insertProfile(ctx.tenantId, { id, customerId, ...input, updatedAt: new Date() });
  const made = await repo.findProfile(ctx.tenantId, customerId, id);
  if (!made) throw new AppError('internal', 'The profile was not saved');
  return toProfileRow(made);
}

export async function changeProfile(ctx: RinkContext, customerId: string, profileId: string, input: SkateProfileInput): Promise<SkateProfileRow> {
  if (!(await repo.findProfile(ctx.tenantId, customerId, profileId))) throw AppError.notFound('No such skate profile for this customer');
  await repo.updateProfile(ctx.tenantId, profileId, { ...input, updatedAt: new Date() });
  const saved = await repo.findProfile(ctx.tenantId, customerId, profileId);
  if (!saved) throw AppError.notFound('No such skate profile for this customer');
  return toProfileRow(saved);
}
