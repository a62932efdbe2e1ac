import { and, asc, desc, eq, gte, inArray, sql, sum, type SQL } from 'drizzle-orm';
import {
  creditEntry,
  creditLot,
  customer,
  membership,
  payment,
  product,
  productPrice,
  qualified,
  refund,
  rinkBilling,
  isDuplicateKey,
  station,
  type Scope,
} from '@rinkwright/db';

// Tenant-scoped queries of the catalog, payments, refunds, memberships and the rink's billing row.

export type ProductRecord = typeof product.$inferSelect;
export type PriceRecord = typeof productPrice.$inferSelect;
export type PaymentRecord = typeof payment.$inferSelect;
export type MembershipRecord = typeof membership.$inferSelect;
export type BillingRecord = typeof rinkBilling.$inferSelect;
/** A row's new values; a column may also take an SQL expression of the row (the grace helpers below). */
type SetOf<Row> = { [K in keyof Row]?: Row[K] | SQL };

/**
 * The grace after a failed payment starts once: the row keeps a grace end it already has, so deliveries of one
 * failure handled at the same moment cannot each start their own.
 */
export const planGraceFrom = (until: Date) => sql`coalesce(${rinkBilling.planGraceUntil}, ${sql.param(until, rinkBilling.planGraceUntil)})`;
export const membershipGraceFrom = (until: Date) => sql`coalesce(${membership.graceUntil}, ${sql.param(until, membership.graceUntil)})`;

// ---- catalog ----
export const listProducts = (s: Scope) => s.find(product, { orderBy: [asc(product.kind), asc(product.name)] });
export const findProduct = (s: Scope, id: string) => s.findOne(product, eq(product.id, id));
export const insertProduct = (s: Scope, row: Omit<typeof product.$inferInsert, 'tenantId'>) => s.insert(product, row);
export const updateProduct = (s: Scope, id: string, set: Partial<typeof product.$inferInsert>) => s.update(product, set, eq(product.id, id));
export const pricesOf = (s: Scope, productIds: string[]) =>
  productIds.length ? s.find(productPrice, { where: inArray(productPrice.productId, productIds), orderBy: [desc(productPrice.createdAt), desc(productPrice.id)] }) : Promise.resolve([]);
export const insertPrice = (s: Scope, row: Omit<typeof productPrice.$inferInsert, 'tenantId'>) => s.insert(productPrice, row);
export const updatePrice = (s: Scope, id: string, set: Partial<typeof productPrice.$inferInsert>) => s.update(productPrice, set, eq(productPrice.id, id));
export const findPrice = (s: Scope, id: string) => s.findOne(productPrice, eq(productPrice.id, id));

// ---- the rink's billing row ----
export const findBilling = (s: Scope) => s.findOne(rinkBilling, s.filter(rinkBilling));
export async function ensureBilling(s: Scope, feeBps: number): Promise<BillingRecord> {
  const found = await findBilling(s);
  if (found) return found;
  try {
    await s.insert(rinkBilling, { feeBps, updatedAt: new Date() });
  } catch (error) {
    // A concurrent request made it a moment ago; anything else is a real failure.
    if (!isDuplicateKey(error)) throw error;
  }
  const made = await findBilling(s);
  if (!made) throw new Error('rink billing row missing');
  return made;
}
export const updateBilling = (s: Scope, set: SetOf<typeof rinkBilling.$inferInsert>) => s.update(rinkBilling, { ...set, updatedAt: new Date() }, s.filter(rinkBilling));
export const countActiveStations = (s: Scope) => s.count(station, eq(station.status, 'active'));

// ---- customers ----
export const findCustomer = (s: Scope, id: string) => s.findOne(customer, eq(customer.id, id));
export const findCustomerByEmail = (s: Scope, email: string) => s.findOne(customer, eq(customer.email, email));
export const setPaymentCustomer = (s: Scope, customerId: string, paymentCustomerId: string) => s.update(customer, { paymentCustomerId }, eq(customer.id, customerId));

// ---- payments and refunds ----
export const insertPayment = (s: Scope, row: Omit<typeof payment.$inferInsert, 'tenantId'>) => s.insert(payment, row);
export const findPayment = (s: Scope, id: string) => s.findOne(payment, eq(payment.id, id));
export const lockPayment = async (s: Scope, id: string) => (await s.lock(payment, eq(payment.id, id)))[0];
export const findPaymentBySession = (s: Scope, sessionId: string) => s.findOne(payment, eq(payment.checkoutSessionId, sessionId));
export const findPaymentByInvoice = (s: Scope, invoiceId: string) => s.findOne(payment, eq(payment.invoiceId, invoiceId));
export const updatePayment = (s: Scope, id: string, set: Partial<typeof payment.$inferInsert>) => s.update(payment, set, eq(payment.id, id));
export const insertRefund = (s: Scope, row: Omit<typeof refund.$inferInsert, 'tenantId'>) => s.insert(refund, row);
export const updateRefund = (s: Scope, id: string, set: Partial<typeof refund.$inferInsert>) => s.update(refund, set, eq(refund.id, id));
export const removeRefund = (s: Scope, id: string) => s.remove(refund, eq(refund.id, id));

export function paymentsWhere(s: Scope, where: { customerId?: string; leagueId?: string; paymentIds?: string[] }, limit = 100) {
  const cond = and(
    where.customerId ? eq(payment.customerId, where.customerId) : undefined,
    where.leagueId ? eq(payment.leagueId, where.leagueId) : undefined,
    where.paymentIds ? inArray(payment.id, where.paymentIds.length ? where.paymentIds : ['-']) : undefined,
  );
  return s.findJoined(payment, {
    fields: {
      id: payment.id,
      productName: product.name,
      productKind: product.kind,
      channel: payment.channel,
      state: payment.state,
      amountMinor: payment.amountMinor,
      feeMinor: payment.feeMinor,
      refundedMinor: payment.refundedMinor,
      currency: payment.currency,
      paidAt: payment.paidAt,
      createdAt: payment.createdAt,
    },
    joins: [{ table: product, on: eq(product.id, payment.productId) }],
    where: cond,
    orderBy: [desc(payment.createdAt)],
    limit,
  });
}
export const refundsOf = (s: Scope, paymentIds: string[]) =>
  paymentIds.length ? s.find(refund, { where: inArray(refund.paymentId, paymentIds), orderBy: asc(refund.createdAt) }) : Promise.resolve([]);

// ---- memberships ----
export const findMembership = (s: Scope, id: string) => s.findOne(membership, eq(membership.id, id));
export const findMembershipBySubscription = (s: Scope, subscriptionId: string) => s.findOne(membership, eq(membership.subscriptionId, subscriptionId));
export const insertMembership = (s: Scope, row: Omit<typeof membership.$inferInsert, 'tenantId'>) => s.insert(membership, row);
export const updateMembership = (s: Scope, id: string, set: SetOf<typeof membership.$inferInsert>) => s.update(membership, set, eq(membership.id, id));
export function membershipsOf(s: Scope, customerId: string) {
  return s.findJoined(membership, {
    fields: {
      id: membership.id,
      productName: product.name,
      state: membership.state,
      periodEnd: membership.periodEnd,
      cancelAtPeriodEnd: membership.cancelAtPeriodEnd,
      graceUntil: membership.graceUntil,
      creditsPerPeriod: product.credits,
      interval: product.interval,
      productId: product.id,
    },
    joins: [{ table: product, on: eq(product.id, membership.productId) }],
    where: eq(membership.customerId, customerId),
    orderBy: desc(membership.createdAt),
  });
}

// ---- the rink's liability ----
export function outstandingLots(s: Scope, now: Date) {
  return s.findJoined(creditLot, {
    fields: {
      id: creditLot.id,
      credits: creditLot.credits,
      remaining: creditLot.remaining,
      priceMinor: creditLot.priceMinor,
      expiresAt: creditLot.expiresAt,
      createdAt: creditLot.createdAt,
      productName: sql<string | null>`(select ${product.name} from ${product} where ${product.tenantId} = ${qualified(creditLot, creditLot.tenantId)} and ${product.id} = ${qualified(creditLot, creditLot.productId)})`,
    },
    joins: [],
    where: and(sql`${creditLot.remaining} > 0`, sql`(${creditLot.expiresAt} is null or ${creditLot.expiresAt} > ${now})`),
  });
}
export async function entryTotalsSince(s: Scope, since: Date) {
  const rows = await s.findJoined(creditEntry, {
    fields: { kind: creditEntry.kind, credits: sum(creditEntry.credits).mapWith(Number), value: sum(creditEntry.valueMinor).mapWith(Number) },
    joins: [],
    where: gte(creditEntry.createdAt, since),
    groupBy: [creditEntry.kind],
  });
  return rows;
}
export async function paidSince(s: Scope, since: Date) {
  const [row] = await s.findJoined(payment, { fields: { total: sum(payment.amountMinor).mapWith(Number), refunded: sum(payment.refundedMinor).mapWith(Number) }, joins: [], where: gte(payment.paidAt, since) });
  return { soldMinor: row?.total ?? 0, refundedMinor: row?.refunded ?? 0 };
}

