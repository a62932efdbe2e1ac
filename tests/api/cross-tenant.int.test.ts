import { randomUUID } from 'node:crypto';
import { STAFF_ROLES, type StaffRole } from '@rinkwright/core';
import { createService, createSharpening, createSkateProfile, createStation, createTicket } from '@rinkwright/db/testing';
import { isTenantTable, league, membership, payment, product, productPrice, rink, scoped, user } from '@rinkwright/db';
import * as ledger from '../../apps/api/src/lib/ledger/ledger';
import { currentDb } from '@rinkwright/db/unscoped';
import { eq, inArray } from 'drizzle-orm';
import { getTableConfig } from 'drizzle-orm/mysql-core';
import { beforeAll, describe, expect, it } from 'vitest';
import { roleAllows } from '../../apps/api/src/access';
import type { Route } from '../../apps/api/src/http/route';
import { buildTestApp, type Client } from '../support/app';
import { allTables, tableName } from '../support/schema';
import { createCustomerAt, createPendingInvitation, createRinkWithStaff, uniqueEmail, uniqueSlug, type RinkWorld } from '../support/world';

// Generated from the route table: every rink route, called by every role of rink A with rink B's slug and
// ids, must answer as if B did not exist, and leave every row of B as it was. A new rink route joins the
// sweep by being added to the table; a new kind of path id fails here until B has a fixture for it.

const api = buildTestApp();
const rinkRoutes = api.routes.filter((r) => r.access === 'rink');

interface Fixture {
  a: RinkWorld;
  b: RinkWorld;
  invitationOfB: { id: string };
  desk: Desk;
}

/** A rink's counter with one of everything: station, service, customer with a profile, ticket, sharpening. */
interface Desk {
  stationId: string;
  serviceId: string;
  customerId: string;
  profileId: string;
  ticketId: string;
  pairId: string;
  sharpeningId: string;
  productId: string;
  paymentId: string;
  membershipId: string;
  leagueId: string;
}

async function deskOf(world: RinkWorld): Promise<Desk> {
  const db = currentDb();
  const stationRow = await createStation(db, world.id, { name: 'Swept station' });
  const service = await createService(db, world.id);
  const skater = await createCustomerAt(world.id, { name: 'Swept Skater', email: uniqueEmail('skater') });
  const profile = await createSkateProfile(db, world.id, skater.id);
  const made = await createTicket(db, world.id, { customerId: skater.id, serviceId: service.id, createdBy: world.staff.technician.id, number: 1, pairs: 2, state: 'on_station', stationId: stationRow.id });
  const pairId = made.pairIds[0] ?? '';
  const done = await createSharpening(db, world.id, { ticketId: made.id, pairId, stationId: stationRow.id, technicianId: world.staff.technician.id });
  const billing = await billingOf(world.id, skater.id);
  return { stationId: stationRow.id, serviceId: service.id, customerId: skater.id, profileId: profile.id, ticketId: made.id, pairId, sharpeningId: done.id, ...billing };
}

/** A product with its price, a paid cash sale with its credits, a membership and a league: rows a stranger could harm. */
async function billingOf(rinkId: string, customerId: string) {
  const s = scoped(rinkId);
  const now = new Date();
  const productId = randomUUID();
  const priceId = randomUUID();
  const paymentId = randomUUID();
  const membershipId = randomUUID();
  const leagueId = randomUUID();
  await s.insert(product, { id: productId, kind: 'punch_card', name: 'Swept card', credits: 5, monthsValid: 12, createdAt: now, updatedAt: now });
  await s.insert(productPrice, { id: priceId, productId, amountMinor: 2500, currency: 'USD' });
  await s.insert(payment, { id: paymentId, customerId, productId, priceId, channel: 'counter', state: 'paid', amountMinor: 2500, currency: 'USD', feeMinor: 0, paidAt: now });
  await s.insert(membership, { id: membershipId, customerId, productId, subscriptionId: `sub_swept_${rinkId}`, state: 'active', updatedAt: now });
  await s.insert(league, { id: leagueId, name: 'Swept league' });
  const account = await ledger.skaterAccount(s, customerId);
  await ledger.addLot(s, { accountId: account.id, key: `swept:${paymentId}`, actor: { userId: null, source: 'payment', sourceId: paymentId }, kind: 'purchase', lot: { origin: 'purchase', credits: 5, priceMinor: 2500, productId, paymentId } });
  return { productId, paymentId, membershipId, leagueId };
}

/** B's real id for each path parameter a rink route may have. */
const ID_OF_B: Record<string, (f: Fixture) => string> = {
  memberId: (f) => f.b.staff.technician.memberId,
  invitationId: (f) => f.invitationOfB.id,
  stationId: (f) => f.desk.stationId,
  serviceId: (f) => f.desk.serviceId,
  customerId: (f) => f.desk.customerId,
  profileId: (f) => f.desk.profileId,
  ticketId: (f) => f.desk.ticketId,
  sharpeningId: (f) => f.desk.sharpeningId,
  productId: (f) => f.desk.productId,
  paymentId: (f) => f.desk.paymentId,
  membershipId: (f) => f.desk.membershipId,
  leagueId: (f) => f.desk.leagueId,
};

const station = { name: 'Swept', rpm: 3450, adjustStepMilli: 125 };
const reading = { readings: [{ blade: 'left', readingNm: 2540 }] };

/** A body each route accepts, so that a call gets past validation to where it could do harm. */
const EXAMPLE_BODIES: Record<string, () => unknown> = {
  'patch /api/rinks/:rinkSlug': () => ({ name: 'Renamed By A Stranger', currency: 'USD' }),
  'patch /api/rinks/:rinkSlug/members/:memberId': () => ({ role: 'league_manager' }),
  'post /api/rinks/:rinkSlug/invitations': () => ({ email: uniqueEmail('swept'), role: 'technician' }),
  'post /api/rinks/:rinkSlug/stations': () => station,
  'put /api/rinks/:rinkSlug/stations/:stationId': () => ({ ...station, status: 'retired' }),
  'post /api/rinks/:rinkSlug/stations/:stationId/wheels': () => ({
    label: 'Swept wheel',
    grit: 80,
    diameterNewNm: 203_200_000,
    minDiameterNm: 152_400_000,
    ratedMaxRpm: 4500,
    hollowNm: 12_700_000,
    ringTested: true,
  }),
  'post /api/rinks/:rinkSlug/stations/:stationId/dressings': () => ({ hollowNm: 12_700_000, diameterNm: 200_000_000 }),
  'post /api/rinks/:rinkSlug/stations/:stationId/adjustments': () => ({ amountMilli: 250 }),
  'post /api/rinks/:rinkSlug/stations/:stationId/check-readings': () => ({ blade: 'left', readingNm: 2540 }),
  'put /api/rinks/:rinkSlug/desk-settings': () => ({
    trueNm: 1000,
    fairNm: 2000,
    precisionTrueNm: 500,
    precisionFairNm: 1000,
    defaultResponseNmPerTurn: 25_400,
    defaultMinutesPerPair: 8,
    ewmaLambdaMilli: 200,
    ewmaKMilli: 3000,
  }),
  'post /api/rinks/:rinkSlug/services': () => ({ name: 'Swept service', kind: 'add_on', priceMinor: 100 }),
  'put /api/rinks/:rinkSlug/services/:serviceId': () => ({ name: 'Swept service', kind: 'add_on', priceMinor: 1 }),
  'post /api/rinks/:rinkSlug/customers': () => ({ name: 'Swept Walk-up', phone: '555-0199' }),
  'post /api/rinks/:rinkSlug/customers/:customerId/profiles': () => ({ label: 'Swept pair' }),
  'put /api/rinks/:rinkSlug/customers/:customerId/profiles/:profileId': () => ({ label: 'Swept pair', notes: 'changed by a stranger' }),
  'post /api/rinks/:rinkSlug/tickets': () => ({ customerId: f.desk.customerId, pairs: [{ label: 'Swept', serviceId: f.desk.serviceId }] }),
  'post /api/rinks/:rinkSlug/tickets/:ticketId/transitions': () => ({ to: 'void', reason: 'voided by a stranger' }),
  'post /api/rinks/:rinkSlug/products': () => ({ kind: 'single', name: 'Swept single', credits: 1, priceMinor: 900 }),
  'patch /api/rinks/:rinkSlug/products/:productId': () => ({ active: false }),
  'post /api/rinks/:rinkSlug/customers/:customerId/redemptions': () => ({}),
  'post /api/rinks/:rinkSlug/customers/:customerId/adjustments': () => ({ credits: -1, reason: 'taken by a stranger' }),
  'post /api/rinks/:rinkSlug/customers/:customerId/sales': () => ({ productId: f.desk.productId, paymentMethodId: 'cash' }),
  'post /api/rinks/:rinkSlug/payments/:paymentId/refunds': () => ({ reason: 'refunded by a stranger' }),
  'post /api/rinks/:rinkSlug/memberships/:membershipId/cancel': () => ({ when: 'now' }),
  'post /api/rinks/:rinkSlug/billing/test-clock': () => ({ days: 1 }),
  'post /api/rinks/:rinkSlug/leagues': () => ({ name: 'Swept league' }),
  'post /api/rinks/:rinkSlug/leagues/:leagueId/roster': () => ({ csv: 'team,name,email\nSwept,Swept Player,swept@example.test\n' }),
  'post /api/rinks/:rinkSlug/leagues/:leagueId/allocations': () => ({ teamId: f.desk.leagueId, credits: 1 }),
  'post /api/rinks/:rinkSlug/leagues/:leagueId/checkout': () => ({ productId: f.desk.productId }),
  'post /api/rinks/:rinkSlug/tickets/:ticketId/sharpenings': () => ({
    pairId: f.desk.pairId,
    stationId: f.desk.stationId,
    hollowNm: 12_700_000,
    passes: 3,
    bladeWidthNm: 2_900_000,
    ...reading,
  }),
  'post /api/rinks/:rinkSlug/sharpenings/:sharpeningId/readings': () => reading,
  'post /api/rinks/:rinkSlug/sharpenings/:sharpeningId/corrections': () => ({ reason: 'corrected by a stranger', hollowNm: 1, passes: 1, bladeWidthNm: 1 }),
};

const keyOf = (route: Route) => `${route.method} ${route.path}`;
/** Path parts that name something of the route itself (a report's table), not a row of a rink. */
const NAMES: Record<string, string> = { table: 'byDay' };
const paramsOf = (route: Route) => [...route.path.matchAll(/:(\w+)/g)].map((m) => m[1] ?? '').filter((p) => p !== 'rinkSlug' && !(p in NAMES));

function pathFor(route: Route, slug: string, f: Fixture): string {
  return route.path.replace(/:(\w+)/g, (_, name: string) => {
    if (name === 'rinkSlug') return slug;
    if (name in NAMES) return NAMES[name]!;
    const idOf = ID_OF_B[name];
    if (!idOf) throw new Error(`${keyOf(route)}: no rink-B fixture for :${name}; add one to ID_OF_B in cross-tenant.int.test.ts`);
    return encodeURIComponent(idOf(f));
  });
}

function bodyFor(route: Route): unknown {
  const body = EXAMPLE_BODIES[keyOf(route)]?.() ?? {};
  const parsed = route.body?.safeParse(body);
  if (parsed && !parsed.success) {
    throw new Error(`${keyOf(route)}: its body schema refuses ${JSON.stringify(body)}; add a valid example to EXAMPLE_BODIES`);
  }
  return body;
}

function call(agent: Client, route: Route, path: string) {
  // Counter writes need a key; a fresh one per call, so no call is answered from another's replay.
  const request = agent[route.method](path).set('Idempotency-Key', `sweep-${randomUUID()}`);
  return route.method === 'get' || route.method === 'delete' ? request : request.send(bodyFor(route) as object);
}

type Snapshot = Record<string, unknown[]>;
const sorted = (rows: unknown[]) => rows.map((r) => JSON.stringify(r)).sort();

/**
 * Every row that belongs to the rink: its tenant rows in every table, its rink row, its staff's accounts.
 * Read with plain Drizzle rather than through scoped(), so a broken scope cannot hide its own damage.
 */
async function snapshotOf(rinkWorld: RinkWorld): Promise<Snapshot> {
  const db = currentDb();
  const snapshot: Snapshot = {};
  for (const table of allTables().filter((t) => isTenantTable(tableName(t)))) {
    const tenantColumn = getTableConfig(table).columns.find((c) => c.name === 'tenant_id');
    if (!tenantColumn) throw new Error(`${tableName(table)} has no tenant_id; the schema test says more`);
    snapshot[tableName(table)] = sorted(await db.select().from(table).where(eq(tenantColumn, rinkWorld.id)));
  }
  snapshot.rink = sorted(await db.select().from(rink).where(eq(rink.id, rinkWorld.id)));
  const staffIds = Object.values(rinkWorld.staff).map((s) => s.id);
  snapshot.user = sorted(await db.select().from(user).where(inArray(user.id, staffIds)));
  return snapshot;
}

const f = {} as Fixture;
const agents = {} as Record<StaffRole, Client>;
let before: Snapshot;

beforeAll(async () => {
  f.a = await createRinkWithStaff('Ice Harbor');
  f.b = await createRinkWithStaff('North Pond Arena');
  await deskOf(f.a);
  f.desk = await deskOf(f.b);
  await createPendingInvitation(f.a);
  f.invitationOfB = await createPendingInvitation(f.b);
  for (const role of STAFF_ROLES) agents[role] = await api.signIn(f.a.staff[role].email, f.a.staff[role].password);
  before = await snapshotOf(f.b);
});

describe('the sweep', () => {
  it('covers the rink routes of the table', () => {
    expect(rinkRoutes.length).toBeGreaterThanOrEqual(8);
    expect(rinkRoutes.every((r) => r.permission !== undefined)).toBe(true);
  });

  it('has a rink-B id for every path parameter of every rink route', () => {
    const unknown = rinkRoutes.flatMap((r) => paramsOf(r).filter((p) => !ID_OF_B[p]).map((p) => `${keyOf(r)} :${p}`));

    expect(unknown, 'add a fixture for each to ID_OF_B').toEqual([]);
  });

  it('starts from a rink B that has rows to lose', () => {
    expect(before.member).toHaveLength(STAFF_ROLES.length);
    expect(before.invitation).toHaveLength(1);
    expect(before.customer).toHaveLength(1);
    expect(before.station).toHaveLength(1);
    expect(before.ticket_pair).toHaveLength(2);
    expect(before.level_reading).toHaveLength(2);
    expect(before.rink).toHaveLength(1);
  });
});

for (const route of rinkRoutes) {
  describe(`${route.method.toUpperCase()} ${route.path}`, () => {
    it.each(STAFF_ROLES)("as A's %s with B's slug: 404, the same answer as for no rink at all", async (role) => {
      const answer = await call(agents[role], route, pathFor(route, f.b.slug, f));
      const nowhere = await call(agents[role], route, pathFor(route, uniqueSlug('nowhere'), f));

      expect(answer.status).toBe(404);
      expect(answer.body).toEqual(nowhere.body);
    });

    // With no id in the path, A's slug is simply A's own route: it names nothing of B, so there is no such call.
    if (paramsOf(route).length === 0) return;
    it.each(STAFF_ROLES)("as A's %s with A's slug and B's ids: 404 if the role may, else 403", async (role) => {
      const answer = await call(agents[role], route, pathFor(route, f.a.slug, f));
      const expected = roleAllows(role, route.permission ?? {}) ? 404 : 403;

      expect({ status: answer.status, code: answer.body?.error?.code }).toEqual({
        status: expected,
        code: expected === 404 ? 'not_found' : 'forbidden',
      });
    });
  });
}

describe('after the sweep', () => {
  it('leaves every row of rink B as it was', async () => {
    expect(await snapshotOf(f.b)).toEqual(before);
  });
});
