import { datetime, foreignKey, index, int, mysqlTable, unique, varchar } from 'drizzle-orm/mysql-core';
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
