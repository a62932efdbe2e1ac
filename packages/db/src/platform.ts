import { desc, eq, sql } from 'drizzle-orm';
import { currentDb } from './client';
import { customer, member, rink } from './schema/index';

// Reads across every rink, for the platform admin only (the route table gates them with access 'platform').
export async function listRinksWithCounts() {
  const members = currentDb()
    .select({ tenantId: member.organizationId, n: sql<number>`count(*)`.as('n') })
    .from(member)
    .groupBy(member.organizationId)
    .as('m');
  const customers = currentDb()
    .select({ tenantId: customer.tenantId, n: sql<number>`count(*)`.as('n') })
    .from(customer)
    .groupBy(customer.tenantId)
    .as('c');
  return currentDb()
    .select({
      id: rink.id,
      slug: rink.slug,
      name: rink.name,
      timeZone: rink.timeZone,
      currency: rink.currency,
      createdAt: rink.createdAt,
      members: sql<number>`coalesce(${members.n}, 0)`,
      customers: sql<number>`coalesce(${customers.n}, 0)`,
    })
    .from(rink)
    .leftJoin(members, eq(members.tenantId, rink.id))
    .leftJoin(customers, eq(customers.tenantId, rink.id))
    .orderBy(desc(rink.createdAt));
}
