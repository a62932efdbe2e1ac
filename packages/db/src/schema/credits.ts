import { index, int, mysqlEnum, mysqlTable, text, unique, varchar } from 'drizzle-orm/mysql-core';
import { at, createdAt, id, ref, rinkFk, sameRinkFk, tenantId } from './columns';
import { customer } from './customers';
import { membership, payment, product } from './billing';

// The credit ledger. Accounts hold lots; every change to a lot is an append-only entry. Entries are never
// updated or deleted: a mistake is undone by a reversal entry. A lot's `remaining` is the running sum of its
// entries, kept on the lot so that redemption reads one row; it is only changed under the account's row lock.

export const CREDIT_ACCOUNT_KINDS = ['skater', 'league_pool', 'team'] as const;

export const creditAccount = mysqlTable(
  'credit_account',
  {
    id: id(),
    tenantId: tenantId(),
    kind: mysqlEnum('kind', CREDIT_ACCOUNT_KINDS).notNull(),
    customerId: ref('customer_id'),
    leagueId: ref('league_id'),
    teamId: ref('team_id'),
    createdAt: createdAt(),
  },
  (t) => [
    unique('credit_account_tenant_id_unique').on(t.tenantId, t.id),
    unique('credit_account_tenant_customer_unique').on(t.tenantId, t.customerId),
    unique('credit_account_tenant_team_unique').on(t.tenantId, t.teamId),
    index('credit_account_tenant_league_idx').on(t.tenantId, t.leagueId),
    rinkFk('credit_account_rink_fk', t.tenantId),
    sameRinkFk('credit_account_customer_fk', t.tenantId, t.customerId, customer.tenantId, customer.id),
  ],
);

export const LOT_ORIGINS = ['purchase', 'membership', 'grant', 'adjust', 'transfer'] as const;

export const creditLot = mysqlTable(
  'credit_lot',
  {
    id: id(),
    tenantId: tenantId(),
    accountId: ref('account_id').notNull(),
    origin: mysqlEnum('origin', LOT_ORIGINS).notNull(),
    credits: int('credits').notNull(),
    remaining: int('remaining').notNull(),
    /** What the whole lot was paid, in the rink's currency; each credit is worth its cumulative-rounded share. */
    priceMinor: int('price_minor').notNull(),
    expiresAt: at('expires_at'),
    productId: ref('product_id'),
    paymentId: ref('payment_id'),
    membershipId: ref('membership_id'),
    /** The lot a transfer came from (a team allocation drawn from a league pool). */
    fromLotId: ref('from_lot_id'),
    createdAt: createdAt(),
  },
  (t) => [
    unique('credit_lot_tenant_id_unique').on(t.tenantId, t.id),
    index('credit_lot_tenant_account_idx').on(t.tenantId, t.accountId, t.expiresAt),
    index('credit_lot_tenant_expiry_idx').on(t.tenantId, t.expiresAt, t.remaining),
    index('credit_lot_tenant_payment_idx').on(t.tenantId, t.paymentId),
    rinkFk('credit_lot_rink_fk', t.tenantId),
    sameRinkFk('credit_lot_account_fk', t.tenantId, t.accountId, creditAccount.tenantId, creditAccount.id),
    sameRinkFk('credit_lot_product_fk', t.tenantId, t.productId, product.tenantId, product.id),
    sameRinkFk('credit_lot_payment_fk', t.tenantId, t.paymentId, payment.tenantId, payment.id),
    sameRinkFk('credit_lot_membership_fk', t.tenantId, t.membershipId, membership.tenantId, membership.id),
  ],
);

export const ENTRY_KINDS = ['purchase', 'grant', 'redeem', 'expire', 'refund', 'transfer', 'adjust', 'reversal'] as const;
export const ENTRY_SOURCES = ['payment', 'ticket', 'roster', 'membership', 'staff', 'league', 'system'] as const;

export const creditEntry = mysqlTable(
  'credit_entry',
  {
    id: id(),
    tenantId: tenantId(),
    accountId: ref('account_id').notNull(),
    lotId: ref('lot_id').notNull(),
    kind: mysqlEnum('kind', ENTRY_KINDS).notNull(),
    /** Signed: + adds credits to the lot, − takes them. */
    credits: int('credits').notNull(),
    /** What those credits are worth (signed like credits), from the lot's price. */
    valueMinor: int('value_minor').notNull(),
    source: mysqlEnum('source', ENTRY_SOURCES).notNull(),
    sourceId: varchar('source_id', { length: 80 }),
    reason: text('reason'),
    reversesId: ref('reverses_id'),
    /** One operation can touch several lots; its entries share the first entry's id here. */
    operationId: ref('operation_id').notNull(),
    /** The operation's idempotency key, on its first entry only (unique per rink). */
    idemKey: varchar('idem_key', { length: 120 }),
    actorUserId: ref('actor_user_id'),
    createdAt: createdAt(),
  },
  (t) => [
    unique('credit_entry_tenant_id_unique').on(t.tenantId, t.id),
    unique('credit_entry_tenant_key_unique').on(t.tenantId, t.idemKey),
    index('credit_entry_tenant_account_idx').on(t.tenantId, t.accountId, t.createdAt),
    index('credit_entry_tenant_source_idx').on(t.tenantId, t.source, t.sourceId),
    index('credit_entry_tenant_kind_idx').on(t.tenantId, t.kind, t.createdAt),
    index('credit_entry_tenant_operation_idx').on(t.tenantId, t.operationId),
    index('credit_entry_tenant_created_idx').on(t.tenantId, t.createdAt),
    rinkFk('credit_entry_rink_fk', t.tenantId),
    sameRinkFk('credit_entry_account_fk', t.tenantId, t.accountId, creditAccount.tenantId, creditAccount.id),
    sameRinkFk('credit_entry_lot_fk', t.tenantId, t.lotId, creditLot.tenantId, creditLot.id),
  ],
);
