import { passesOnWheelBefore } from '../../apps/api/src/features/stations/repository';
import { createCustomer, createStation, uniqueSuffix } from '@rinkwright/db/testing';
import { levelReading, levelingAdjustment, station as stationTable, wheel, wheelEvent } from '@rinkwright/db';
import { currentDb } from '@rinkwright/db/unscoped';
import { and, asc, eq } from 'drizzle-orm';
import { describe, expect, it } from 'vitest';
import { stationList } from '@rinkwright/core';
import { DEFAULT_DESK_SETTINGS } from '../../apps/api/src/lib/desk-settings';
import { buildTestApp, type Client } from '../support/app';
import { HALF_INCH_NM, HOCKEY_WIDTH_NM, createDesk, logPair, rowsOf, takeIn, write, type Desk, type TicketBody } from '../support/desk';
import { createRinkWithStaff, uniqueEmail, type Staffer } from '../support/world';

// Stations and their upkeep, the rink's desk settings, and finding or adding a skater at the counter.

const api = buildTestApp();
const as = (staffer: Staffer) => api.signIn(staffer.email, staffer.password);

const stationsPath = (desk: Desk) => `/api/rinks/${desk.world.slug}/stations`;
const stationPath = (desk: Desk, part = '') => `${stationsPath(desk)}/${desk.station.id}${part}`;
const settingsPath = (desk: Desk) => `/api/rinks/${desk.world.slug}/desk-settings`;

const newStation = (name: string, extra: Record<string, unknown> = {}) => ({ name, rpm: 3450, adjustStepMilli: 125, ...extra });
/** An 8" wheel worn down to 6" at most (made-up limits for the test), dressed to a 1/2" hollow when mounted. */
const newWheel = (label: string, extra: Record<string, unknown> = {}) => ({
  label,
  grit: 80,
  diameterNewNm: 203_200_000,
  minDiameterNm: 152_400_000,
  ratedMaxRpm: 4500,
  hollowNm: HALF_INCH_NM,
  ringTested: true,
  ...extra,
});

interface StationBody {
  id: string;
  name: string;
  wheel: { id: string; label: string; diameterNm: number; hollowNm: number | null; passesSinceMount: number } | null;
}

async function stationRow(agent: Client, desk: Desk): Promise<StationBody> {
  const list = (await agent.get(stationsPath(desk))).body.stations as StationBody[];
  const found = list.find((s) => s.id === desk.station.id);
  if (!found) throw new Error('the desk station is not listed');
  return found;
}

async function mount(agent: Client, desk: Desk, label: string): Promise<StationBody> {
  const response = await write(agent, stationPath(desk, '/wheels'), newWheel(label));
  if (response.status !== 201) throw new Error(`mounting answered ${response.status}: ${JSON.stringify(response.body)}`);
  return response.body as StationBody;
}

describe('stations', () => {
  it("a manager adds a station, and the list shows the rink's own stations only", async () => {
    const desk = await createDesk('Ice Harbor');
    const other = await createDesk('North Pond Arena');
    await createStation(currentDb(), other.world.id, { name: 'Elsewhere' });
    const manager = await as(desk.world.staff.manager);

    const created = await manager.post(stationsPath(desk)).send(newStation('Station Two'));
    const listed = await (await as(desk.world.staff.technician)).get(stationsPath(desk));

    expect(created.status).toBe(201);
    expect(created.body).toMatchObject({
      id: expect.any(String),
      name: 'Station Two',
      status: 'active',
      rpm: 3450,
      adjustUnit: 'turns',
      adjustStepMilli: 125,
      ownTrueNm: null,
      ownFairNm: null,
      precision: false,
      wheel: null,
      queue: { waiting: 0, onStation: 0 },
    });
    expect(listed.status).toBe(200);
    expect(stationList.safeParse(listed.body).success).toBe(true);
    expect((listed.body.stations as StationBody[]).map((s) => s.name)).toEqual(['Station One', 'Station Two']);
  });

  it('keeps names unique per rink (400 fields.name) on adding and renaming, while another rink may use the name', async () => {
    const desk = await createDesk('Ice Harbor');
    const other = await createDesk('North Pond Arena');
    const manager = await as(desk.world.staff.manager);
    const second = await manager.post(stationsPath(desk)).send(newStation('Station Two'));

    const added = await manager.post(stationsPath(desk)).send(newStation(' station one '));
    const renamed = await manager.put(`${stationsPath(desk)}/${second.body.id}`).send(newStation('Station One'));
    const kept = await manager.put(`${stationsPath(desk)}/${second.body.id}`).send(newStation('Station Two', { rpm: 1750 }));
    const elsewhere = await (await as(other.world.staff.manager)).post(stationsPath(other)).send(newStation('Station Two'));

    expect(added.status).toBe(400);
    expect(Object.keys(added.body.error.fields)).toEqual(['name']);
    expect(renamed.status).toBe(400);
    expect(Object.keys(renamed.body.error.fields)).toEqual(['name']);
    expect(kept.status).toBe(200);
    expect(kept.body.rpm).toBe(1750);
    expect(elsewhere.status).toBe(201);
    expect(await rowsOf(stationTable, desk.world.id)).toBe(2);
  });

  it('takes own level bands both or neither, with true ≤ fair (400)', async () => {
    const desk = await createDesk('Ice Harbor');
    const manager = await as(desk.world.staff.manager);

    const onlyTrue = await manager.post(stationsPath(desk)).send(newStation('Half bands', { ownTrueNm: 25_400 }));
    const onlyFair = await manager.post(stationsPath(desk)).send(newStation('Other half', { ownFairNm: 50_800 }));
    const upsideDown = await manager.post(stationsPath(desk)).send(newStation('Upside down', { ownTrueNm: 50_800, ownFairNm: 25_400 }));
    const equal = await manager.post(stationsPath(desk)).send(newStation('Strict', { ownTrueNm: 25_400, ownFairNm: 25_400 }));

    for (const refused of [onlyTrue, onlyFair, upsideDown]) {
      expect(refused.status).toBe(400);
      expect(Object.keys(refused.body.error.fields)).toEqual(['ownFairNm']);
    }
    expect(equal.status).toBe(201);
    expect(equal.body).toMatchObject({ ownTrueNm: 25_400, ownFairNm: 25_400 });
    expect(await rowsOf(stationTable, desk.world.id)).toBe(2);
  });
});

describe('wheels and upkeep', () => {
  it('mounts a wheel only once it is ring-tested (400 with the safety message)', async () => {
    const desk = await createDesk('Ice Harbor');
    const technician = await as(desk.world.staff.technician);

    const unchecked = await write(technician, stationPath(desk, '/wheels'), newWheel('Fresh wheel', { ringTested: false }));
    const unsaid = await write(technician, stationPath(desk, '/wheels'), { ...newWheel('Fresh wheel'), ringTested: undefined });

    for (const refused of [unchecked, unsaid]) {
      expect(refused.status).toBe(400);
      // OSHA 29 CFR 1910.215 (trade-facts.md, "Grinding-wheel safety"): inspect and ring-test before mounting.
      expect(refused.body.error.fields).toEqual({ ringTested: ['Ring-test and inspect the wheel before mounting it'] });
    }
    expect((await stationRow(technician, desk)).wheel).toBeNull();
    expect(await rowsOf(wheel, desk.world.id)).toBe(0);
  });

  it('logs the removal of the wheel that a new mount replaces', async () => {
    const desk = await createDesk('North Pond Arena');
    const technician = await as(desk.world.staff.technician);
    const first = await mount(technician, desk, 'Wheel A');

    const second = await mount(technician, desk, 'Wheel B');

    expect(second.wheel).toMatchObject({ label: 'Wheel B', diameterNm: 203_200_000, hollowNm: HALF_INCH_NM, passesSinceMount: 0 });
    const [old] = await currentDb().select().from(wheel).where(eq(wheel.id, first.wheel?.id ?? ''));
    expect(old?.removedAt).toBeInstanceOf(Date);
    const events = await currentDb().select().from(wheelEvent).where(eq(wheelEvent.tenantId, desk.world.id)).orderBy(asc(wheelEvent.at));
    const kindsOf = (wheelId: string | undefined) => events.filter((e) => e.wheelId === wheelId).map((e) => e.kind).sort();
    expect(kindsOf(first.wheel?.id)).toEqual(['dressing', 'mount', 'removal']);
    expect(kindsOf(second.wheel?.id)).toEqual(['dressing', 'mount']);
    expect(events.every((e) => e.byUserId === desk.world.staff.technician.id)).toBe(true);
  });

  it('logs a dressing with the diameter after, which cannot grow (400 fields.diameterNm)', async () => {
    const desk = await createDesk('Ice Harbor');
    const technician = await as(desk.world.staff.technician);
    const bare = await write(technician, stationPath(desk, '/dressings'), { hollowNm: HALF_INCH_NM, diameterNm: 200_000_000 });
    await mount(technician, desk, 'Wheel A');

    const dressed = await write(technician, stationPath(desk, '/dressings'), { hollowNm: 15_875_000, diameterNm: 202_000_000, note: 'Changed to 5/8"' });
    const same = await write(technician, stationPath(desk, '/dressings'), { hollowNm: 15_875_000, diameterNm: 202_000_000 });
    const grown = await write(technician, stationPath(desk, '/dressings'), { hollowNm: 15_875_000, diameterNm: 202_000_001 });

    expect(bare.status).toBe(409);
    expect(dressed.status).toBe(201);
    expect(dressed.body.wheel).toMatchObject({ diameterNm: 202_000_000, hollowNm: 15_875_000 });
    expect(same.status).toBe(201);
    expect(grown.status).toBe(400);
    expect(Object.keys(grown.body.error.fields)).toEqual(['diameterNm']);
    expect((await stationRow(technician, desk)).wheel?.diameterNm).toBe(202_000_000);
  });

  it('counts passesSinceMount from the sharpenings on the mounted wheel; a correction adds none', async () => {
    const desk = await createDesk('North Pond Arena');
    const technician = await as(desk.world.staff.technician);
    const early = await takeIn(technician, desk);
    await logPair(technician, desk, early.id, early.pairs[0]?.id ?? '', { passes: 7 });
    await mount(technician, desk, 'Wheel A');
    const made = await takeIn(technician, desk, 2);
    const [first, second] = made.pairs;
    const logged = await logPair(technician, desk, made.id, first?.id ?? '', { passes: 4 });
    await logPair(technician, desk, made.id, second?.id ?? '', { passes: 5 });
    const originalId = logged.pairs[0]?.sharpenings[0]?.id ?? '';
    const corrected = await write(technician, `/api/rinks/${desk.world.slug}/sharpenings/${originalId}/corrections`, {
      reason: 'Wrong hollow written down',
      hollowNm: 15_875_000,
      passes: 4,
      bladeWidthNm: HOCKEY_WIDTH_NM,
    });
    expect(corrected.status).toBe(201);

    expect((await stationRow(technician, desk)).wheel?.passesSinceMount).toBe(9);

    const fresh = await mount(technician, desk, 'Wheel B');
    expect(fresh.wheel?.passesSinceMount).toBe(0);
    const later = await takeIn(technician, desk);
    await logPair(technician, desk, later.id, later.pairs[0]?.id ?? '', { passes: 3 });
    expect((await stationRow(technician, desk)).wheel?.passesSinceMount).toBe(3);
  });

  it('counts the corrected passes, not the miscounted ones, in passesSinceMount', async () => {
    const desk = await createDesk('Ice Harbor');
    const technician = await as(desk.world.staff.technician);
    await mount(technician, desk, 'Wheel A');
    const made = await takeIn(technician, desk, 2);
    const [first, second] = made.pairs;
    const logged = await logPair(technician, desk, made.id, first?.id ?? '', { passes: 4 });
    await logPair(technician, desk, made.id, second?.id ?? '', { passes: 5 });
    const originalId = logged.pairs[0]?.sharpenings[0]?.id ?? '';

    const correct = (passes: number, reason: string) =>
      write(technician, `/api/rinks/${desk.world.slug}/sharpenings/${originalId}/corrections`, { reason, hollowNm: HALF_INCH_NM, passes, bladeWidthNm: HOCKEY_WIDTH_NM });
    const corrected = await correct(6, 'Logged 4 passes, ground 6');

    expect(corrected.status).toBe(201);
    expect((corrected.body as TicketBody).pairs[0]?.sharpenings.map((s) => s.passes)).toEqual([4, 6]);
    // The wheel wore by the passes actually ground: 6 (as corrected) + 5.
    const row = await stationRow(technician, desk);
    expect(row.wheel?.passesSinceMount).toBe(11);

    // A second correction of the same record replaces the first one's count, it does not add to it: 7 + 5.
    const again = await correct(7, 'Recounted: 7 passes');
    expect(again.status).toBe(201);
    expect((await stationRow(technician, desk)).wheel?.passesSinceMount).toBe(12);
    // What the wheel had done at a time: nothing before the pairs were logged, all 12 after them.
    const wheelId = row.wheel?.id ?? '';
    expect(await passesOnWheelBefore(desk.world.id, wheelId, [new Date(0), new Date(Date.now() + 60_000)])).toEqual([0, 12]);
  });

  it('lets a technician log upkeep but not add or change stations (403)', async () => {
    const desk = await createDesk('North Pond Arena');
    const technician = await as(desk.world.staff.technician);
    const league = await as(desk.world.staff.league_manager);

    const adjusted = await write(technician, stationPath(desk, '/adjustments'), { amountMilli: -250, note: 'Right edge high' });
    const checked = await write(technician, stationPath(desk, '/check-readings'), { blade: 'right', readingNm: 1_270 });
    const mounted = await write(technician, stationPath(desk, '/wheels'), newWheel('Wheel A'));
    const added = await technician.post(stationsPath(desk)).send(newStation('Not allowed'));
    const changed = await technician.put(stationPath(desk)).send(newStation('Renamed', { status: 'retired' }));
    const byLeague = await write(league, stationPath(desk, '/adjustments'), { amountMilli: 125 });

    expect([adjusted.status, checked.status, mounted.status]).toEqual([201, 201, 201]);
    expect(adjusted.body).toEqual({ ok: true });
    expect([added.status, changed.status, byLeague.status]).toEqual([403, 403, 403]);
    expect(await rowsOf(levelingAdjustment, desk.world.id)).toBe(1);
    expect(await rowsOf(levelReading, desk.world.id, and(eq(levelReading.kind, 'check'), eq(levelReading.readingNm, 1_270)))).toBe(1);
    expect(await rowsOf(stationTable, desk.world.id)).toBe(1);
    expect((await stationRow(technician, desk)).name).toBe('Station One');
  });
});

describe('desk settings', () => {
  const valid = { ...DEFAULT_DESK_SETTINGS, trueNm: 20_000, fairNm: 40_000, precisionTrueNm: 10_000, precisionFairNm: 20_000, defaultMinutesPerPair: 6 };

  it('answer the defaults until a manager saves the rink’s own, which then stay', async () => {
    const desk = await createDesk('Ice Harbor');
    const manager = await as(desk.world.staff.manager);
    const technician = await as(desk.world.staff.technician);

    const defaults = await technician.get(settingsPath(desk));
    const saved = await manager.put(settingsPath(desk)).send(valid);
    const savedAgain = await manager.put(settingsPath(desk)).send(valid);
    const read = await technician.get(settingsPath(desk));
    const byTechnician = await technician.put(settingsPath(desk)).send(DEFAULT_DESK_SETTINGS);

    expect(defaults.status).toBe(200);
    expect(defaults.body).toEqual(DEFAULT_DESK_SETTINGS);
    expect(saved.status).toBe(200);
    expect(saved.body).toEqual(valid);
    expect(savedAgain.status).toBe(200);
    expect(read.body).toEqual(valid);
    expect(byTechnician.status).toBe(403);
  });

  it.each([
    ['a fair limit below the true one', { fairNm: 10_000 }, 'fairNm'],
    ['a precision fair limit below its true one', { precisionTrueNm: 15_000, precisionFairNm: 12_000 }, 'precisionFairNm'],
    ['a precision fair limit looser than the normal fair one', { precisionFairNm: 45_000 }, 'precisionFairNm'],
    ['a precision true limit looser than the normal true one', { precisionTrueNm: 30_000, precisionFairNm: 35_000 }, 'precisionTrueNm'],
    ['a zero limit', { trueNm: 0 }, 'trueNm'],
    ['a zero leveling response', { defaultResponseNmPerTurn: 0 }, 'defaultResponseNmPerTurn'],
    ['λ above 1', { ewmaLambdaMilli: 1001 }, 'ewmaLambdaMilli'],
  ])('refuse %s (400) and keep what was saved', async (_what, change, field) => {
    const desk = await createDesk('North Pond Arena');
    const manager = await as(desk.world.staff.manager);
    expect((await manager.put(settingsPath(desk)).send(valid)).status).toBe(200);

    const response = await manager.put(settingsPath(desk)).send({ ...valid, ...change });

    expect(response.status).toBe(400);
    expect(Object.keys(response.body.error.fields)).toContain(field);
    expect((await manager.get(settingsPath(desk))).body).toEqual(valid);
  });
});

describe('customers at the counter', () => {
  const customersPath = (slug: string) => `/api/rinks/${slug}/customers`;

  it('adds a walk-up from a name and a phone or e-mail (201 with its id and a member code)', async () => {
    const rink = await createRinkWithStaff('Ice Harbor');
    const technician = await as(rink.staff.technician);
    const email = uniqueEmail('Walk-Up');

    const byPhone = await technician.post(customersPath(rink.slug)).send({ name: 'Jordan Pikeway', phone: '+1 555 013 9000' });
    const byEmail = await technician.post(customersPath(rink.slug)).send({ name: 'Casey Pikeway', email });
    const nameless = await technician.post(customersPath(rink.slug)).send({ phone: '555 013 9001' });

    expect(byPhone.status).toBe(201);
    expect(byPhone.body).toEqual({
      id: expect.any(String),
      name: 'Jordan Pikeway',
      email: null,
      phone: '+1 555 013 9000',
      memberCode: expect.stringMatching(/^[2-9A-HJKMNP-Z]{6}$/),
      linked: false,
      createdAt: expect.any(String),
    });
    expect(byEmail.status).toBe(201);
    expect(byEmail.body.email).toBe(email.toLowerCase());
    expect(nameless.status).toBe(400);
    expect(Object.keys(nameless.body.error.fields)).toEqual(['name']);
    const fetched = await technician.get(`${customersPath(rink.slug)}/${byPhone.body.id}`);
    expect(fetched.status).toBe(200);
    expect(fetched.body.customer.id).toBe(byPhone.body.id);
  });

  describe('search', () => {
    async function world() {
      const here = await createRinkWithStaff('Ice Harbor');
      const there = await createRinkWithStaff('North Pond Arena');
      const tag = uniqueSuffix();
      const email = `frostmere.alex.${tag}@example.test`;
      const code = 'K7QX2M';
      // The same skater is a customer of both rinks; each rink must find only its own record.
      const mine = await createCustomer(currentDb(), here.id, { name: `Alex Frostmere ${tag}`, email, phone: '(555) 013-4477', code });
      await createCustomer(currentDb(), there.id, { name: `Alex Frostmere ${tag}`, email, phone: '(555) 013-4477', code });
      await createCustomer(currentDb(), here.id, { name: `Robin Testwood ${tag}`, email: `robin.${tag}@example.test`, phone: '555 777 1212' });
      return { here, tag, mine, agent: await as(here.staff.technician) };
    }

    const found = async (agent: Client, slug: string, q: string) =>
      ((await agent.get(`/api/rinks/${slug}/customers`).query({ q })).body.customers as { id: string }[]).map((c) => c.id);

    it('finds by a part of the name or the e-mail, and never another rink’s customers', async () => {
      const { here, tag, mine, agent } = await world();

      expect(await found(agent, here.slug, `frostmere ${tag}`)).toEqual([mine.id]);
      expect(await found(agent, here.slug, `stmere.alex.${tag}`)).toEqual([mine.id]);
      expect(await found(agent, here.slug, `FROSTMERE.ALEX.${tag.toUpperCase()}`)).toEqual([mine.id]);
    });

    it('finds by the exact member code in any case, not by a part of it', async () => {
      const { here, mine, agent } = await world();

      expect(await found(agent, here.slug, 'K7QX2M')).toEqual([mine.id]);
      expect(await found(agent, here.slug, 'k7qx2m')).toEqual([mine.id]);
      expect(await found(agent, here.slug, 'K7QX2')).toEqual([]);
    });

    it('finds by the digits of the phone number however it was written', async () => {
      const { here, mine, agent } = await world();

      expect(await found(agent, here.slug, '(555) 013-4477')).toEqual([mine.id]);
      expect(await found(agent, here.slug, '555 013 4477')).toEqual([mine.id]);
      expect(await found(agent, here.slug, '5550134477')).toEqual([mine.id]);
      expect(await found(agent, here.slug, '4477')).toEqual([mine.id]);
    });
  });
});
