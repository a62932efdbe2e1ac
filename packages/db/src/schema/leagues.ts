import { char, index, int, mysqlTable, unique, varchar } from 'drizzle-orm/mysql-core';
import { createdAt, id, ref, rinkFk, sameRinkFk, tenantId } from './columns';
import { customer } from './customers';

// A rink's leagues, their teams and players. The league's pool and each team's allocation are credit accounts.

export const league = mysqlTable(
  'league',
  {
    id: id(),
    tenantId: tenantId(),
    name: varchar('name', { length: 120 }).notNull(),
    season: varchar('season', { length: 40 }),
    /** The league manager (a member of the rink) who runs it. */
    managerUserId: ref('manager_user_id'),
    createdAt: createdAt(),
  },
  (t) => [unique('league_tenant_id_unique').on(t.tenantId, t.id), index('league_tenant_manager_idx').on(t.tenantId, t.managerUserId), rinkFk('league_rink_fk', t.tenantId)],
);

export const leagueTeam = mysqlTable(
  'league_team',
  {
    id: id(),
    tenantId: tenantId(),
    leagueId: ref('league_id').notNull(),
    name: varchar('name', { length: 120 }).notNull(),
    createdAt: createdAt(),
  },
  (t) => [
    unique('league_team_tenant_id_unique').on(t.tenantId, t.id),
    unique('league_team_tenant_name_unique').on(t.tenantId, t.leagueId, t.name),
    rinkFk('league_team_rink_fk', t.tenantId),
    sameRinkFk('league_team_league_fk', t.tenantId, t.leagueId, league.tenantId, league.id),
  ],
);

export const leaguePlayer = mysqlTable(
  'league_player',
  {
    id: id(),
    tenantId: tenantId(),
    leagueId: ref('league_id').notNull(),
    teamId: ref('team_id').notNull(),
    customerId: ref('customer_id').notNull(),
    createdAt: createdAt(),
  },
  (t) => [
    unique('league_player_tenant_id_unique').on(t.tenantId, t.id),
    unique('league_player_tenant_customer_unique').on(t.tenantId, t.leagueId, t.customerId),
    index('league_player_tenant_team_idx').on(t.tenantId, t.teamId),
    rinkFk('league_player_rink_fk', t.tenantId),
    sameRinkFk('league_player_league_fk', t.tenantId, t.leagueId, league.tenantId, league.id),
    sameRinkFk('league_player_team_fk', t.tenantId, t.teamId, leagueTeam.tenantId, leagueTeam.id),
    sameRinkFk('league_player_customer_fk', t.tenantId, t.customerId, customer.tenantId, customer.id),
  ],
);

/** Each roster file applied, by its content hash, so the same file twice changes nothing. */
export const rosterImport = mysqlTable(
  'roster_import',
  {
    id: id(),
    tenantId: tenantId(),
    leagueId: ref('league_id').notNull(),
    fileHash: char('file_hash', { length: 64 }).notNull(),
    rowCount: int('row_count').notNull(),
    createdBy: ref('created_by').notNull(),
    createdAt: createdAt(),
  },
  (t) => [
    unique('roster_import_tenant_hash_unique').on(t.tenantId, t.leagueId, t.fileHash),
    rinkFk('roster_import_rink_fk', t.tenantId),
    sameRinkFk('roster_import_league_fk', t.tenantId, t.leagueId, league.tenantId, league.id),
  ],
);
