import { eq } from 'drizzle-orm';
import { customer, directory, invitation, member, scoped, type RinkSettings } from '@rinkwright/db';

export const findRinkBySlug = (slug: string) => directory.findRinkBySlug(slug);

export async function readRinkWithCounts(tenantId: string) {
  const scope = scoped(tenantId);
  const [rink, members, pendingInvitations, customers] = await Promise.all([
    scope.rink(),
    scope.count(member),
    scope.count(invitation, eq(invitation.status, 'pending')),
    scope.count(customer),
  ]);
  return rink ? { rink, counts: { members, pendingInvitations, customers } } : undefined;
}

export function updateRink(tenantId: string, set: RinkSettings) {
  return scoped(tenantId).updateRink(set);
}
