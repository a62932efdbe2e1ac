import { char, datetime, foreignKey, index, mysqlEnum, mysqlTable, text, unique, varchar } from 'drizzle-orm/mysql-core';
import { user } from './auth';

// A rink is the tenant: better-auth's "organization" model, renamed. Its id is every tenant row's tenant_id.
export const rink = mysqlTable('rink', {
  id: varchar('id', { length: 36 }).primaryKey(),
  name: varchar('name', { length: 120 }).notNull(),
  slug: varchar('slug', { length: 64 }).notNull().unique('rink_slug_unique'),
  logo: text('logo'),
  metadata: text('metadata'),
  timeZone: varchar('time_zone', { length: 64 }).notNull(),
  currency: char('currency', { length: 3 }).notNull(),
  unitPreference: mysqlEnum('unit_preference', ['in', 'mm']).notNull(),
  createdAt: datetime('created_at', { mode: 'date', fsp: 3 }).notNull(),
});

// Staff and league managers. Skaters are customers, not members.
export const member = mysqlTable(
  'member',
  {
    id: varchar('id', { length: 36 }).primaryKey(),
    organizationId: varchar('tenant_id', { length: 36 }).notNull(),
    userId: varchar('user_id', { length: 36 }).notNull(),
    role: varchar('role', { length: 40 }).notNull(),
    createdAt: datetime('created_at', { mode: 'date', fsp: 3 }).notNull(),
  },
  (t) => [
    unique('member_tenant_user_unique').on(t.organizationId, t.userId),
    foreignKey({ name: 'member_rink_fk', columns: [t.organizationId], foreignColumns: [rink.id] }).onDelete('cascade'),
    foreignKey({ name: 'member_user_fk', columns: [t.userId], foreignColumns: [user.id] }).onDelete('cascade'),
  ],
);

export const invitation = mysqlTable(
  'invitation',
  {
    id: varchar('id', { length: 36 }).primaryKey(),
    organizationId: varchar('tenant_id', { length: 36 }).notNull(),
    email: varchar('email', { length: 320 }).notNull(),
    role: varchar('role', { length: 40 }),
    status: varchar('status', { length: 20 }).notNull().default('pending'),
    expiresAt: datetime('expires_at', { mode: 'date', fsp: 3 }).notNull(),
    inviterId: varchar('inviter_id', { length: 36 }).notNull(),
    createdAt: datetime('created_at', { mode: 'date', fsp: 3 })
      .notNull()
      .$defaultFn(() => new Date()),
  },
  (t) => [
    index('invitation_tenant_status_idx').on(t.organizationId, t.status),
    index('invitation_tenant_email_idx').on(t.organizationId, t.email),
    foreignKey({ name: 'invitation_rink_fk', columns: [t.organizationId], foreignColumns: [rink.id] }).onDelete('cascade'),
    foreignKey({ name: 'invitation_inviter_fk', columns: [t.inviterId], foreignColumns: [user.id] }).onDelete('cascade'),
  ],
);
