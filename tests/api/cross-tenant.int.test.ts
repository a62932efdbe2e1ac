import { STAFF_ROLES, type StaffRole } from '@rinkwright/core';
import { isTenantTable, rink, user } from '@rinkwright/db';
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
}

/** B's real id for each path parameter a rink route may have. */
const ID_OF_B: Record<string, (f: Fixture) => string> = {
  memberId: (f) => f.b.staff.technician.memberId,
  invitationId: (f) => f.invitationOfB.id,
};

/** A body each route accepts, so that a call gets past validation to where it could do harm. */
const EXAMPLE_BODIES: Record<string, () => unknown> = {
  'patch /api/rinks/:rinkSlug': () => ({ name: 'Renamed By A Stranger', currency: 'USD' }),
  'patch /api/rinks/:rinkSlug/members/:memberId': () => ({ role: 'league_manager' }),
  'post /api/rinks/:rinkSlug/invitations': () => ({ email: uniqueEmail('swept'), role: 'technician' }),
};

const keyOf = (route: Route) => `${route.method} ${route.path}`;
const paramsOf = (route: Route) => [...route.path.matchAll(/:(\w+)/g)].map((m) => m[1] ?? '').filter((p) => p !== 'rinkSlug');

function pathFor(route: Route, slug: string, f: Fixture): string {
  return route.path.replace(/:(\w+)/g, (_, name: string) => {
    if (name === 'rinkSlug') return slug;
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
  const request = agent[route.method](path);
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
  for (const world of [f.a, f.b]) await createCustomerAt(world.id, { name: 'Swept Skater', email: uniqueEmail('skater') });
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
