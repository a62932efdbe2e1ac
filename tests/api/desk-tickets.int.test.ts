import { createTicket } from '@rinkwright/db/testing';
import { ticket as ticketTable } from '@rinkwright/db';
import { currentDb } from '@rinkwright/db/unscoped';
import { and, eq } from 'drizzle-orm';
import { describe, expect, it } from 'vitest';
import { DEFAULT_DESK_SETTINGS } from '../../apps/api/src/lib/desk-settings';
import { buildTestApp } from '../support/app';
import {
  HALF_INCH_NM,
  HOCKEY_WIDTH_NM,
  createDesk,
  logPair,
  pair,
  profileFor,
  rowsOf,
  takeIn,
  ticketBody,
  transition,
  write,
  type Desk,
  type TicketBody,
} from '../support/desk';
import { waitForMail } from '../support/mail';
import { createCustomerAt, type Staffer } from '../support/world';

// The counter's tickets: intake with a promised time, the moves a ticket may make, the ready e-mail, the queue.

const api = buildTestApp();
const as = (staffer: Staffer) => api.signIn(staffer.email, staffer.password);

const MINUTE = 60_000;
/** The promise is rounded up to whole 5 minutes of UTC (promiseTime's default). */
const ceilToFive = (ms: number) => Math.ceil(ms / (5 * MINUTE)) * 5 * MINUTE;

const ticketsPath = (desk: Desk) => `/api/rinks/${desk.world.slug}/tickets`;

async function stateOf(desk: Desk, ticketId: string): Promise<string> {
  const agent = await as(desk.world.staff.manager);
  return (await agent.get(`${ticketsPath(desk)}/${ticketId}`)).body.state as string;
}

describe('intake', () => {
  it('answers 201 with the pairs, numbering tickets 1, 2, … at each rink on its own', async () => {
    const harbor = await createDesk('Ice Harbor');
    const pond = await createDesk('North Pond Arena');
    const atHarbor = await as(harbor.world.staff.technician);
    const atPond = await as(pond.world.staff.technician);

    const response = await write(atHarbor, ticketsPath(harbor), {
      customerId: harbor.skater.id,
      pairs: [pair(harbor, { label: 'Game skates' }), pair(harbor, { label: 'Practice skates', notes: 'nick near the heel' })],
    });
    const second = await takeIn(atHarbor, harbor);
    const firstAtPond = await takeIn(atPond, pond);
    const third = await takeIn(atHarbor, harbor);

    expect(response.status).toBe(201);
    expect(response.body).toMatchObject({
      number: 1,
      state: 'waiting',
      customer: { id: harbor.skater.id, name: harbor.skater.name },
      stationId: null,
      payment: 'counter',
      pairCount: 2,
      pairsDone: 0,
      readyAt: null,
    });
    expect(response.body.pairs).toEqual([
      expect.objectContaining({ position: 1, label: 'Game skates', serviceId: harbor.service.id, serviceName: 'Standard sharpening', priceMinor: 1200, notes: null, sharpenings: [] }),
      expect.objectContaining({ position: 2, label: 'Practice skates', notes: 'nick near the heel', sharpenings: [] }),
    ]);
    expect(response.body.events).toEqual([expect.objectContaining({ fromState: null, toState: 'waiting', by: harbor.world.staff.technician.name })]);
    expect([second.number, third.number, firstAtPond.number]).toEqual([2, 3, 1]);
    expect(await rowsOf(ticketTable, harbor.world.id)).toBe(3);
  });

  it('promises a time after now that follows the rink default minutes per pair while the stations have no history', async () => {
    const desk = await createDesk('Ice Harbor');
    const technician = await as(desk.world.staff.technician);
    const perPair = DEFAULT_DESK_SETTINGS.defaultMinutesPerPair;

    const before = Date.now();
    const first = await takeIn(technician, desk, 1);
    const afterFirst = Date.now();
    const second = await takeIn(technician, desk, 2);
    const afterSecond = Date.now();

    // One station, nothing ahead: the single pair takes the default.
    const firstAt = Date.parse(first.promisedAt);
    expect(firstAt).toBeGreaterThan(afterFirst);
    expect(firstAt).toBeGreaterThanOrEqual(before + perPair * MINUTE);
    expect(firstAt).toBeLessThanOrEqual(ceilToFive(afterFirst + perPair * MINUTE));
    // The two new pairs wait behind the first ticket's one pair on the same station.
    const secondAt = Date.parse(second.promisedAt);
    expect(secondAt).toBeGreaterThanOrEqual(before + 3 * perPair * MINUTE);
    expect(secondAt).toBeLessThanOrEqual(ceilToFive(afterSecond + 3 * perPair * MINUTE));
  });

  it("uses the rink's own default once a manager changes it", async () => {
    const desk = await createDesk('North Pond Arena');
    const manager = await as(desk.world.staff.manager);
    const saved = await manager.put(`/api/rinks/${desk.world.slug}/desk-settings`).send({ ...DEFAULT_DESK_SETTINGS, defaultMinutesPerPair: 20 });
    expect(saved.status).toBe(200);

    const before = Date.now();
    const made = await takeIn(manager, desk, 3);
    const after = Date.now();
    const promise = await manager.get(`/api/rinks/${desk.world.slug}/promise`).query({ pairs: 1 });

    const at = Date.parse(made.promisedAt);
    expect(at).toBeGreaterThanOrEqual(before + 60 * MINUTE);
    expect(at).toBeLessThanOrEqual(ceilToFive(after + 60 * MINUTE));
    expect(promise.status).toBe(200);
    expect(promise.body).toMatchObject({ minutesPerPair: 20, stationsActive: 1 });
  });

  it('answers 409 and writes nothing when no station is active', async () => {
    const desk = await createDesk('Ice Harbor', { stationStatus: 'maintenance' });
    const technician = await as(desk.world.staff.technician);

    const response = await write(technician, ticketsPath(desk), ticketBody(desk));

    expect(response.status).toBe(409);
    expect(response.body.error.code).toBe('conflict');
    expect(await rowsOf(ticketTable, desk.world.id)).toBe(0);
  });

  it("names each pair whose service is another rink's or inactive, and writes nothing", async () => {
    const desk = await createDesk('Ice Harbor');
    const other = await createDesk('North Pond Arena');
    const manager = await as(desk.world.staff.manager);
    const retired = await manager
      .post(`/api/rinks/${desk.world.slug}/services`)
      .send({ name: 'Old profiling', kind: 'profiling', priceMinor: 3000, active: false });
    expect(retired.status).toBe(201);

    const response = await write(manager, ticketsPath(desk), {
      customerId: desk.skater.id,
      pairs: [pair(desk), pair(desk, { serviceId: other.service.id }), pair(desk, { serviceId: retired.body.id })],
    });

    expect(response.status).toBe(400);
    expect(response.body.error.code).toBe('validation_failed');
    expect(Object.keys(response.body.error.fields).sort()).toEqual(['pairs.1.serviceId', 'pairs.2.serviceId']);
    expect(await rowsOf(ticketTable, desk.world.id)).toBe(0);
  });

  it('takes blade width and preferred hollow from the skate profile unless the pair gives its own', async () => {
    const desk = await createDesk('Ice Harbor');
    const technician = await as(desk.world.staff.technician);
    // 5/8" and 3/8" hollows and a 3.0 mm runner: common sizes (trade-facts.md, "Hollow geometry", "Blades and service").
    const profile = await profileFor(desk, { bladeWidthNm: 3_000_000, preferredHollowNm: 15_875_000 });

    const made = await takeIn(technician, desk, 1, {
      pairs: [
        pair(desk, { label: 'From the profile', skateProfileId: profile.id }),
        pair(desk, { label: 'Own hollow', skateProfileId: profile.id, hollowNm: 9_525_000 }),
        pair(desk, { label: 'Walk-up', bladeWidthNm: HOCKEY_WIDTH_NM }),
      ],
    });

    expect(made.pairs.map((p) => [p.label, p.bladeWidthNm, p.hollowNm])).toEqual([
      ['From the profile', 3_000_000, 15_875_000],
      ['Own hollow', 3_000_000, 9_525_000],
      ['Walk-up', HOCKEY_WIDTH_NM, null],
    ]);
  });

  it("refuses another customer's skate profile on a pair", async () => {
    const desk = await createDesk('Ice Harbor');
    const technician = await as(desk.world.staff.technician);
    const sibling = await createCustomerAt(desk.world.id, { name: 'Sam Testwood' });
    const theirs = await profileFor(desk, {}, sibling.id);

    const response = await write(technician, ticketsPath(desk), {
      customerId: desk.skater.id,
      pairs: [pair(desk, { skateProfileId: theirs.id })],
    });

    expect(response.status).toBe(400);
    expect(Object.keys(response.body.error.fields)).toEqual(['pairs.0.skateProfileId']);
    expect(await rowsOf(ticketTable, desk.world.id)).toBe(0);
  });
});

describe('moving a ticket', () => {
  it('goes waiting → on_station → ready → collected, each move in the history with who made it', async () => {
    const desk = await createDesk('Ice Harbor');
    const technician = await as(desk.world.staff.technician);
    const made = await takeIn(technician, desk);

    const onStation = await transition(technician, desk, made.id, { to: 'on_station', stationId: desk.station.id });
    expect(onStation.status).toBe(200);
    expect(onStation.body).toMatchObject({ state: 'on_station', stationId: desk.station.id });
    await logPair(technician, desk, made.id, made.pairs[0]?.id ?? '');
    const beforeReady = Date.now();
    const ready = await transition(technician, desk, made.id, { to: 'ready' });
    const afterReady = Date.now();
    const collected = await transition(technician, desk, made.id, { to: 'collected' });

    expect(ready.status).toBe(200);
    expect(ready.body.state).toBe('ready');
    expect(Date.parse(ready.body.readyAt)).toBeGreaterThanOrEqual(beforeReady);
    expect(Date.parse(ready.body.readyAt)).toBeLessThanOrEqual(afterReady);
    expect(collected.status).toBe(200);
    expect(collected.body.state).toBe('collected');
    const history = (collected.body as TicketBody).events;
    expect(history.map((e) => [e.fromState, e.toState])).toEqual([
      [null, 'waiting'],
      ['waiting', 'on_station'],
      ['on_station', 'ready'],
      ['ready', 'collected'],
    ]);
    expect(history[1]).toMatchObject({ stationName: desk.station.name, by: desk.world.staff.technician.name });
  });

  it('refuses with 409 every move the state does not allow, and the ticket stays where it was', async () => {
    const desk = await createDesk('Ice Harbor');
    const technician = await as(desk.world.staff.technician);
    const waiting = await takeIn(technician, desk);
    const done = await takeIn(technician, desk);
    await logPair(technician, desk, done.id, done.pairs[0]?.id ?? '');
    expect((await transition(technician, desk, done.id, { to: 'ready' })).status).toBe(200);
    expect((await transition(technician, desk, done.id, { to: 'collected' })).status).toBe(200);
    const voided = await takeIn(technician, desk);
    expect((await transition(technician, desk, voided.id, { to: 'void', reason: 'Skater took them home' })).status).toBe(200);

    const refused = [
      [waiting.id, { to: 'ready' }],
      [waiting.id, { to: 'collected' }],
      [waiting.id, { to: 'waiting' }],
      [done.id, { to: 'on_station', stationId: desk.station.id }],
      [done.id, { to: 'void', reason: 'Too late for that' }],
      [voided.id, { to: 'waiting' }],
      [voided.id, { to: 'on_station', stationId: desk.station.id }],
    ] as const;
    for (const [ticketId, body] of refused) {
      const response = await transition(technician, desk, ticketId, body);
      expect(response.status, `${body.to} of a ticket that is ${await stateOf(desk, ticketId)}`).toBe(409);
      expect(response.body.error.code).toBe('conflict');
    }

    expect([await stateOf(desk, waiting.id), await stateOf(desk, done.id), await stateOf(desk, voided.id)]).toEqual(['waiting', 'collected', 'void']);
  });

  it('refuses ready while a pair is not logged', async () => {
    const desk = await createDesk('North Pond Arena');
    const technician = await as(desk.world.staff.technician);
    const made = await takeIn(technician, desk, 2);
    await logPair(technician, desk, made.id, made.pairs[0]?.id ?? '');

    const response = await transition(technician, desk, made.id, { to: 'ready' });

    expect(response.status).toBe(409);
    expect(response.body.error.message).toMatch(/1 pair is not logged/);
    expect(await stateOf(desk, made.id)).toBe('on_station');
  });

  it('refuses a station that is not active (400 fields.stationId)', async () => {
    const desk = await createDesk('Ice Harbor');
    const manager = await as(desk.world.staff.manager);
    const made = await takeIn(manager, desk);
    const parked = await manager
      .post(`/api/rinks/${desk.world.slug}/stations`)
      .send({ name: 'Station Two', status: 'maintenance', rpm: 3450, adjustStepMilli: 125 });

    const response = await transition(manager, desk, made.id, { to: 'on_station', stationId: parked.body.id });

    expect(response.status).toBe(400);
    expect(Object.keys(response.body.error.fields)).toEqual(['stationId']);
    expect(await stateOf(desk, made.id)).toBe('waiting');
  });

  it('e-mails the skater when the ticket is ready', async () => {
    const desk = await createDesk('North Pond Arena');
    const technician = await as(desk.world.staff.technician);
    const made = await takeIn(technician, desk);
    await logPair(technician, desk, made.id, made.pairs[0]?.id ?? '');

    const response = await transition(technician, desk, made.id, { to: 'ready' });

    expect(response.status).toBe(200);
    const mail = await waitForMail(desk.skater.email, { subject: /ready/ });
    expect(mail.subject).toBe(`Your skates are ready at ${desk.world.name}`);
    expect(mail.text).toContain(`ticket ${made.number}`);
  });

  it('voids only with a reason (400 fields.reason), and keeps the reason', async () => {
    const desk = await createDesk('Ice Harbor');
    const technician = await as(desk.world.staff.technician);
    const made = await takeIn(technician, desk);

    const without = await transition(technician, desk, made.id, { to: 'void' });
    const blank = await transition(technician, desk, made.id, { to: 'void', reason: '   ' });
    expect(without.status).toBe(400);
    expect(Object.keys(without.body.error.fields)).toEqual(['reason']);
    expect(blank.status).toBe(400);
    expect(Object.keys(blank.body.error.fields)).toEqual(['reason']);
    expect(await stateOf(desk, made.id)).toBe('waiting');

    const voided = await transition(technician, desk, made.id, { to: 'void', reason: 'Entered twice by mistake' });
    expect(voided.status).toBe(200);
    expect(voided.body).toMatchObject({ state: 'void', voidReason: 'Entered twice by mistake' });
    expect((voided.body as TicketBody).events.at(-1)).toMatchObject({ fromState: 'waiting', toState: 'void', reason: 'Entered twice by mistake' });
  });
});

describe('the queue', () => {
  it('lists the open tickets by default with pairsDone of pairCount', async () => {
    const desk = await createDesk('Ice Harbor');
    const technician = await as(desk.world.staff.technician);
    const busy = await takeIn(technician, desk, 3);
    const fresh = await takeIn(technician, desk, 1);
    const gone = await takeIn(technician, desk, 1);
    const [first, second] = busy.pairs;
    const logged = await logPair(technician, desk, busy.id, first?.id ?? '');
    await logPair(technician, desk, busy.id, second?.id ?? '');
    // A correction and a re-run are more records for a pair already done, not more pairs done.
    const sharpeningId = logged.pairs[0]?.sharpenings[0]?.id ?? '';
    const corrected = await write(technician, `/api/rinks/${desk.world.slug}/sharpenings/${sharpeningId}/corrections`, {
      reason: 'Passes miscounted',
      hollowNm: HALF_INCH_NM,
      passes: 5,
      bladeWidthNm: HOCKEY_WIDTH_NM,
    });
    expect(corrected.status).toBe(201);
    expect((await transition(technician, desk, gone.id, { to: 'void', reason: 'Skater left' })).status).toBe(200);

    const open = await technician.get(ticketsPath(desk));
    const voided = await technician.get(ticketsPath(desk)).query({ state: 'void' });

    expect(open.status).toBe(200);
    const rows = open.body.tickets as { id: string; state: string; pairCount: number; pairsDone: number }[];
    expect(rows.map((t) => [t.id, t.state, t.pairsDone, t.pairCount]).sort()).toEqual(
      [
        [busy.id, 'on_station', 2, 3],
        [fresh.id, 'waiting', 0, 1],
      ].sort(),
    );
    expect(voided.body.tickets.map((t: { id: string }) => t.id)).toEqual([gone.id]);
  });

  it('keeps a collected ticket readable after the rink has collected more than 200', async () => {
    const desk = await createDesk('North Pond Arena');
    const technician = await as(desk.world.staff.technician);
    const start = Date.now() - 90 * 86_400_000;
    // Straight to the database: 201 collected tickets, oldest first, as a season of counter work leaves them.
    for (let n = 1; n <= 201; n++) {
      await createTicket(currentDb(), desk.world.id, {
        customerId: desk.skater.id,
        serviceId: desk.service.id,
        createdBy: desk.world.staff.technician.id,
        number: n,
        state: 'collected',
        droppedAt: new Date(start + n * 3_600_000),
      });
    }
    const [oldest] = await currentDb()
      .select({ id: ticketTable.id })
      .from(ticketTable)
      .where(and(eq(ticketTable.tenantId, desk.world.id), eq(ticketTable.number, 1)));

    const response = await technician.get(`${ticketsPath(desk)}/${oldest?.id ?? ''}`);

    expect(response.status).toBe(200);
    expect(response.body).toMatchObject({ number: 1, state: 'collected' });
  });
});
