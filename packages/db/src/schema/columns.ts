import { datetime, foreignKey, varchar, type AnyMySqlColumn } from 'drizzle-orm/mysql-core';
import { rink } from './rinks';

// Column builders every tenant table shares, so ids, times and the tenant key look the same everywhere.
export const id = () => varchar('id', { length: 36 }).primaryKey();
export const tenantId = () => varchar('tenant_id', { length: 36 }).notNull();
export const ref = (name: string) => varchar(name, { length: 36 });
export const at = (name: string) => datetime(name, { mode: 'date', fsp: 3 });
export const createdAt = () =>
  at('created_at')
    .notNull()
    .$defaultFn(() => new Date());

/** The rink a tenant row belongs to; deleting a rink deletes its rows. */
export function rinkFk(name: string, tenant: AnyMySqlColumn) {
  return foreignKey({ name, columns: [tenant], foreignColumns: [rink.id] }).onDelete('cascade');
}

/** A child row points at a parent of the same rink: (tenant_id, parent_id) → (tenant_id, id). */
export function sameRinkFk(name: string, tenant: AnyMySqlColumn, child: AnyMySqlColumn, parentTenant: AnyMySqlColumn, parentId: AnyMySqlColumn) {
  return foreignKey({ name, columns: [tenant, child], foreignColumns: [parentTenant, parentId] });
}
