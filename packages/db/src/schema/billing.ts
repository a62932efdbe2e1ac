import { char, index, int, mysqlEnum, mysqlTable, primaryKey, text, unique, varchar } from 'drizzle-orm/mysql-core';
import { at, createdAt, id, ref, rinkFk, sameRinkFk, tenantId } from './columns';
import { customer } from './customers';

// What a rink sells and what was paid. MariaDB is the book of record; the payment service's ids are kept beside
// each row so that its webhooks can be matched, but no balance is ever read back from it.

export const PRODUCT_KINDS = ['punch_card', 'membership', 'league_pack', 'single'] as const;

export const product = mysqlTable(
  'product',
  {
    id: id(),
    tenantId: tenantId(),
    kind: mysqlEnum('kind', PRODUCT_KINDS).notNull(),
    name: varchar('name', { length: 120 }).notNull(),
    description: text('description'),
    /** Credits per card, per membership period, per league pack, or per single service. */
    credits: int('credits').notNull(),
    /** Months a purchased lot can be used; null: no expiry (memberships use the period). */
    monthsValid: int('months_valid'),
    /** Memberships only: credits that carry into the next period, and days of grace after a failed renewal. */
    rolloverCap: int('rollover_cap'),
    graceDays: int('grace_days'),
    interval: mysqlEnum('interval', ['month', 'year']),
    active: int('active').notNull().default(1),
    /** Sold on the public page (league packs are sold to league managers only). */
    listed: int('listed').notNull().default(1),
    paymentProductId: varchar('payment_product_id', { length: 64 }),
    createdAt: createdAt(),
    updatedAt: at('updated_at').notNull(),
  },
  (t) => [
    unique('product_tenant_id_unique').on(t.tenantId, t.id),
    index('product_tenant_kind_idx').on(t.tenantId, t.kind, t.active),
    rinkFk('product_rink_fk', t.tenantId),
  ],
);

/** Prices are versioned: a new price is a new row, and the old one is retired, never edited. */
export const productPrice = mysqlTable(
  'product_price',
  {
    id: id(),
    tenantId: tenantId(),
    productId: ref('product_id').notNull(),
    amountMinor: int('amount_minor').notNull(),
    currency: char('currency', { length: 3 }).notNull(),
    paymentPriceId: varchar('payment_price_id', { length: 64 }),
    retiredAt: at('retired_at'),
    createdAt: createdAt(),
  },
  (t) => [
    unique('product_price_tenant_id_unique').on(t.tenantId, t.id),
    index('product_price_tenant_product_idx').on(t.tenantId, t.productId, t.createdAt),
    rinkFk('product_price_rink_fk', t.tenantId),
    sameRinkFk('product_price_product_fk', t.tenantId, t.productId, product.tenantId, product.id),
  ],
);

export const PAYMENT_STATES = ['pending', 'paid', 'failed', 'refunded', 'partially_refunded'] as const;

/** One payment from a skater or a league manager: a checkout, a counter sale, or a membership invoice. */
export const payment = mysqlTable(
  'payment',
  {
    id: id(),
    tenantId: tenantId(),
    customerId: ref('customer_id'),
    leagueId: ref('league_id'),
    productId: ref('product_id').notNull(),
    priceId: ref('price_id').notNull(),
    membershipId: ref('membership_id'),
    channel: mysqlEnum('channel', ['online', 'counter']).notNull(),
    state: mysqlEnum('state', PAYMENT_STATES).notNull(),
    amountMinor: int('amount_minor').notNull(),
    currency: char('currency', { length: 3 }).notNull(),
    feeMinor: int('fee_minor').notNull(),
    refundedMinor: int('refunded_minor').notNull().default(0),
    checkoutSessionId: varchar('checkout_session_id', { length: 80 }),
    paymentIntentId: varchar('payment_intent_id', { length: 80 }),
    invoiceId: varchar('invoice_id', { length: 80 }),
    /** The payment service's own time of the latest state we applied, so an older event never undoes a newer one. */
    serviceUpdatedAt: int('service_updated_at').notNull().default(0),
    createdBy: ref('created_by'),
    paidAt: at('paid_at'),
    createdAt: createdAt(),
  },
  (t) => [
    unique('payment_tenant_id_unique').on(t.tenantId, t.id),
    unique('payment_tenant_session_unique').on(t.tenantId, t.checkoutSessionId),
    unique('payment_tenant_intent_unique').on(t.tenantId, t.paymentIntentId),
    unique('payment_tenant_invoice_unique').on(t.tenantId, t.invoiceId),
    index('payment_tenant_customer_idx').on(t.tenantId, t.customerId, t.createdAt),
    index('payment_tenant_paid_idx').on(t.tenantId, t.paidAt),
    rinkFk('payment_rink_fk', t.tenantId),
    sameRinkFk('payment_customer_fk', t.tenantId, t.customerId, customer.tenantId, customer.id),
    sameRinkFk('payment_product_fk', t.tenantId, t.productId, product.tenantId, product.id),
    sameRinkFk('payment_price_fk', t.tenantId, t.priceId, productPrice.tenantId, productPrice.id),
  ],
);

export const refund = mysqlTable(
  'refund',
  {
    id: id(),
    tenantId: tenantId(),
    paymentId: ref('payment_id').notNull(),
    amountMinor: int('amount_minor').notNull(),
    credits: int('credits').notNull(),
    paymentRefundId: varchar('payment_refund_id', { length: 80 }),
    reason: text('reason'),
    createdBy: ref('created_by').notNull(),
    createdAt: createdAt(),
  },
  (t) => [
    unique('refund_tenant_id_unique').on(t.tenantId, t.id),
    index('refund_tenant_payment_idx').on(t.tenantId, t.paymentId),
    index('refund_tenant_created_idx').on(t.tenantId, t.createdAt),
    rinkFk('refund_rink_fk', t.tenantId),
    sameRinkFk('refund_payment_fk', t.tenantId, t.paymentId, payment.tenantId, payment.id),
  ],
);

export const MEMBERSHIP_STATES = ['incomplete', 'active', 'past_due', 'blocked', 'canceled'] as const;

/** A skater's subscription to a membership product. Its credits arrive as one lot per paid period. */
export const membership = mysqlTable(
  'membership',
  {
    id: id(),
    tenantId: tenantId(),
    customerId: ref('customer_id').notNull(),
    productId: ref('product_id').notNull(),
    subscriptionId: varchar('subscription_id', { length: 80 }).notNull(),
    state: mysqlEnum('state', MEMBERSHIP_STATES).notNull(),
    periodStart: at('period_start'),
    periodEnd: at('period_end'),
    cancelAtPeriodEnd: int('cancel_at_period_end').notNull().default(0),
    /** Set when a renewal fails: redemption of its credits stops after this time unless a payment arrives. */
    graceUntil: at('grace_until'),
    serviceUpdatedAt: int('service_updated_at').notNull().default(0),
    createdAt: createdAt(),
    updatedAt: at('updated_at').notNull(),
  },
  (t) => [
    unique('membership_tenant_id_unique').on(t.tenantId, t.id),
    unique('membership_tenant_subscription_unique').on(t.tenantId, t.subscriptionId),
    index('membership_tenant_customer_idx').on(t.tenantId, t.customerId),
    index('membership_tenant_state_idx').on(t.tenantId, t.state),
    rinkFk('membership_rink_fk', t.tenantId),
    sameRinkFk('membership_customer_fk', t.tenantId, t.customerId, customer.tenantId, customer.id),
    sameRinkFk('membership_product_fk', t.tenantId, t.productId, product.tenantId, product.id),
  ],
);

export const PLAN_STATES = ['none', 'active', 'past_due', 'read_only', 'canceled'] as const;

/** A rink's side of the payment service: its payout account, and its own plan with the platform. One row per rink. */
export const rinkBilling = mysqlTable(
  'rink_billing',
  {
    tenantId: tenantId(),
    connectedAccountId: varchar('connected_account_id', { length: 64 }),
    chargesEnabled: int('charges_enabled').notNull().default(0),
    /** The platform's fee on each sale, in basis points of the amount. */
    feeBps: int('fee_bps').notNull(),
    planCustomerId: varchar('plan_customer_id', { length: 64 }),
    planSubscriptionId: varchar('plan_subscription_id', { length: 64 }),
    planState: mysqlEnum('plan_state', PLAN_STATES).notNull().default('none'),
    planStations: int('plan_stations').notNull().default(0),
    planPeriodEnd: at('plan_period_end'),
    planGraceUntil: at('plan_grace_until'),
    planServiceUpdatedAt: int('plan_service_updated_at').notNull().default(0),
    /** Test mode only: the payment service's test clock that memberships and the plan of this rink run on. */
    testClockId: varchar('test_clock_id', { length: 64 }),
    platformTestClockId: varchar('platform_test_clock_id', { length: 64 }),
    /** Set by the platform admin: a suspended rink's staff and public page answer nothing until it is reactivated. */
    suspendedAt: at('suspended_at'),
    suspendedReason: varchar('suspended_reason', { length: 300 }),
    updatedAt: at('updated_at').notNull(),
  },
  (t) => [primaryKey({ name: 'rink_billing_pk', columns: [t.tenantId] }), rinkFk('rink_billing_rink_fk', t.tenantId)],
);
