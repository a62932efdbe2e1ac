import { randomUUID } from 'node:crypto';
import { levelReading, sharpening, ticket, ticketPair } from '@rinkwright/db';
import { createStation } from '@rinkwright/db/testing';
import { currentDb } from '@rinkwright/db/unscoped';
import { eq } from 'drizzle-orm';
import { describe, expect, it } from 'vitest';
import { buildTestApp } from '../support/app';
import { HALF_INCH_NM, HOCKEY_WIDTH_NM, THOU_NM, createDesk, logBody, logPair, rowsOf, takeIn, transition, write, type Desk, type TicketBody } from '../support/desk';
import type { Staffer } from '../support/world';

// The sharpening log: a pair logged with its readings, batch mode, re-runs and corrections. Nothing is overwritten.

const api = buildTestApp();
const as = (staffer: Staffer) => api.signIn(staffer.email, staffer.password);

const logPath = (desk: Desk, ticketId: string) => `/api/rinks/${desk.world.slug}/tickets/${ticketId}/sharpenings`;
const rerunPath = (desk: Desk, sharpeningId: string) => `/api/rinks/${desk.world.slug}/sharpenings/${sharpeningId}/readings`;
const correctionPath = (desk: Desk, sharpeningId: string) => `/api/rinks/${desk.world.slug}/sharpenings/${sharpeningId}/corrections`;

const firstSharpening = (t: TicketBody) => t.pairs[0]?.sharpenings[0];

describe('logging a pair', () => {
  it('records hollow, passes, width and a reading per blade in nm, with who and when', async () => {
    const desk = await createDesk('Ice Harbor');
    const technician = await as(desk.world.staff.technician);
    const made = await takeIn(technician, desk);

    const before = Date.now();
    const response = await write(technician, logPath(desk, made.id), logBody(desk, { pairId: made.pairs[0]?.id, passes: 5 }));
    const after = Date.now();

    expect(response.status).toBe(201);
    const logged = firstSharpening(response.body as TicketBody);
    expect(logged).toMatchObject({
      stationId: desk.station.id,
      stationName: desk.station.name,
      technician: desk.world.staff.technician.name,
      hollowNm: HALF_INCH_NM,
      passes: 5,
      bladeWidthNm: HOCKEY_WIDTH_NM,
      correctsId: null,
    });
    expect(logged?.readings.map((r) => [r.blade, r.attempt, r.readingNm, r.tiltMillideg, r.takenBy])).toEqual([
      ['left', 1, 5_080, null, desk.world.staff.technician.name],
      ['right', 1, -2_540, null, desk.world.staff.technician.name],
    ]);
    for (const reading of logged?.readings ?? []) {
      expect(Date.parse(reading.takenAt)).toBeGreaterThanOrEqual(before);
      expect(Date.parse(reading.takenAt)).toBeLessThanOrEqual(after);
    }
    expect(await rowsOf(sharpening, desk.world.id)).toBe(1);
    expect(await rowsOf(levelReading, desk.world.id)).toBe(2);
  });

  it('answers with the whole ticket, as a later read gives it: pairs by position, their sharpenings, readings by blade and attempt', async () => {
    const desk = await createDesk('Ice Harbor');
    const technician = await as(desk.world.staff.technician);
    const manager = await as(desk.world.staff.manager);
    const made = await takeIn(technician, desk, 3);
    const [first, second, third] = made.pairs;

    // The second pair first, with no readings; then the first, and a re-run of its left blade by the manager.
    await logPair(manager, desk, made.id, second?.id ?? '', { readings: [] });
    const sharpeningId = firstSharpening(await logPair(technician, desk, made.id, first?.id ?? ''))?.id ?? '';
    const rerun = await write(manager, rerunPath(desk, sharpeningId), { readings: [{ blade: 'left', readingNm: 1_270 }] });
    const fetched = (await technician.get(`/api/rinks/${desk.world.slug}/tickets/${made.id}`)).body as TicketBody;

    expect(rerun.status).toBe(201);
    expect(fetched).toEqual(rerun.body);
    expect([fetched.pairCount, fetched.pairsDone]).toEqual([3, 2]);
    expect(fetched.pairs.map((p) => [p.id, p.position, p.sharpenings.length])).toEqual([
      [first?.id, 1, 1],
      [second?.id, 2, 1],
      [third?.id, 3, 0],
    ]);
    expect(fetched.pairs[0]?.sharpenings[0]?.readings.map((r) => [r.blade, r.attempt, r.readingNm, r.takenBy])).toEqual([
      ['left', 1, 5_080, desk.world.staff.technician.name],
      ['left', 2, 1_270, desk.world.staff.manager.name],
      ['right', 1, -2_540, desk.world.staff.technician.name],
    ]);
    expect(fetched.pairs[1]?.sharpenings[0]).toMatchObject({ technician: desk.world.staff.manager.name, readings: [] });
  });

  it('answers each log with the ticket exactly as reading it back gives it: moves, new pairs, credit, re-runs, no readings', async () => {
    // The answer is built from the rows read under the ticket's lock plus the log's own (no read-back), so it is
    // checked here against a fresh read after every kind of log.
    const desk = await createDesk('Ice Harbor');
    const technician = await as(desk.world.staff.technician);
    const manager = await as(desk.world.staff.manager);
    const second = await createStation(currentDb(), desk.world.id, { name: 'Station Two' });
    const granted = await write(manager, `/api/rinks/${desk.world.slug}/customers/${desk.skater.id}/adjustments`, { credits: 3, reason: 'Prepaid at the counter' });
    expect(granted.status, JSON.stringify(granted.body)).toBe(201);
    const balance = async () => (await manager.get(`/api/rinks/${desk.world.slug}/customers/${desk.skater.id}/balance`)).body.credits as number;
    const made = await takeIn(technician, desk, 2, { payment: 'credit' });
    expect(await balance()).toBe(1);
    const readBack = async () => (await technician.get(`/api/rinks/${desk.world.slug}/tickets/${made.id}`)).body as TicketBody;
    const logged = async (body: Record<string, unknown>, by = technician) => {
      const answer = await write(by, logPath(desk, made.id), logBody(desk, body));
      expect(answer.status, JSON.stringify(answer.body)).toBe(201);
      expect(answer.body).toEqual(await readBack());
      return answer.body as TicketBody;
    };

    // Waiting → on Station One, with both readings.
    const first = await logged({ pairId: made.pairs[0]?.id });
    const sharpeningId = firstSharpening(first)?.id ?? '';
    expect((await write(manager, rerunPath(desk, sharpeningId), { readings: [{ blade: 'left', readingNm: 1_270 }] })).status).toBe(201);
    // Moved to Station Two, no readings, by the manager.
    const moved = await logged({ pairId: made.pairs[1]?.id, stationId: second.id, readings: [] }, manager);
    expect(moved).toMatchObject({ state: 'on_station', stationId: second.id, pairCount: 2, pairsDone: 2 });
    expect(moved.events.map((e) => [e.fromState, e.toState, e.stationName])).toEqual([
      [null, 'waiting', null],
      ['waiting', 'on_station', desk.station.name],
      ['on_station', 'on_station', second.name],
    ]);
    // A new pair on the same station, read from a tilt angle: it draws the skater's last credit.
    const added = await logged({ stationId: second.id, newPair: { label: 'Spare pair', serviceId: desk.service.id }, readings: [{ blade: 'right', tiltDeg: 0.5 }] });
    expect(added.pairs.map((p) => [p.position, p.label, p.sharpenings.length])).toEqual([
      [1, 'Pair 1', 1],
      [2, 'Pair 2', 1],
      [3, 'Spare pair', 1],
    ]);
    expect(await balance()).toBe(0);
    // With no credit left, a further credit pair is refused whole: no pair, no sharpening, no move.
    const refused = await write(technician, logPath(desk, made.id), logBody(desk, { newPair: { label: 'One too many', serviceId: desk.service.id } }));
    expect(refused.status).toBe(409);
    expect(await readBack()).toEqual(added);
  });

  it('turns a tilt angle into Δh = w·tan θ on the logged blade width', async () => {
    const desk = await createDesk('North Pond Arena');
    const technician = await as(desk.world.staff.technician);
    const made = await takeIn(technician, desk, 2);
    const [hockey, figure] = made.pairs;

    await logPair(technician, desk, made.id, hockey?.id ?? '', {
      readings: [
        { blade: 'left', tiltDeg: 0.5018 },
        { blade: 'right', tiltDeg: -0.5018 },
      ],
    });
    const after = await logPair(technician, desk, made.id, figure?.id ?? '', { bladeWidthNm: 4_000_000, readings: [{ blade: 'left', tiltDeg: 0.5018 }] });

    const [left, right] = after.pairs[0]?.sharpenings[0]?.readings ?? [];
    // trade-facts.md, "Edge level": w = 2.9 mm, θ = 0.5018° gives Δh = 0.001" = 25,400 nm; the angle is rounded
    // to four places, worth about 2.5 nm here.
    expect(Math.abs((left?.readingNm ?? 0) - THOU_NM)).toBeLessThanOrEqual(3);
    expect(right?.readingNm).toBe(-(left?.readingNm ?? 0));
    expect([left?.tiltMillideg, right?.tiltMillideg]).toEqual([502, -502]);
    // Δh = w·tan θ (trade-facts.md, "Edge level") on a 4.0 mm figure blade: 4,000,000 · tan 0.5018° = 35,033 nm.
    expect(after.pairs[1]?.sharpenings[0]?.readings[0]?.readingNm).toBe(35_033);
  });

  it('puts a waiting ticket on the station where its pair was logged', async () => {
    const desk = await createDesk('Ice Harbor');
    const technician = await as(desk.world.staff.technician);
    const made = await takeIn(technician, desk, 2);
    expect(made.state).toBe('waiting');

    const after = await logPair(technician, desk, made.id, made.pairs[0]?.id ?? '');

    expect(after).toMatchObject({ state: 'on_station', stationId: desk.station.id, pairsDone: 1, pairCount: 2 });
    expect(after.events.map((e) => [e.fromState, e.toState, e.stationName])).toEqual([
      [null, 'waiting', null],
      ['waiting', 'on_station', desk.station.name],
    ]);
    // The work started when the first pair was logged: the ticket's start is that move's moment, and it stays.
    const startedAt = async () => (await currentDb().select({ at: ticket.startedAt }).from(ticket).where(eq(ticket.id, made.id)))[0]?.at;
    const moved = after.events[1]?.at;
    expect((await startedAt())?.toISOString()).toBe(moved);
    await logPair(technician, desk, made.id, made.pairs[1]?.id ?? '');
    expect((await startedAt())?.toISOString()).toBe(moved);
  });

  it('refuses a second log of the same pair with 409 and keeps the first', async () => {
    const desk = await createDesk('Ice Harbor');
    const technician = await as(desk.world.staff.technician);
    const made = await takeIn(technician, desk);
    const pairId = made.pairs[0]?.id ?? '';
    await logPair(technician, desk, made.id, pairId, { passes: 4 });

    const again = await write(technician, logPath(desk, made.id), logBody(desk, { pairId, passes: 9 }));

    expect(again.status).toBe(409);
    expect(again.body.error.code).toBe('conflict');
    expect(await rowsOf(sharpening, desk.world.id)).toBe(1);
    const ticket = (await technician.get(`/api/rinks/${desk.world.slug}/tickets/${made.id}`)).body as TicketBody;
    expect(firstSharpening(ticket)?.passes).toBe(4);
  });

  it('logs a pair once when two tablets log it at the same moment; the other is told 409', async () => {
    const desk = await createDesk('North Pond Arena');
    const technician = await as(desk.world.staff.technician);
    const manager = await as(desk.world.staff.manager);

    for (let round = 1; round <= 3; round++) {
      const made = await takeIn(technician, desk);
      const body = logBody(desk, { pairId: made.pairs[0]?.id });
      // Each tablet makes its own key: this is two actions, not one pressed twice.
      const answers = await Promise.all([write(technician, logPath(desk, made.id), body), write(manager, logPath(desk, made.id), body)]);

      expect(answers.map((a) => a.status).sort(), `round ${round}`).toEqual([201, 409]);
      expect(await rowsOf(sharpening, desk.world.id, eq(sharpening.ticketId, made.id))).toBe(1);
    }
  });

  it('refuses logging on a ticket that is ready (409)', async () => {
    const desk = await createDesk('North Pond Arena');
    const technician = await as(desk.world.staff.technician);
    const made = await takeIn(technician, desk);
    await logPair(technician, desk, made.id, made.pairs[0]?.id ?? '');
    expect((await transition(technician, desk, made.id, { to: 'ready' })).status).toBe(200);

    const late = await write(technician, logPath(desk, made.id), logBody(desk, { newPair: { label: 'Forgotten pair', serviceId: desk.service.id } }));

    expect(late.status).toBe(409);
    expect(await rowsOf(ticketPair, desk.world.id)).toBe(1);
  });

  it('refuses naming both a pair and a new pair, or neither (400 fields.pairId)', async () => {
    const desk = await createDesk('Ice Harbor');
    const technician = await as(desk.world.staff.technician);
    const made = await takeIn(technician, desk);

    const both = await write(technician, logPath(desk, made.id), logBody(desk, { pairId: made.pairs[0]?.id, newPair: { label: 'Extra', serviceId: desk.service.id } }));
    const neither = await write(technician, logPath(desk, made.id), logBody(desk));

    expect(both.status).toBe(400);
    expect(Object.keys(both.body.error.fields)).toEqual(['pairId']);
    expect(neither.status).toBe(400);
    expect(Object.keys(neither.body.error.fields)).toEqual(['pairId']);
    expect(await rowsOf(sharpening, desk.world.id)).toBe(0);
  });

  it('refuses a pair of another ticket, an unknown station and one not in use (400 fields), and writes nothing', async () => {
    const desk = await createDesk('Ice Harbor');
    const manager = await as(desk.world.staff.manager);
    const made = await takeIn(manager, desk);
    const other = await takeIn(manager, desk);
    const parked = await manager
      .post(`/api/rinks/${desk.world.slug}/stations`)
      .send({ name: 'Station Two', status: 'maintenance', rpm: 3450, adjustStepMilli: 125 });
    const pairId = made.pairs[0]?.id;

    const elsewhere = await write(manager, logPath(desk, made.id), logBody(desk, { pairId: other.pairs[0]?.id }));
    const nowhere = await write(manager, logPath(desk, made.id), logBody(desk, { pairId, stationId: randomUUID() }));
    const resting = await write(manager, logPath(desk, made.id), logBody(desk, { pairId, stationId: parked.body.id }));

    expect([elsewhere.status, Object.keys(elsewhere.body.error.fields)]).toEqual([400, ['pairId']]);
    expect([nowhere.status, Object.keys(nowhere.body.error.fields)]).toEqual([400, ['stationId']]);
    expect([resting.status, resting.body.error.fields.stationId]).toEqual([400, ['Station Two is not active']]);
    expect(await rowsOf(sharpening, desk.world.id)).toBe(0);
    // The same pair then logs at the rink's station, on its own ticket.
    expect((await logPair(manager, desk, made.id, pairId ?? '')).pairsDone).toBe(1);
  });
});

describe('batch mode', () => {
  it('adds a new pair to the ticket with each row logged, one request after another, in order', async () => {
    const desk = await createDesk('Ice Harbor');
    const technician = await as(desk.world.staff.technician);
    // A ticket is taken in with at least one pair: the bag's tag. The rows of the bag follow it.
    const bag = await takeIn(technician, desk, 1, { pairs: [{ label: 'Team bag', serviceId: desk.service.id }] });
    const labels = ['Player 4', 'Player 7', 'Player 12', 'Player 19', 'Player 31'];

    for (const [i, label] of labels.entries()) {
      const row = await write(technician, logPath(desk, bag.id), logBody(desk, { newPair: { label, serviceId: desk.service.id, bladeWidthNm: HOCKEY_WIDTH_NM }, passes: 3 + i }));
      expect(row.status, label).toBe(201);
    }

    const ticket = (await technician.get(`/api/rinks/${desk.world.slug}/tickets/${bag.id}`)).body as TicketBody;
    const added = ticket.pairs.filter((p) => p.label !== 'Team bag');
    expect(added.map((p) => [p.position, p.label])).toEqual(labels.map((label, i) => [i + 2, label]));
    expect(added.map((p) => p.sharpenings.map((s) => s.passes))).toEqual([[3], [4], [5], [6], [7]]);
    expect(added.every((p) => p.bladeWidthNm === HOCKEY_WIDTH_NM)).toBe(true);
    expect(ticket).toMatchObject({ pairCount: 6, pairsDone: 5 });
    expect(await rowsOf(ticketPair, desk.world.id, eq(ticketPair.ticketId, bag.id))).toBe(6);
    expect(await rowsOf(sharpening, desk.world.id, eq(sharpening.ticketId, bag.id))).toBe(5);
  });

  it('gives each row its own position when several go out at once, as a queue of pending writes does on reconnecting', async () => {
    const desk = await createDesk('Ice Harbor');
    const technician = await as(desk.world.staff.technician);
    const bag = await takeIn(technician, desk, 1, { pairs: [{ label: 'Team bag', serviceId: desk.service.id }] });
    const labels = ['Player 2', 'Player 3', 'Player 5', 'Player 8', 'Player 13'];

    const answers = await Promise.all(labels.map((label) => write(technician, logPath(desk, bag.id), logBody(desk, { newPair: { label, serviceId: desk.service.id } }))));

    expect(answers.map((a) => a.status)).toEqual([201, 201, 201, 201, 201]);
    const ticket = (await technician.get(`/api/rinks/${desk.world.slug}/tickets/${bag.id}`)).body as TicketBody;
    expect(ticket.pairs.map((p) => p.position)).toEqual([1, 2, 3, 4, 5, 6]);
    expect(ticket.pairs.slice(1).map((p) => p.label).sort()).toEqual([...labels].sort());
    expect(ticket.pairs.slice(1).every((p) => p.sharpenings.length === 1)).toBe(true);
  });

  it('refuses a new pair with a service the rink does not offer, and adds nothing', async () => {
    const desk = await createDesk('North Pond Arena');
    const other = await createDesk('Ice Harbor');
    const technician = await as(desk.world.staff.technician);
    const bag = await takeIn(technician, desk);

    const response = await write(technician, logPath(desk, bag.id), logBody(desk, { newPair: { label: 'Stray', serviceId: other.service.id } }));

    expect(response.status).toBe(400);
    expect(Object.keys(response.body.error.fields)).toEqual(['newPair.serviceId']);
    expect(await rowsOf(ticketPair, desk.world.id)).toBe(1);
    expect(await rowsOf(sharpening, desk.world.id)).toBe(0);
  });
});

describe('re-runs', () => {
  it('add the next attempt per blade and leave the earlier readings as they were', async () => {
    const desk = await createDesk('Ice Harbor');
    const technician = await as(desk.world.staff.technician);
    const manager = await as(desk.world.staff.manager);
    const made = await takeIn(technician, desk);
    const logged = firstSharpening(await logPair(technician, desk, made.id, made.pairs[0]?.id ?? ''));
    const sharpeningId = logged?.id ?? '';
    const firstReadings = await currentDb().select().from(levelReading).where(eq(levelReading.sharpeningId, sharpeningId));

    const leftAgain = await write(technician, rerunPath(desk, sharpeningId), { readings: [{ blade: 'left', readingNm: 1_270 }] });
    const bothAgain = await write(manager, rerunPath(desk, sharpeningId), { readings: [{ blade: 'left', readingNm: -635 }, { blade: 'right', readingNm: 0 }] });

    expect(leftAgain.status).toBe(201);
    expect(bothAgain.status).toBe(201);
    const readings = firstSharpening(bothAgain.body as TicketBody)?.readings ?? [];
    const technicianName = desk.world.staff.technician.name;
    expect(readings.map((r) => [r.blade, r.attempt, r.readingNm, r.takenBy])).toEqual([
      ['left', 1, 5_080, technicianName],
      ['left', 2, 1_270, technicianName],
      ['left', 3, -635, desk.world.staff.manager.name],
      ['right', 1, -2_540, technicianName],
      ['right', 2, 0, desk.world.staff.manager.name],
    ]);
    const attemptOnes = (await currentDb().select().from(levelReading).where(eq(levelReading.sharpeningId, sharpeningId))).filter((r) => r.attempt === 1);
    expect(attemptOnes.sort((a, b) => a.id.localeCompare(b.id))).toEqual(firstReadings.sort((a, b) => a.id.localeCompare(b.id)));
  });

  it('refuses two readings of one blade in one re-run (400 fields.readings)', async () => {
    const desk = await createDesk('North Pond Arena');
    const technician = await as(desk.world.staff.technician);
    const made = await takeIn(technician, desk);
    const sharpeningId = firstSharpening(await logPair(technician, desk, made.id, made.pairs[0]?.id ?? ''))?.id ?? '';

    const response = await write(technician, rerunPath(desk, sharpeningId), { readings: [{ blade: 'left', readingNm: 1 }, { blade: 'left', readingNm: 2 }] });

    expect(response.status).toBe(400);
    expect(Object.keys(response.body.error.fields)).toEqual(['readings']);
    expect(await rowsOf(levelReading, desk.world.id)).toBe(2);
  });
});

describe('corrections', () => {
  it('add a new record pointing at the original, which stays as it was; both show with who made them', async () => {
    const desk = await createDesk('Ice Harbor');
    const technician = await as(desk.world.staff.technician);
    const manager = await as(desk.world.staff.manager);
    const made = await takeIn(technician, desk);
    const original = firstSharpening(await logPair(technician, desk, made.id, made.pairs[0]?.id ?? '', { passes: 4 }));
    const originalId = original?.id ?? '';
    const [rowBefore] = await currentDb().select().from(sharpening).where(eq(sharpening.id, originalId));

    const response = await write(manager, correctionPath(desk, originalId), { reason: 'Logged 4 passes, ground 6', hollowNm: HALF_INCH_NM, passes: 6, bladeWidthNm: HOCKEY_WIDTH_NM });

    expect(response.status).toBe(201);
    const shown = (response.body as TicketBody).pairs[0]?.sharpenings ?? [];
    expect(shown.map((s) => ({ id: s.id, passes: s.passes, correctsId: s.correctsId, technician: s.technician }))).toEqual([
      { id: originalId, passes: 4, correctsId: null, technician: desk.world.staff.technician.name },
      { id: expect.any(String), passes: 6, correctsId: originalId, technician: desk.world.staff.manager.name },
    ]);
    expect(shown[1]).toMatchObject({ correctionReason: 'Logged 4 passes, ground 6' });
    expect(shown[0]?.readings).toHaveLength(2);
    const [rowAfter] = await currentDb().select().from(sharpening).where(eq(sharpening.id, originalId));
    expect(rowAfter).toEqual(rowBefore);
    expect(await rowsOf(sharpening, desk.world.id)).toBe(2);

    const fetched = (await technician.get(`/api/rinks/${desk.world.slug}/tickets/${made.id}`)).body as TicketBody;
    expect(fetched.pairs[0]?.sharpenings.map((s) => s.correctsId)).toEqual([null, originalId]);
  });

  it('need a reason (400 fields.reason), and correct the original rather than a correction (409)', async () => {
    const desk = await createDesk('North Pond Arena');
    const technician = await as(desk.world.staff.technician);
    const made = await takeIn(technician, desk);
    const originalId = firstSharpening(await logPair(technician, desk, made.id, made.pairs[0]?.id ?? ''))?.id ?? '';
    const fix = { hollowNm: HALF_INCH_NM, passes: 5, bladeWidthNm: HOCKEY_WIDTH_NM };

    const unexplained = await write(technician, correctionPath(desk, originalId), fix);
    const first = await write(technician, correctionPath(desk, originalId), { ...fix, reason: 'Passes miscounted' });
    const correctionId = (first.body as TicketBody).pairs[0]?.sharpenings[1]?.id ?? '';
    const ofCorrection = await write(technician, correctionPath(desk, correctionId), { ...fix, reason: 'Once more' });

    expect(unexplained.status).toBe(400);
    expect(Object.keys(unexplained.body.error.fields)).toEqual(['reason']);
    expect(first.status).toBe(201);
    expect(ofCorrection.status).toBe(409);
    expect(await rowsOf(sharpening, desk.world.id)).toBe(2);
  });
});
