import { getTableConfig, type MySqlTable } from 'drizzle-orm/mysql-core';

// Tables that are not owned by one rink. Every other table is a tenant table and must have a NOT NULL
// tenant_id that leads each of its indexes (so every tenant query is an index range on its own rink).
export const GLOBAL_TABLES: ReadonlySet<string> = new Set([
  'user',
  'session',
  'account',
  'verification',
  'rate_limit',
  'rink',
  '__drizzle_migrations',
  'outbox_mail',
  'payment_event',
  'payment_setting',
  'job_run',
]);

export function isTenantTable(name: string): boolean {
  return !GLOBAL_TABLES.has(name);
}

/** Returns one line per broken rule; an empty list means every tenant table follows the tenancy rule. */
export function checkTenancy(tables: MySqlTable[]): string[] {
  const problems: string[] = [];
  for (const table of tables) {
    const config = getTableConfig(table);
    if (!isTenantTable(config.name)) continue;
    const tenant = config.columns.find((c) => c.name === 'tenant_id');
    if (!tenant) {
      problems.push(`${config.name}: no tenant_id column`);
      continue;
    }
    if (!tenant.notNull) problems.push(`${config.name}: tenant_id is nullable`);
    const leading = [
      ...config.indexes.map((i) => ({ name: i.config.name, first: columnName(i.config.columns[0]) })),
      ...config.uniqueConstraints.map((u) => ({ name: u.getName() ?? 'unique', first: u.columns[0]?.name })),
      ...config.primaryKeys.map((p) => ({ name: p.getName(), first: p.columns[0]?.name })),
      // A column-level unique spans every rink: one rink could learn another's values from a duplicate-key error.
      ...config.columns.filter((c) => c.isUnique).map((c) => ({ name: c.uniqueName ?? `${c.name} unique`, first: c.name })),
    ];
    if (!leading.some((i) => i.first === 'tenant_id')) problems.push(`${config.name}: no index leads with tenant_id`);
    for (const i of leading) {
      if (i.first !== 'tenant_id') problems.push(`${config.name}: index ${i.name} does not lead with tenant_id`);
    }
  }
  return problems;
}

function columnName(column: unknown): string | undefined {
  return column && typeof column === 'object' && 'name' in column ? String(column.name) : undefined;
}
