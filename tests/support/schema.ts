import { is } from 'drizzle-orm';
import { getTableConfig, MySqlTable } from 'drizzle-orm/mysql-core';
import * as schema from '@rinkwright/db/schema';

/** Every table the schema exports, found by kind so that a new table is picked up without listing it. */
export function tablesOf(module: Record<string, unknown>): MySqlTable[] {
  return Object.values(module).filter((value): value is MySqlTable => is(value, MySqlTable));
}

export const allTables = (): MySqlTable[] => tablesOf(schema);

export const tableName = (table: MySqlTable): string => getTableConfig(table).name;
