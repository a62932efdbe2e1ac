import { describe, expect, it } from 'vitest';
import { checkTenancy, GLOBAL_TABLES } from '@rinkwright/db';
import { allTables, tableName } from '../support/schema';
import * as broken from './fixtures/broken-schema';

describe('tenancy rule of the schema', () => {
  it('finds the tables of the schema, tenant tables among them', () => {
    const names = allTables().map(tableName);

    // Guards the next test: an empty or global-only list would pass checkTenancy without checking anything.
    expect(names).toEqual(expect.arrayContaining(['rink', 'member', 'invitation', 'customer', 'user']));
    expect(names.filter((n) => !GLOBAL_TABLES.has(n)).length).toBeGreaterThanOrEqual(3);
  });

  it('holds for every table of @rinkwright/db/schema', () => {
    expect(checkTenancy(allTables())).toEqual([]);
  });

  it('reports a tenant table without tenant_id', () => {
    expect(checkTenancy([broken.ticketWithoutTenant])).toEqual(['fixture_ticket_without_tenant: no tenant_id column']);
  });

  it('reports a nullable tenant_id', () => {
    expect(checkTenancy([broken.noteWithNullableTenant])).toEqual(['fixture_note_nullable_tenant: tenant_id is nullable']);
  });

  it('reports an index that does not lead with tenant_id', () => {
    expect(checkTenancy([broken.visitWithMisorderedIndex])).toEqual([
      'fixture_visit_misordered_index: index fixture_visit_time_idx does not lead with tenant_id',
    ]);
  });

  it('reports a unique constraint across rinks', () => {
    expect(checkTenancy([broken.wheelWithGlobalUnique])).toEqual([
      'fixture_wheel_global_unique: index fixture_wheel_serial_unique does not lead with tenant_id',
    ]);
  });

  // A column-level .unique() is a unique index across every rink just like a table-level one: it lets one rink
  // learn another's values from a duplicate-key error, and it is not an index range on the rink.
  it('reports a column-level unique across rinks', () => {
    expect(checkTenancy([broken.bandWithColumnUnique])).toEqual([
      'fixture_band_column_unique: index fixture_band_code_unique does not lead with tenant_id',
    ]);
  });

  it('accepts a well-formed tenant table', () => {
    expect(checkTenancy([broken.wellFormedTenantTable])).toEqual([]);
  });
});
