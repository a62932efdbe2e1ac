import { datetime, foreignKey, index, int, mysqlTable, primaryKey, smallint, unique, varchar } from 'drizzle-orm/mysql-core';
import { user } from './auth';
import { rink } from './rinks';

// A skater (or a parent for a child) as a customer of one rink. A rink never sees another rink's customers;
// user_id links the record to an account once that account's verified e-mail matches.
export const customer = mysqlTable(
  'customer',
  {
    id: varchar('id', { length: 36 }).primaryKey(),
    tenantId: varchar('tenant_id', { length: 36 }).notNull(),
    name: varchar('name', { length: 200 }).notNull(),
    email: varchar('email', { length: 320 }),
    phone: varchar('phone', { length: 32 }),
    memberCode: varchar('member_code', { length: 12 }).notNull(),
    userId: varchar('user_id', { length: 36 }),
    /** The skater's choices of mail: the "ready" notice, and expiry and low-balance reminders (receipts always go). */
    /** The customer's id on the rink's payout account (memberships are billed to it). */
    paymentCustomerId: varchar('payment_customer_id', { length: 64 }),
    notifyReady: int('notify_ready').notNull().default(1),
    notifyReminders: int('notify_reminders').notNull().default(1),
    createdAt: datetime('created_at', { mode: 'date', fsp: 3 })
      .notNull()
      .$defaultFn(() => new Date()),
  },
  (t) => [
    // (tenant_id, id) is the target of every child's composite foreign key.
    unique('customer_tenant_id_unique').on(t.tenantId, t.id),
    unique('customer_tenant_code_unique').on(t.tenantId, t.memberCode),
    index('customer_tenant_email_idx').on(t.tenantId, t.email),
    index('customer_tenant_name_idx').on(t.tenantId, t.name),
    foreignKey({ name: 'customer_rink_fk', columns: [t.tenantId], foreignColumns: [rink.id] }).onDelete('cascade'),
    foreignKey({ name: 'customer_user_fk', columns: [t.userId], foreignColumns: [user.id] }).onDelete('set null'),
  ],
);

/** How much of each suffix the search index keeps; a longer query is matched on this much, then checked whole. */
export const SEARCH_TERM_LENGTH = 48;

/**
 * The counter's customer search index: every suffix of a customer's name and e-mail, of the phone's digits (from
 * three digits on), and the member code, so "a part of the name" is a prefix of one of them and an index range
 * instead of a scan of the rink's customers. Written with the customer (these are set once, at creation).
 */
export const customerSearch = mysqlTable(
  'customer_search',
  {
    tenantId: varchar('tenant_id', { length: 36 }).notNull(),
    customerId: varchar('customer_id', { length: 36 }).notNull(),
    /** Which term: the name's suffixes from 0, the e-mail's from 1000, the phone digits' from 2000, the code at 3000. */
    position: smallint('position').notNull(),
    term: varchar('term', { length: SEARCH_TERM_LENGTH }).notNull(),
  },
  (t) => [
    primaryKey({ name: 'customer_search_pk', columns: [t.tenantId, t.customerId, t.position] }),
    index('customer_search_tenant_term_idx').on(t.tenantId, t.term),
    foreignKey({ name: 'customer_search_customer_fk', columns: [t.tenantId, t.customerId], foreignColumns: [customer.tenantId, customer.id] }).onDelete('cascade'),
  ],
);

/** The rows of customerSearch for one customer (the migration that made the table writes the same ones in SQL). */
export function customerSearchRows(c: { id: string; tenantId: string; name: string; email: string | null; phone: string | null; memberCode: string }) {
  const rows: (typeof customerSearch.$inferInsert)[] = [];
  const add = (text: string, base: number, shortest: number) => {
    const lower = text.toLowerCase();
    for (let i = 0; i + shortest <= lower.length; i++) rows.push({ tenantId: c.tenantId, customerId: c.id, position: base + i, term: lower.slice(i, i + SEARCH_TERM_LENGTH) });
  };
  add(c.name, 0, 1);
  if (c.email) add(c.email, 1000, 1);
  if (c.phone) add(c.phone.replace(/\D/g, ''), 2000, 3);
  rows.push({ tenantId: c.tenantId, customerId: c.id, position: 3000, term: c.memberCode.toLowerCase() });
  return rows;
}
