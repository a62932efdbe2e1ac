import { desc, eq, sql } from 'drizzle-orm';
import { currentDb } from './client';
import { customer, member, rink } from './schema/index';

// Reads across every rink, for the platform admin only (the route table gates them with access 'platform').
export async function listRinksWithCounts() {
  return currentDb()
    .select({
      id: rink.id,
      slug: rink.slug,
      name: rink.name,
      timeZone: rink.timeZone,
      currency: rink.currency,
      createdAt: rink.createdAt,
      members: sql<number>`(select count(*) from ${member} where ${eq(member.organizationId, rink.id)})`.mapWith(Number),
      customers: sql<number>`(select count(*) from ${customer} where ${eq(customer.tenantId, rink.id)})`.mapWith(Number),
    })
    .from(rink)
    .orderBy(desc(rink.createdAt));
}
