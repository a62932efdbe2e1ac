import { randomUUID } from 'node:crypto';
import { createSharpening, createTicket, addMember } from '@rinkwright/db/testing';
import { isTenantTable, league, leagueTeam, payment, product, productPrice, scoped, sharpening, station as stationTable, ticket, ticketEvent } from '@rinkwright/db';
import * as ledger from '../../apps/api/src/lib/ledger/ledger';
import { currentDb } from '@rinkwright/db/unscoped';
import { count, eq } from 'drizzle-orm';
import { getTableConfig } from 'drizzle-orm/mysql-core';
import { beforeAll, describe, expect, it } from 'vitest';
import type { Route } from '../../apps/api/src/http/route';
import { buildTestApp } from '../support/app';
import { HALF_INCH_NM, HOCKEY_WIDTH_NM, createDesk, logBody, newKey, pair, rowsOf, takeIn, ticketBody, transition, write, type Desk, type TicketBody } from '../support/desk';
import { mailTo, waitForMail } from '../support/mail';
import { allTables, tableName } from '../support/schema';
import { createRinkWithStaff, uniqueEmail, type Staffer } from '../support/world';

// Every counter write carries a client-made key: a repeat gets the first answer, a reuse for another request is
// refused, a refused write gives the key back, and two presses at once write once. The list of routes comes from
// the route table, so a new counter write is held to the same rule by being declared idempotent.

const api = buildTestApp();
const as = (staffer: Staffer) => api.signIn(staffer.email, staffer.password);
const idempotentRoutes = api.routes.filter((r) => r.idempotent === true);
const keyOf = (route: Route) => `${route.method} ${route.path}`;

const ticketsPath = (desk: Desk) => `/api/rinks/${desk.world.slug}/tickets`;

/** Every row the rink owns, per table, counted straight from the database. */
async function countsOf(rinkId: string): Promise<Record<string, number>> {
  const counts: Record<string, number> = {};
  for (const table of allTables().filter((t) => isTenantTable(tableName(t)))) {
    const tenant = getTableConfig(table).columns.find((c) => c.name === 'tenant_id');
    if (!tenant) throw new Error(`${tableName(table)} has no tenant_id`);
    const [row] = await currentDb().select({ n: count() }).from(table).where(eq(tenant, rinkId));
    counts[tableName(table)] = row?.n ?? 0;
  }
  return counts;
}

/** A product, a paid cash sale with its credits, and a league with a team: what the credit writes act on. */
async function billingFixture(rinkId: string, customerId: string) {
  const s = scoped(rinkId);
  const now = new Date();
  const [productId, priceId, paymentId, leagueId, teamId] = [randomUUID(), randomUUID(), randomUUID(), randomUUID(), randomUUID()];
  await s.insert(product, { id: productId, kind: 'punch_card', name: 'Keyless card', credits: 5, monthsValid: 12, createdAt: now, updatedAt: now });
  await s.insert(productPrice, { id: priceId, productId, amountMinor: 2500, currency: 'USD' });
  await s.insert(payment, { id: paymentId, customerId, productId, priceId, channel: 'counter', state: 'paid', amountMinor: 2500, currency: 'USD', feeMinor: 0, paidAt: now });
  await s.insert(league, { id: leagueId, name: 'Keyless league' });
  await s.insert(leagueTeam, { id: teamId, leagueId, name: 'Keyless team' });
  const account = await ledger.skaterAccount(s, customerId);
  await ledger.addLot(s, { accountId: account.id, key: `keyless:${paymentId}`, actor: { userId: null, source: 'payment', sourceId: paymentId }, kind: 'purchase', lot: { origin: 'purchase', credits: 5, priceMinor: 2500, productId, paymentId } });
  const pool = await ledger.poolAccount(s, leagueId);
  await ledger.adjust(s, { accountId: pool.id, key: `keyless-pool:${leagueId}`, actor: { userId: null, source: 'staff', sourceId: null }, credits: 5 });
  return { productId, paymentId, leagueId, teamId };
}

describe('the Idempotency-Key header', () => {
  interface Ids {
    stationId: string;
    ticketId: string;
    pairId: string;
    sharpeningId: string;
    customerId: string;
    productId: string;
    paymentId: string;
    leagueId: string;
    teamId: string;
  }
  let desk: Desk;
  const ids = {} as Ids;

  /** A body each route would accept, so that the missing key is the only thing wrong with the call. */
  const BODIES: Record<string, () => object> = {
    'post /api/rinks/:rinkSlug/stations/:stationId/wheels': () => ({
      label: 'Keyless wheel',
      grit: 80,
      diameterNewNm: 203_200_000,
      minDiameterNm: 152_400_000,
      ratedMaxRpm: 4500,
      hollowNm: HALF_INCH_NM,
      ringTested: true,
    }),
    'post /api/rinks/:rinkSlug/stations/:stationId/dressings': () => ({ hollowNm: HALF_INCH_NM, diameterNm: 200_000_000 }),
    'post /api/rinks/:rinkSlug/stations/:stationId/wheel-removals': () => ({}),
    'post /api/rinks/:rinkSlug/stations/:stationId/adjustments': () => ({ amountMilli: 250 }),
    'post /api/rinks/:rinkSlug/stations/:stationId/check-readings': () => ({ blade: 'left', readingNm: 2_540 }),
    'post /api/rinks/:rinkSlug/tickets': () => ticketBody(desk),
    'post /api/rinks/:rinkSlug/tickets/:ticketId/transitions': () => ({ to: 'on_station', stationId: ids.stationId }),
    'post /api/rinks/:rinkSlug/tickets/:ticketId/sharpenings': () => logBody(desk, { pairId: ids.pairId }),
    'post /api/rinks/:rinkSlug/sharpenings/:sharpeningId/readings': () => ({ readings: [{ blade: 'left', readingNm: 1_270 }] }),
    'post /api/rinks/:rinkSlug/sharpenings/:sharpeningId/corrections': () => ({ reason: 'Passes miscounted', hollowNm: HALF_INCH_NM, passes: 5, bladeWidthNm: HOCKEY_WIDTH_NM }),
    'post /api/rinks/:rinkSlug/customers/:customerId/redemptions': () => ({}),
    'post /api/rinks/:rinkSlug/customers/:customerId/adjustments': () => ({ credits: 2, reason: 'Keyless grant' }),
    'post /api/rinks/:rinkSlug/customers/:customerId/sales': () => ({ productId: ids.productId, paymentMethodId: 'cash' }),
    'post /api/rinks/:rinkSlug/payments/:paymentId/refunds': () => ({ reason: 'Keyless refund' }),
    'post /api/rinks/:rinkSlug/leagues/:leagueId/allocations': () => ({ teamId: ids.teamId, credits: 1 }),
  };

  const pathFor = (route: Route) =>
    route.path.replace(/:(\w+)/g, (_, name: string) => {
      if (name === 'rinkSlug') return desk.world.slug;
      const id = ids[name as keyof Ids];
      if (!id) throw new Error(`${keyOf(route)}: no id for :${name}; add one to this file's fixture`);
      return id;
    });

  const bodyFor = (route: Route) => {
    const make = BODIES[keyOf(route)];
    if (!make) throw new Error(`${keyOf(route)} is idempotent but has no example body here; add one to BODIES`);
    const body = make();
    const parsed = route.body?.safeParse(body);
    if (parsed && !parsed.success) throw new Error(`${keyOf(route)}: its schema refuses the example body ${JSON.stringify(body)}`);
    return body;
  };

  beforeAll(async () => {
    desk = await createDesk('Ice Harbor');
    const made = await createTicket(currentDb(), desk.world.id, {
      customerId: desk.skater.id,
      serviceId: desk.service.id,
      createdBy: desk.world.staff.technician.id,
      number: 1,
      pairs: 2,
    });
    const done = await createSharpening(currentDb(), desk.world.id, {
      ticketId: made.id,
      pairId: made.pairIds[0] ?? '',
      stationId: desk.station.id,
      technicianId: desk.world.staff.technician.id,
    });
    const billing = await billingFixture(desk.world.id, desk.skater.id);
    Object.assign(ids, { stationId: desk.station.id, ticketId: made.id, pairId: made.pairIds[1] ?? '', sharpeningId: done.id, customerId: desk.skater.id, ...billing });
  });

  it('is required by the counter writes of the route table', () => {
    expect(idempotentRoutes.map(keyOf)).toEqual(
      expect.arrayContaining([
        'post /api/rinks/:rinkSlug/tickets',
        'post /api/rinks/:rinkSlug/tickets/:ticketId/transitions',
        'post /api/rinks/:rinkSlug/tickets/:ticketId/sharpenings',
        'post /api/rinks/:rinkSlug/sharpenings/:sharpeningId/readings',
        'post /api/rinks/:rinkSlug/sharpenings/:sharpeningId/corrections',
      ]),
    );
    expect(idempotentRoutes.every((r) => r.access === 'rink' && r.method !== 'get')).toBe(true);
  });

  it.each(idempotentRoutes.map((r) => [keyOf(r), r] as const))('%s answers 400 fields.Idempotency-Key without one and writes nothing', async (_name, route) => {
    const owner = await as(desk.world.staff.owner);
    const before = await countsOf(desk.world.id);

    const response = await owner[route.method](pathFor(route)).send(bodyFor(route));

    expect(response.status).toBe(400);
    expect(Object.keys(response.body.error.fields)).toEqual(['Idempotency-Key']);
    expect(await countsOf(desk.world.id)).toEqual(before);
  });

  it.each(['short', 'has spaces in it', 'x'.repeat(101), 'semi;colon-key'])('refuses the key %j (400 fields.Idempotency-Key)', async (key) => {
    const owner = await as(desk.world.staff.owner);

    const response = await write(owner, ticketsPath(desk), ticketBody(desk), key);

    expect(response.status).toBe(400);
    expect(Object.keys(response.body.error.fields)).toEqual(['Idempotency-Key']);
  });
});

describe('a repeated key', () => {
  it('with the same body gets the first answer again, and the ticket is taken in once', async () => {
    const desk = await createDesk('Ice Harbor');
    const technician = await as(desk.world.staff.technician);
    const key = newKey('intake');

    const first = await write(technician, ticketsPath(desk), ticketBody(desk, 2), key);
    const again = await write(technician, ticketsPath(desk), ticketBody(desk, 2), key);

    expect(first.status).toBe(201);
    expect(again.status).toBe(first.status);
    expect(again.body).toEqual(first.body);
    expect(await rowsOf(ticket, desk.world.id)).toBe(1);
    expect(await rowsOf(ticketEvent, desk.world.id)).toBe(1);
  });

  it('with the same body logs the pair once', async () => {
    const desk = await createDesk('North Pond Arena');
    const technician = await as(desk.world.staff.technician);
    const made = await takeIn(technician, desk);
    const path = `${ticketsPath(desk)}/${made.id}/sharpenings`;
    const body = logBody(desk, { pairId: made.pairs[0]?.id });
    const key = newKey('log');

    const first = await write(technician, path, body, key);
    const again = await write(technician, path, body, key);

    expect(first.status).toBe(201);
    expect(again.status).toBe(201);
    expect(again.body).toEqual(first.body);
    expect(await rowsOf(sharpening, desk.world.id)).toBe(1);
  });

  it('with the same body moves the ticket to ready once and e-mails the skater once', async () => {
    const desk = await createDesk('Ice Harbor');
    const technician = await as(desk.world.staff.technician);
    const made = await takeIn(technician, desk);
    await write(technician, `${ticketsPath(desk)}/${made.id}/sharpenings`, logBody(desk, { pairId: made.pairs[0]?.id }));
    const key = newKey('ready');

    const first = await transition(technician, desk, made.id, { to: 'ready' }, key);
    const again = await transition(technician, desk, made.id, { to: 'ready' }, key);

    expect(first.status).toBe(200);
    expect(again.status).toBe(200);
    expect(again.body).toEqual(first.body);
    expect((first.body as TicketBody).events.map((e) => e.toState)).toEqual(['waiting', 'on_station', 'ready']);
    expect(await rowsOf(ticketEvent, desk.world.id)).toBe(3);
    await waitForMail(desk.skater.email, { subject: /ready/ });
    // The notice goes out inside the first request, so by now a second one would have reached the capture server.
    await new Promise((resolve) => setTimeout(resolve, 300));
    expect(await mailTo(desk.skater.email, /ready/)).toHaveLength(1);
  });

  it('with another body, or on another route, is refused with 422 and writes nothing more', async () => {
    const desk = await createDesk('North Pond Arena');
    const technician = await as(desk.world.staff.technician);
    const key = newKey('reused');
    const first = await write(technician, ticketsPath(desk), ticketBody(desk, 1), key);
    expect(first.status).toBe(201);

    const otherBody = await write(technician, ticketsPath(desk), ticketBody(desk, 3), key);
    const otherRoute = await transition(technician, desk, first.body.id, { to: 'void', reason: 'Wrong skater' }, key);

    expect(otherBody.status).toBe(422);
    expect(otherBody.body.error.code).toBe('unprocessable');
    expect(otherRoute.status).toBe(422);
    expect(otherRoute.body.error.code).toBe('unprocessable');
    expect(await rowsOf(ticket, desk.world.id)).toBe(1);
    expect((await technician.get(`${ticketsPath(desk)}/${first.body.id}`)).body.state).toBe('waiting');
  });

  it('is kept per rink: the same key at two rinks makes two independent tickets', async () => {
    const harbor = await createDesk('Ice Harbor');
    const pond = await createDesk('North Pond Arena');
    const person = harbor.world.staff.manager;
    await addMember(currentDb(), pond.world.id, person.id, 'manager');
    const agent = await as(person);
    const key = newKey('shared');

    const atHarbor = await write(agent, ticketsPath(harbor), ticketBody(harbor), key);
    const atPond = await write(agent, ticketsPath(pond), ticketBody(pond), key);

    expect(atHarbor.status).toBe(201);
    expect(atPond.status).toBe(201);
    expect(atPond.body.id).not.toBe(atHarbor.body.id);
    expect([await rowsOf(ticket, harbor.world.id), await rowsOf(ticket, pond.world.id)]).toEqual([1, 1]);
  });
});

describe('a refused first request', () => {
  it('gives the key back: after a 409, the retry with the same key is taken in', async () => {
    const desk = await createDesk('Ice Harbor', { stationStatus: 'maintenance' });
    const technician = await as(desk.world.staff.technician);
    const key = newKey('retry');

    const refused = await write(technician, ticketsPath(desk), ticketBody(desk), key);
    expect(refused.status).toBe(409);
    await currentDb().update(stationTable).set({ status: 'active' }).where(eq(stationTable.id, desk.station.id));
    const retried = await write(technician, ticketsPath(desk), ticketBody(desk), key);

    expect(retried.status).toBe(201);
    expect(await rowsOf(ticket, desk.world.id)).toBe(1);
  });

  it('gives the key back: after a 400 from the rules, a corrected body with the same key is taken in', async () => {
    const desk = await createDesk('North Pond Arena');
    const other = await createDesk('Ice Harbor');
    const technician = await as(desk.world.staff.technician);
    const key = newKey('corrected');

    const refused = await write(technician, ticketsPath(desk), { customerId: desk.skater.id, pairs: [pair(desk, { serviceId: other.service.id })] }, key);
    const corrected = await write(technician, ticketsPath(desk), ticketBody(desk), key);

    expect(refused.status).toBe(400);
    expect(corrected.status).toBe(201);
    expect(await rowsOf(ticket, desk.world.id)).toBe(1);
  });
});

describe('two requests with one key at once', () => {
  it('take the ticket in once; the other answer is the replay or 409', async () => {
    const desk = await createDesk('Ice Harbor');
    const technician = await as(desk.world.staff.technician);

    for (let round = 1; round <= 3; round++) {
      const key = newKey(`race-${round}`);
      const answers = await Promise.all([write(technician, ticketsPath(desk), ticketBody(desk), key), write(technician, ticketsPath(desk), ticketBody(desk), key)]);

      const made = answers.filter((a) => a.status === 201);
      const others = answers.filter((a) => a.status !== 201);
      expect(made.length, `round ${round}`).toBeGreaterThanOrEqual(1);
      if (made.length === 2) expect(made[1]?.body).toEqual(made[0]?.body);
      for (const other of others) {
        expect(other.status).toBe(409);
        expect(other.body.error.code).toBe('conflict');
      }
      expect(await rowsOf(ticket, desk.world.id)).toBe(round);
    }
  });

  it('log the pair once; the other answer is the replay or 409', async () => {
    const desk = await createDesk('North Pond Arena');
    const technician = await as(desk.world.staff.technician);
    const made = await takeIn(technician, desk);
    const path = `${ticketsPath(desk)}/${made.id}/sharpenings`;
    const body = logBody(desk, { pairId: made.pairs[0]?.id });
    const key = newKey('race-log');

    const answers = await Promise.all([write(technician, path, body, key), write(technician, path, body, key)]);

    const statuses = answers.map((a) => a.status).sort();
    expect([
      [201, 201],
      [201, 409],
    ]).toContainEqual(statuses);
    if (statuses[1] === 201) expect(answers[1]?.body).toEqual(answers[0]?.body);
    expect(await rowsOf(sharpening, desk.world.id)).toBe(1);
  });
});

describe('walk-ups and skate profiles (a key is honoured when sent, not required)', () => {
  it('makes one walk-up for a repeated key, and still takes a walk-up without a key', async () => {
    const world = await createRinkWithStaff('Optional Keys');
    const agent = await api.signIn(world.staff.technician.email, world.staff.technician.password);
    const path = `/api/rinks/${world.slug}/customers`;
    const key = newKey();

    const first = await agent.post(path).set('Idempotency-Key', key).send({ name: 'Once Only', phone: '555-0101' });
    const again = await agent.post(path).set('Idempotency-Key', key).send({ name: 'Once Only', phone: '555-0101' });
    const other = await agent.post(path).set('Idempotency-Key', key).send({ name: 'Someone Else', phone: '555-0102' });
    const keyless = await agent.post(path).send({ name: 'No Key', email: uniqueEmail('nokey') });

    expect(first.status).toBe(201);
    expect(again.status).toBe(201);
    expect(again.body).toEqual(first.body);
    expect(other.status).toBe(422);
    expect(keyless.status).toBe(201);
    const found = await agent.get(`${path}?q=Once Only`);
    expect(found.body.customers).toHaveLength(1);
  });
});
