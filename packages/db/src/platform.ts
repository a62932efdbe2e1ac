import { desc, eq, sql } from 'drizzle-orm';
import { currentDb } from './client';
import { customer, member, reportMoneyDay, reportWorkDay, rink, rinkBilling, ROLLUP_KEY, station } from './schema/index';

// Reads across every rink, for the platform admin only (the route table gates them with access 'platform').
export async function listRinksWithCounts() {
  const since = new Date(Date.now() - 30 * 86_400_000).toISOString().slice(0, 10);
  return currentDb()
    .select({
      id: rink.id,
      slug: rink.slug,
      name: rink.name,
      timeZone: rink.timeZone,
      currency: rink.currency,
      unitPreference: rink.unitPreference,
      createdAt: rink.createdAt,
      members: sql<number>`(select count(*) from ${member} where ${eq(member.organizationId, rink.id)})`.mapWith(Number),
      customers: sql<number>`(select count(*) from ${customer} where ${eq(customer.tenantId, rink.id)})`.mapWith(Number),
      activeStations: sql<number>`(select count(*) from ${station} where ${station.tenantId} = ${rink.id} and ${station.status} = 'active')`.mapWith(Number),
      planState: rinkBilling.planState,
      planStations: rinkBilling.planStations,
      planGraceUntil: rinkBilling.planGraceUntil,
      suspendedAt: rinkBilling.suspendedAt,
      suspendedReason: rinkBilling.suspendedReason,
      // From the report summaries: pairs (each day's rollup row) and platform fees of the last 30 days.
      pairs30d: sql<number>`(select coalesce(sum(${reportWorkDay.pairs}), 0) from ${reportWorkDay} where ${reportWorkDay.tenantId} = ${rink.id} and ${reportWorkDay.day} >= ${since} and ${reportWorkDay.stationId} = ${ROLLUP_KEY} and ${reportWorkDay.technicianId} = ${ROLLUP_KEY})`.mapWith(Number),
      feesMinor30d: sql<number>`(select coalesce(sum(${reportMoneyDay.feesMinor}), 0) from ${reportMoneyDay} where ${reportMoneyDay.tenantId} = ${rink.id} and ${reportMoneyDay.day} >= ${since})`.mapWith(Number),
    })
    .from(rink)
    .leftJoin(rinkBilling, eq(rinkBilling.tenantId, rink.id))
    .orderBy(desc(rink.createdAt));
}

/**
 * Suspends a rink (a reason given) or reactivates it (null). The rink's billing row is made if it has none yet,
 * with the platform's fee, as the rink's own billing page would make it.
 */
export async function setSuspension(rinkId: string, suspension: { reason: string } | null, feeBps: number): Promise<boolean> {
  const [found] = await currentDb().select({ id: rink.id }).from(rink).where(eq(rink.id, rinkId)).limit(1);
  if (!found) return false;
  const now = new Date();
  const set = { suspendedAt: suspension ? now : null, suspendedReason: suspension?.reason ?? null, updatedAt: now };
  await currentDb()
    .insert(rinkBilling)
    .values({ tenantId: rinkId, feeBps, ...set })
    .onDuplicateKeyUpdate({ set });
  return true;
}
