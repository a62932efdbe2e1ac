import { createHash, randomUUID } from 'node:crypto';
import { parse } from 'csv-parse/sync';
import { and, asc, eq, sql } from 'drizzle-orm';
import { rosterRow, type AllocationInput, type LeagueDetail, type LeagueInput, type RosterResult, type RosterRow } from '@rinkwright/core';
import { customer, league, leaguePlayer, leagueTeam, member, rosterImport, scoped, user, type Scope } from '@rinkwright/db';
import { AppError } from '../../http/errors';
import type { RinkContext } from '../../http/route';
import { insertNewCustomer } from '../../lib/customers';
import * as ledger from '../../lib/ledger/ledger';
import { describeProducts } from './catalog';
import * as repo from './repository';
import { startCheckout, type SalesDeps } from './sales';

// Leagues: a pool of credits bought as league packs, teams with allocations drawn from the pool, and players
// (customers of the rink) from a roster file. A league manager sees and runs only the leagues they manage.

const NOT_FOUND = 'No such league at this rink';

async function requireLeague(ctx: RinkContext, leagueId: string) {
  const s = scoped(ctx.tenantId);
  const found = await s.findOne(league, eq(league.id, leagueId));
  // Another manager's league is as invisible as another rink's.
  if (!found || (ctx.role === 'league_manager' && found.managerUserId !== ctx.userId)) throw AppError.notFound(NOT_FOUND);
  return found;
}

export async function listLeagues(ctx: RinkContext, onlyLeagueId?: string) {
  const s = scoped(ctx.tenantId);
  const rows = await s.findJoined(league, {
    fields: {
      id: league.id,
      name: league.name,
      season: league.season,
      managerUserId: league.managerUserId,
      manager: sql<string | null>`(select ${user.name} from ${user} where ${user.id} = ${league.managerUserId})`,
    },
    joins: [],
    where: and(ctx.role === 'league_manager' ? eq(league.managerUserId, ctx.userId) : undefined, onlyLeagueId ? eq(league.id, onlyLeagueId) : undefined),
    orderBy: asc(league.name),
  });
  const leagues = [];
  for (const r of rows) {
    const pool = await ledger.findPoolAccount(s, r.id);
    const b = await ledger.balanceOf(s, pool ? [pool.id] : []);
    // Counted one league at a time: a correlated subquery in the select above lost its outer table's name in
    // Drizzle's single-table select and matched the inner table, so it counted nothing.
    const [teams, players] = await Promise.all([s.count(leagueTeam, eq(leagueTeam.leagueId, r.id)), s.count(leaguePlayer, eq(leaguePlayer.leagueId, r.id))]);
    leagues.push({ id: r.id, name: r.name, season: r.season, manager: r.manager, poolCredits: b.credits, teams, players });
  }
  return { leagues };
}

export async function createLeague(ctx: RinkContext, input: LeagueInput) {
  const s = scoped(ctx.tenantId);
  let managerUserId = ctx.role === 'league_manager' ? ctx.userId : input.managerUserId;
  if (managerUserId && ctx.role !== 'league_manager') {
    const m = await s.findOne(member, eq(member.userId, managerUserId));
    if (!m) throw AppError.field('managerUserId', 'Choose a member of this rink');
  }
  managerUserId ??= null;
  const id = randomUUID();
  await s.insert(league, { id, name: input.name, season: input.season, managerUserId });
  await ledger.poolAccount(s, id);
  return describeLeague(ctx, id);
}

export async function describeLeague(ctx: RinkContext, leagueId: string): Promise<LeagueDetail> {
  const found = await requireLeague(ctx, leagueId);
  const s = scoped(ctx.tenantId);
  const rink = await s.rink();
  const pool = await ledger.poolAccount(s, leagueId);
  const poolBalance = await ledger.balanceOf(s, [pool.id]);
  const teams = await s.find(leagueTeam, { where: eq(leagueTeam.leagueId, leagueId), orderBy: asc(leagueTeam.name) });
  const players = await s.findJoined(leaguePlayer, {
    fields: { id: leaguePlayer.id, teamId: leaguePlayer.teamId, customerId: customer.id, name: customer.name, email: customer.email },
    joins: [{ table: customer, on: eq(customer.id, leaguePlayer.customerId) }],
    where: eq(leaguePlayer.leagueId, leagueId),
    orderBy: asc(customer.name),
  });
  const [usage, credits] = await Promise.all([ledger.teamUsage(s, [leagueId]), ledger.creditsOfCustomers(s, players.map((p) => p.customerId))]);
  const teamRows = teams.map((t) => {
    const u = usage.get(t.id);
    return {
      id: t.id,
      name: t.name,
      allocated: u?.allocated ?? 0,
      used: u?.used ?? 0,
      remaining: u?.remaining ?? 0,
      players: players.filter((p) => p.teamId === t.id).map((p) => ({ id: p.id, customerId: p.customerId, name: p.name, email: p.email, credits: credits.get(p.customerId) ?? 0 })),
    };
  });
  const products = await repo.listProducts(s);
  const packs = describeProducts(products.filter((p) => p.kind === 'league_pack' && p.active === 1), await repo.pricesOf(s, products.map((p) => p.id)));
  const imports = await s.findJoined(rosterImport, {
    fields: { id: rosterImport.id, rowCount: rosterImport.rowCount, createdAt: rosterImport.createdAt, by: sql<string>`(select ${user.name} from ${user} where ${user.id} = ${rosterImport.createdBy})` },
    joins: [],
    where: eq(rosterImport.leagueId, leagueId),
    orderBy: asc(rosterImport.createdAt),
  });
  const [summary] = (await listLeagues(ctx, found.id)).leagues;
  if (!summary) throw AppError.notFound(NOT_FOUND);
  return {
    league: summary,
    pool: { credits: poolBalance.credits, valueMinor: poolBalance.valueMinor, currency: rink?.currency ?? 'USD', lots: poolBalance.lots },
    teams: teamRows,
    packs: packs.map(({ id, kind, name, description, credits, monthsValid, interval, price }) => ({ id, kind, name, description, credits, monthsValid, interval, price })),
    imports: imports.map((i) => ({ ...i, createdAt: i.createdAt.toISOString() })),
  };
}

// ---- the roster file ----------------------------------------------------------------------------------------

/** Parses and checks every row; any problem anywhere rejects the whole file with each line's reasons. */
export function parseRoster(csv: string): RosterRow[] {
  let records: Record<string, string>[];
  try {
    records = parse(csv, { columns: (header: string[]) => header.map((h) => h.trim().toLowerCase()), skip_empty_lines: true, trim: true, bom: true, relax_column_count: false });
  } catch (error) {
    throw new AppError('validation_failed', 'The file is not a readable CSV', { csv: [(error as Error).message] });
  }
  const fields: Record<string, string[]> = {};
  const first = records[0];
  if (!first) throw new AppError('validation_failed', 'The file has no rows', { csv: ['Add a header line (team,name,email,phone) and one line per player'] });
  const missing = ['team', 'name'].filter((h) => !(h in first));
  if (missing.length) throw new AppError('validation_failed', 'The header is missing columns', { csv: [`The first line must name the columns team, name, email (phone optional); missing: ${missing.join(', ')}`] });
  const rows: RosterRow[] = [];
  const seen = new Map<string, number>();
  records.forEach((r, i) => {
    const line = i + 2;
    const parsed = rosterRow.safeParse({ team: r.team ?? '', name: r.name ?? '', email: r.email ? r.email : null, phone: r.phone ? r.phone : null });
    if (!parsed.success) {
      fields[`line ${line}`] = parsed.error.issues.map((issue) => (issue.path[0] === 'email' ? `email: ${issue.message}` : issue.message));
      return;
    }
    if (!parsed.data.email && !parsed.data.phone) {
      fields[`line ${line}`] = ['give an email or a phone, so the rink can reach the player'];
      return;
    }
    const who = (parsed.data.email ?? `${parsed.data.name}|${parsed.data.phone}`).toLowerCase();
    const earlier = seen.get(who);
    if (earlier) {
      fields[`line ${line}`] = [`the same player is already on line ${earlier}`];
      return;
    }
    seen.set(who, line);
    rows.push(parsed.data);
  });
  if (Object.keys(fields).length) throw new AppError('validation_failed', `${Object.keys(fields).length} line${Object.keys(fields).length === 1 ? '' : 's'} of the roster need fixing; nothing was imported`, fields);
  return rows;
}

export async function importRoster(ctx: RinkContext, leagueId: string, csv: string): Promise<RosterResult> {
  await requireLeague(ctx, leagueId);
  const rows = parseRoster(csv);
  const hash = createHash('sha256').update(csv.replace(/\r\n/g, '\n').trim()).digest('hex');
  return scoped(ctx.tenantId).transaction(async (tx) => {
    const before = await tx.findOne(rosterImport, and(eq(rosterImport.leagueId, leagueId), eq(rosterImport.fileHash, hash))!);
    if (before) return { applied: false, rows: rows.length, teamsCreated: 0, playersAdded: 0, customersCreated: 0 };
    let teamsCreated = 0;
    let playersAdded = 0;
    let customersCreated = 0;
    const teams = new Map((await tx.find(leagueTeam, { where: eq(leagueTeam.leagueId, leagueId) })).map((t) => [t.name.toLowerCase(), t.id]));
    for (const row of rows) {
      let teamId = teams.get(row.team.toLowerCase());
      if (!teamId) {
        teamId = randomUUID();
        await tx.insert(leagueTeam, { id: teamId, leagueId, name: row.team });
        await ledger.teamAccount(tx, leagueId, teamId);
        teams.set(row.team.toLowerCase(), teamId);
        teamsCreated++;
      }
      const person = await findOrCreatePlayer(tx, row);
      if (person.created) customersCreated++;
      const onRoster = await tx.findOne(leaguePlayer, and(eq(leaguePlayer.leagueId, leagueId), eq(leaguePlayer.customerId, person.id))!);
      if (!onRoster) {
        await tx.insert(leaguePlayer, { id: randomUUID(), leagueId, teamId, customerId: person.id });
        playersAdded++;
      } else if (onRoster.teamId !== teamId) {
        await tx.update(leaguePlayer, { teamId }, eq(leaguePlayer.id, onRoster.id));
      }
    }
    await tx.insert(rosterImport, { id: randomUUID(), leagueId, fileHash: hash, rowCount: rows.length, createdBy: ctx.userId });
    return { applied: true, rows: rows.length, teamsCreated, playersAdded, customersCreated };
  });
}

async function findOrCreatePlayer(tx: Scope, row: RosterRow): Promise<{ id: string; created: boolean }> {
  const byEmail = row.email ? await tx.findOne(customer, eq(customer.email, row.email)) : undefined;
  if (byEmail) return { id: byEmail.id, created: false };
  const byName = !row.email && row.phone ? await tx.findOne(customer, and(eq(customer.name, row.name), eq(customer.phone, row.phone))!) : undefined;
  if (byName) return { id: byName.id, created: false };
  return { id: await insertNewCustomer(tx, { name: row.name, email: row.email, phone: row.phone }), created: true };
}

// ---- credits ------------------------------------------------------------------------------------------------

/** Gives credits from the league's pool to a team's allocation or straight to a player's own account. */
export async function allocate(ctx: RinkContext, leagueId: string, key: string, input: AllocationInput) {
  await requireLeague(ctx, leagueId);
  const s = scoped(ctx.tenantId);
  const pool = await ledger.poolAccount(s, leagueId);
  let to: string;
  if (input.teamId) {
    const team = await s.findOne(leagueTeam, and(eq(leagueTeam.id, input.teamId), eq(leagueTeam.leagueId, leagueId))!);
    if (!team) throw AppError.field('teamId', 'No such team in this league');
    to = (await ledger.teamAccount(s, leagueId, team.id)).id;
  } else {
    const player = await s.findOne(leaguePlayer, and(eq(leaguePlayer.id, input.playerId!), eq(leaguePlayer.leagueId, leagueId))!);
    if (!player) throw AppError.field('playerId', 'No such player in this league');
    to = (await ledger.skaterAccount(s, player.customerId)).id;
  }
  await ledger.transfer(s, { fromAccountId: pool.id, toAccountId: to, key: `allocate:${key}`, actor: { userId: ctx.userId, source: 'league', sourceId: leagueId }, credits: input.credits });
  return describeLeague(ctx, leagueId);
}

export async function buyPack(ctx: RinkContext, deps: SalesDeps, leagueId: string, productId: string) {
  await requireLeague(ctx, leagueId);
  return startCheckout(scoped(ctx.tenantId), deps, {
    productId,
    customer: null,
    leagueId,
    successPath: `/rinks/${ctx.rinkSlug}/leagues/${leagueId}`,
    cancelPath: `/rinks/${ctx.rinkSlug}/leagues/${leagueId}`,
    createdBy: ctx.userId,
  });
}

/** Teams a counter can draw from (batch mode): every team of every league, with what is left of each allocation. */
export async function teamsForCounter(ctx: RinkContext) {
  const s = scoped(ctx.tenantId);
  const rows = await s.findJoined(leagueTeam, { fields: { id: leagueTeam.id, name: leagueTeam.name, leagueName: league.name, leagueId: league.id }, joins: [{ table: league, on: eq(league.id, leagueTeam.leagueId) }], orderBy: [asc(league.name), asc(leagueTeam.name)] });
  const accounts = rows.length ? await Promise.all(rows.map((r) => ledger.teamAccount(s, r.leagueId, r.id))) : [];
  const out = [];
  for (const [i, r] of rows.entries()) out.push({ id: r.id, name: r.name, leagueName: r.leagueName, credits: (await ledger.balanceOf(s, [accounts[i]!.id])).credits });
  return { teams: out };
}

