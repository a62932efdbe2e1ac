import { eq } from 'drizzle-orm';
import { levelingAdjustment, levelReading, reportLeveling, scoped, ticket, wheel, wheelEvent } from '@rinkwright/db';
import { currentDb } from '@rinkwright/db/unscoped';
import { createSharpening, createStation, createTicket } from '@rinkwright/db/testing';
import { beforeAll, describe, expect, it } from 'vitest';
import { refreshReports } from '../../apps/api/src/features/reports/refresh';
import * as ledger from '../../apps/api/src/lib/ledger/ledger';
import { buildTestApp, type Client } from '../support/app';
import { addProduct, redeemPath } from '../support/billing';
import { createDesk, logPair, takeIn, write, type Desk } from '../support/desk';
import { createCustomerAt, PASSWORD, uniqueEmail } from '../support/world';

// The reports against figures worked by hand from a small fixed dataset. The rink is in America/Toronto
// (UTC−5 in November), so a pair done at 23:30 local on 3 November is 04:30 UTC on the 4th and must count
// on the 3rd. Bands are the defaults: true ≤ 25,400 nm (0.001"), fair ≤ 50,800 nm, off beyond.

const api = buildTestApp();
let desk: Desk;
let manager: Client;
let stationB: { id: string; name: string };
const wheelId = crypto.randomUUID();
const local = (iso: string) => new Date(`${iso}-05:00`);

beforeAll(async () => {
  desk = await createDesk('Report Rink');
  manager = await api.signIn(desk.world.staff.manager.email, PASSWORD);
  const db = currentDb();
  stationB = await createStation(db, desk.world.id, { name: 'Station Two' });
  const t1 = desk.world.staff.technician.id;
  const t2 = desk.world.staff.manager.id;
  const base = { customerId: desk.skater.id, serviceId: desk.service.id, createdBy: t1 };
  const tickets = [
    // dropped, ready (local): 55 min late, 20 min on time, 45 min late (promised 30 min after drop-off)
    { n: 9001, dropped: '2026-11-02T08:50:00', ready: '2026-11-02T09:45:00', station: desk.station.id },
    { n: 9002, dropped: '2026-11-02T13:50:00', ready: '2026-11-02T14:10:00', station: stationB.id },
    { n: 9003, dropped: '2026-11-03T23:00:00', ready: '2026-11-03T23:45:00', station: stationB.id },
    // Outside the period: must not count.
    { n: 9004, dropped: '2026-10-31T10:00:00', ready: '2026-10-31T10:20:00', station: desk.station.id },
  ];
  const made = [];
  for (const t of tickets) {
    const created = await createTicket(db, desk.world.id, { ...base, number: t.n, pairs: 2, droppedAt: local(t.dropped), stationId: t.station });
    await db.update(ticket).set({ state: 'ready', readyAt: local(t.ready) }).where(eq(ticket.id, created.id));
    made.push(created);
  }
  // Station One's wheel, mounted a month before the period at 200 mm (minimum 150 mm) and dressed on the 3rd.
  await db.insert(wheel).values({ id: wheelId, tenantId: desk.world.id, stationId: desk.station.id, label: 'Report wheel', grit: 80, diameterNewNm: 200_000_000, minDiameterNm: 150_000_000, ratedMaxRpm: 4000, mountedAt: local('2026-10-01T08:00:00'), mountedBy: t2 });
  await db.insert(wheelEvent).values({ id: crypto.randomUUID(), tenantId: desk.world.id, wheelId, stationId: desk.station.id, kind: 'dressing', hollowNm: 12_700_000, diameterNm: 199_987_000, at: local('2026-11-03T12:00:00'), byUserId: t2 });
  const [a, b, c, d] = made as [(typeof made)[0], (typeof made)[0], (typeof made)[0], (typeof made)[0]];
  await createSharpening(db, desk.world.id, { ticketId: a.id, pairId: a.pairIds[0]!, stationId: desk.station.id, wheelId, technicianId: t1, passes: 4, readingsNm: [0, 38_100], doneAt: local('2026-11-02T09:10:00') });
  const rerun = await createSharpening(db, desk.world.id, { ticketId: a.id, pairId: a.pairIds[1]!, stationId: desk.station.id, wheelId, technicianId: t1, passes: 5, readingsNm: [-12_700, 63_500], doneAt: local('2026-11-02T09:40:00') });
  await createSharpening(db, desk.world.id, { ticketId: b.id, pairId: b.pairIds[0]!, stationId: stationB.id, technicianId: t2, passes: 3, readingsNm: [20_000, -30_000], doneAt: local('2026-11-02T14:05:00') });
  await createSharpening(db, desk.world.id, { ticketId: c.id, pairId: c.pairIds[0]!, stationId: stationB.id, technicianId: t1, passes: 4, readingsNm: [10_000, 10_000], doneAt: local('2026-11-03T23:30:00') });
  await createSharpening(db, desk.world.id, { ticketId: d.id, pairId: d.pairIds[0]!, stationId: desk.station.id, wheelId, technicianId: t1, passes: 4, readingsNm: [0, 0], doneAt: local('2026-10-31T10:10:00') });
  // A leveling adjustment on each station, between its pairs.
  await db.insert(levelingAdjustment).values([
    { id: crypto.randomUUID(), tenantId: desk.world.id, stationId: desk.station.id, amountMilli: 250, note: null, at: local('2026-11-02T09:30:00'), byUserId: t2 },
    { id: crypto.randomUUID(), tenantId: desk.world.id, stationId: stationB.id, amountMilli: -500, note: null, at: local('2026-11-03T12:00:00'), byUserId: t2 },
  ]);
  // The off right blade of the second pair is run again: one re-run.
  await db.insert(levelReading).values({ id: crypto.randomUUID(), tenantId: desk.world.id, stationId: desk.station.id, sharpeningId: rerun.id, kind: 'sharpening', blade: 'right', attempt: 2, readingNm: 5_000, takenAt: local('2026-11-02T09:42:00'), takenBy: t1 });
});

const period = 'from=2026-11-02&to=2026-11-03';

describe('throughput', () => {
  it('counts pairs, staffed hours, turnaround and promised times by the rink’s local days', async () => {
    const res = await manager.get(`/api/rinks/${desk.world.slug}/reports/throughput?${period}`);
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    // 4 pairs; staffed hours are the distinct (day, hour, technician): (2nd 09h T1), (2nd 14h T2), (3rd 23h T1) = 3.
    // Turnarounds 55, 20, 45 min → 15-minute buckets 3, 1, 3; the median (2nd of 3) and the 90th percentile
    // (3rd of 3) are in bucket 3, reported by its upper end, 60 min. One of three was ready by its promise.
    expect(res.body.totals).toEqual({ pairs: 4, staffedHours: 3, pairsPerStaffedHour: 1.33, ticketsReady: 3, medianTurnaroundMinutes: 60, p90TurnaroundMinutes: 60, promisedHitRate: 1 / 3 });
    expect(res.body.tables.byStation).toEqual([
      { stationId: desk.station.id, station: 'Station One', pairs: 2, staffedHours: 1, pairsPerStaffedHour: 2 },
      { stationId: stationB.id, station: 'Station Two', pairs: 2, staffedHours: 2, pairsPerStaffedHour: 1 },
    ]);
    expect(res.body.tables.byTechnician.map((t: { technicianId: string; pairs: number; staffedHours: number }) => [t.technicianId, t.pairs, t.staffedHours]).sort()).toEqual(
      [
        [desk.world.staff.technician.id, 3, 2],
        [desk.world.staff.manager.id, 1, 1],
      ].sort(),
    );
    // 2 November 2026 is a Monday (ISO weekday 1), the 3rd a Tuesday.
    expect(res.body.tables.byHour).toEqual([
      { weekday: 1, hour: 9, pairs: 2 },
      { weekday: 1, hour: 14, pairs: 1 },
      { weekday: 2, hour: 23, pairs: 1 },
    ]);
    expect(res.body.tables.byDay).toEqual([
      { day: '2026-11-02', pairs: 3, ticketsReady: 2, onTime: 1 },
      { day: '2026-11-03', pairs: 1, ticketsReady: 1, onTime: 0 },
    ]);
  });

  it('narrows to a station and a technician, and compares with another period', async () => {
    const one = await manager.get(`/api/rinks/${desk.world.slug}/reports/throughput?${period}&stationId=${stationB.id}&technicianId=${desk.world.staff.technician.id}&compareFrom=2026-10-31&compareTo=2026-11-01`);
    expect(one.body.totals).toMatchObject({ pairs: 1, staffedHours: 1, ticketsReady: 2 });
    expect(one.body.compare).toEqual({ period: { from: '2026-10-31', to: '2026-11-01' }, totals: expect.objectContaining({ pairs: 0, ticketsReady: 0 }) });
    const other = await manager.get(`/api/rinks/${desk.world.slug}/reports/throughput?from=2026-10-31&to=2026-11-01`);
    expect(other.body.totals).toMatchObject({ pairs: 1, ticketsReady: 1, promisedHitRate: 1, medianTurnaroundMinutes: 30 });
  });

  it('exports each table as CSV with the screen’s column labels', async () => {
    const res = await manager.get(`/api/rinks/${desk.world.slug}/reports/throughput/byStation.csv?${period}`);
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toMatch(/^text\/csv/);
    expect(res.headers['content-disposition']).toMatch(/^attachment; filename="?[\w-]+-throughput-byStation-2026-11-02-to-2026-11-03\.csv"?$/);
    expect(res.text.trim().split('\n')).toEqual(['Station,Pairs,Staffed hours,Pairs per staffed hour', 'Station One,2,1,2', 'Station Two,2,2,1']);
    expect((await manager.get(`/api/rinks/${desk.world.slug}/reports/throughput/nothing.csv?${period}`)).status).toBe(404);
  });
});

describe('quality', () => {
  it('shares the first readings among the bands and counts re-runs', async () => {
    const res = await manager.get(`/api/rinks/${desk.world.slug}/reports/quality?${period}`);
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    // First readings 0, 38,100, −12,700, 63,500, 20,000, −30,000, 10,000, 10,000: true 5, fair 2, off 1;
    // one re-run of 8; mean |reading| = 184,300 / 8 = 23,037.5 → 23,038 nm.
    expect(res.body.totals).toEqual({ firstReadings: 8, trueShare: 5 / 8, fairShare: 2 / 8, offShare: 1 / 8, reRunRate: 1 / 8, meanAbsReadingNm: 23_038 });
    const one = res.body.tables.byStation.find((r: { stationId: string }) => r.stationId === desk.station.id);
    // Station One: 0 and −12,700 true, 38,100 fair, 63,500 off; mean (0 + 38,100 + 12,700 + 63,500) / 4 = 28,575.
    expect(one).toMatchObject({ firstReadings: 4, trueShare: 0.5, fairShare: 0.25, offShare: 0.25, reRunRate: 0.25, meanAbsReadingNm: 28_575 });
  });

  it('shows each leveling adjustment with the mean first reading before and after it', async () => {
    const res = await manager.get(`/api/rinks/${desk.world.slug}/reports/quality?${period}`);
    // Station One at 9:30 on the 2nd: before it the first readings 0 and 38,100 (9:10) and 0 and 0 (31 October),
    // mean 9,525; after it −12,700 and 63,500 (9:40; the re-run at 9:42 is no first reading), mean 25,400.
    // Station Two at noon on the 3rd: before 20,000 and −30,000, mean −5,000; after 10,000 and 10,000.
    expect(res.body.tables.leveling.map((a: { station: string; amountMilli: number; meanBeforeNm: number; meanAfterNm: number }) => [a.station, a.amountMilli, a.meanBeforeNm, a.meanAfterNm])).toEqual([
      ['Station One', 250, 9525, 25_400],
      ['Station Two', -500, -5000, 10_000],
    ]);
  });

  it('keeps each adjustment’s effect current as readings and adjustments follow it', async () => {
    const db = currentDb();
    const three = await createStation(db, desk.world.id, { name: 'Station Three' });
    const t1 = desk.world.staff.technician.id;
    const base = { customerId: desk.skater.id, serviceId: desk.service.id, createdBy: t1 };
    const [early, late] = [await createTicket(db, desk.world.id, { ...base, number: 9101, pairs: 1, droppedAt: local('2026-11-10T08:00:00'), stationId: three.id }), await createTicket(db, desk.world.id, { ...base, number: 9102, pairs: 1, droppedAt: local('2026-11-10T14:00:00'), stationId: three.id })];
    const sharpen = (t: typeof early, readingsNm: [number, number], doneAt: string) => createSharpening(db, desk.world.id, { ticketId: t.id, pairId: t.pairIds[0]!, stationId: three.id, technicianId: t1, passes: 4, readingsNm, doneAt: local(doneAt) });
    const adjust = (amountMilli: number, at: string) => db.insert(levelingAdjustment).values({ id: crypto.randomUUID(), tenantId: desk.world.id, stationId: three.id, amountMilli, note: null, at: local(at), byUserId: t1 });
    const levelingOfThree = async () => {
      const res = await manager.get(`/api/rinks/${desk.world.slug}/reports/quality?from=2026-11-10&to=2026-11-11&stationId=${three.id}`);
      expect(res.status).toBe(200);
      return res.body.tables.leveling.map((a: { amountMilli: number; meanBeforeNm: number | null; meanAfterNm: number | null }) => [a.amountMilli, a.meanBeforeNm, a.meanAfterNm]);
    };
    await sharpen(early, [1_000, 3_000], '2026-11-10T09:00:00');
    await adjust(250, '2026-11-10T12:00:00');
    // Nothing after it yet: the mean after is unknown.
    expect(await levelingOfThree()).toEqual([[250, 2_000, null]]);
    // Written with a past time, as a late sync would be: the sweep's look-back finds it and rebuilds its day.
    await sharpen(late, [4_000, 8_000], '2026-11-10T15:00:00');
    await refreshReports(desk.world.id, { since: local('2026-11-10T00:00:00') });
    expect(await levelingOfThree()).toEqual([[250, 2_000, 6_000]]);
    // A second adjustment the next morning: before it only the first readings since the first adjustment, (4,000 +
    // 8,000) / 2 = 6,000 (the two before 12:00 showed the setting before that one); the first keeps its effect.
    await adjust(-125, '2026-11-11T10:00:00');
    expect(await levelingOfThree()).toEqual([
      [250, 2_000, 6_000],
      [-125, 6_000, null],
    ]);
    // The first one's after side has only two readings, but the second adjustment ends it: its window is closed
    // there, so a later write outside it does not make it be measured again; the second's after side stays open.
    const stored = await db.select({ amountMilli: reportLeveling.amountMilli, windowTo: reportLeveling.windowTo }).from(reportLeveling).where(eq(reportLeveling.stationId, three.id));
    expect(stored.sort((a, b) => b.amountMilli - a.amountMilli)).toEqual([
      { amountMilli: 250, windowTo: local('2026-11-11T10:00:00') },
      { amountMilli: -125, windowTo: null },
    ]);
    // A full rebuild measures every adjustment again, to the same figures.
    await refreshReports(desk.world.id, { full: true });
    expect(await levelingOfThree()).toEqual([
      [250, 2_000, 6_000],
      [-125, 6_000, null],
    ]);
    // The station page reads each adjustment's effect the same way (newest first there).
    const page = await manager.get(`/api/rinks/${desk.world.slug}/stations/${three.id}`);
    expect(page.status).toBe(200);
    expect(page.body.adjustments.map((a: { amountMilli: number; beforeNm: number | null; afterNm: number | null }) => [a.amountMilli, a.beforeNm, a.afterNm])).toEqual([
      [-125, 6_000, null],
      [250, 2_000, 6_000],
    ]);
  });

  it('gives a wheel its pairs and passes since mounting, and the passes its dressings predict', async () => {
    const res = await manager.get(`/api/rinks/${desk.world.slug}/reports/quality?${period}`);
    // Three pairs on the wheel since it was mounted (one before the period): 4 + 5 + 4 = 13 passes, all before the
    // dressing on the 3rd. 200 mm new, 199.987 mm after 13 passes: 1,000 nm a pass (a straight line through two
    // points), so (199,987,000 − 150,000,000) / 1,000 = 49,987 passes are left: 13 + 49,987 = 50,000 in all.
    expect(res.body.tables.wheels).toEqual([
      { wheelId, wheel: 'Report wheel', station: 'Station One', mountedAt: local('2026-10-01T08:00:00').toISOString(), removedAt: null, pairs: 3, passes: 13, predictedPasses: 50_000 },
    ]);
  });
});

describe('money and the summaries kept current', () => {
  it('shows a sale, a redemption and a refund made a moment ago, and the credits left', async () => {
    const technician = await api.signIn(desk.world.staff.technician.email, PASSWORD);
    const today = (await manager.get(`/api/rinks/${desk.world.slug}/reports`)).body.today as string;
    const before = await manager.get(`/api/rinks/${desk.world.slug}/reports/money?from=${today}&to=${today}`);
    expect(before.body.totals).toMatchObject({ sales: 0, salesMinor: 0 });

    // Hand-worked as in the billing test: 3 credits for 49.99; one redeemed is worth 16.66, the refund of the
    // other two 33.33.
    const odd = await addProduct(manager, desk.world, { kind: 'punch_card', name: 'Three sharpenings', credits: 3, priceMinor: 4999, monthsValid: 6, listed: true });
    const skater = await createCustomerAt(desk.world.id, { name: 'Report Skater', email: uniqueEmail('report') });
    const sold = await write(technician, `/api/rinks/${desk.world.slug}/customers/${skater.id}/sales`, { productId: odd.id, paymentMethodId: 'cash' });
    expect(sold.status).toBe(201);
    await write(technician, redeemPath(desk.world, skater.id), {});
    const mid = await manager.get(`/api/rinks/${desk.world.slug}/reports/money?from=${today}&to=${today}`);
    expect(mid.body.outstanding).toEqual({ credits: 2, valueMinor: 3333 });
    await write(manager, `/api/rinks/${desk.world.slug}/payments/${sold.body.payment.id}/refunds`, { reason: 'Moving away' });

    const res = await manager.get(`/api/rinks/${desk.world.slug}/reports/money?from=${today}&to=${today}`);
    expect(res.body.totals).toEqual({ currency: 'CAD', sales: 1, salesMinor: 4999, refundsMinor: 3333, feesMinor: 0, redemptions: 1, redemptionValueMinor: 1666, breakageCredits: 0, breakageMinor: 0 });
    expect(res.body.outstanding).toEqual({ credits: 0, valueMinor: 0 });
    expect(res.body.tables.byProduct).toEqual([{ productId: odd.id, product: 'Three sharpenings', channel: 'counter', sales: 1, salesMinor: 4999, refunds: 1, refundsMinor: 3333, feesMinor: 0 }]);
    const csv = await manager.get(`/api/rinks/${desk.world.slug}/reports/money/byProduct.csv?from=${today}&to=${today}`);
    expect(csv.text.trim().split('\n')[1]).toBe('Three sharpenings,counter,1,49.99,1,33.33,0.00');
  });

  it('counts a pair logged through the counter in the next report, once however often the summaries refresh', async () => {
    const technician = await api.signIn(desk.world.staff.technician.email, PASSWORD);
    const today = (await manager.get(`/api/rinks/${desk.world.slug}/reports`)).body.today as string;
    const taken = await takeIn(technician, desk);
    await logPair(technician, desk, taken.id, taken.pairs[0]!.id);
    await refreshReports(desk.world.id);
    await refreshReports(desk.world.id);
    const res = await manager.get(`/api/rinks/${desk.world.slug}/reports/throughput?from=${today}&to=${today}`);
    expect(res.body.totals.pairs).toBe(1);
    // A full rebuild gives the same figures as the refreshes that came before it.
    await refreshReports(desk.world.id, { full: true });
    expect((await manager.get(`/api/rinks/${desk.world.slug}/reports/throughput?${period}`)).body.totals.pairs).toBe(4);
  });
});

describe('league usage', () => {
  it('gives each team its allocation, what its players used and what is left', async () => {
    const leagueManager = await api.signIn(desk.world.staff.league_manager.email, PASSWORD);
    const technician = await api.signIn(desk.world.staff.technician.email, PASSWORD);
    const made = await leagueManager.post(`/api/rinks/${desk.world.slug}/leagues`).send({ name: 'Report League', season: '2026–27' });
    const leagueId = made.body.league.id as string;
    await leagueManager.post(`/api/rinks/${desk.world.slug}/leagues/${leagueId}/roster`).send({ csv: `team,name,email\nGulls,Ada Brightwater,${uniqueEmail('ada')}\nPilots,Cy Marrow,${uniqueEmail('cy')}\n` });
    // 20 credits in the pool, as a league pack would bring them.
    const s = scoped(desk.world.id);
    const pool = await ledger.poolAccount(s, leagueId);
    await ledger.addLot(s, { accountId: pool.id, key: `pool:${leagueId}`, actor: { userId: null, source: 'league', sourceId: leagueId }, kind: 'purchase', lot: { origin: 'purchase', credits: 20, priceMinor: 18_000 } });
    const teams = (await leagueManager.get(`/api/rinks/${desk.world.slug}/leagues/${leagueId}`)).body.teams as { id: string; name: string }[];
    const gulls = teams.find((t) => t.name === 'Gulls')!;
    const pilots = teams.find((t) => t.name === 'Pilots')!;
    expect((await write(leagueManager, `/api/rinks/${desk.world.slug}/leagues/${leagueId}/allocations`, { teamId: gulls.id, credits: 8 })).status).toBe(201);
    expect((await write(leagueManager, `/api/rinks/${desk.world.slug}/leagues/${leagueId}/allocations`, { teamId: pilots.id, credits: 5 })).status).toBe(201);
    // Three standard pairs taken in on the Gulls' allocation: three credits used.
    expect((await takeIn(technician, desk, 3, { payment: 'allocation', teamId: gulls.id })).pairs).toHaveLength(3);

    const today = (await manager.get(`/api/rinks/${desk.world.slug}/reports`)).body.today as string;
    const res = await leagueManager.get(`/api/rinks/${desk.world.slug}/reports/leagues?from=${today}&to=${today}`);
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    expect(res.body.tables.teams.filter((t: { leagueId: string }) => t.leagueId === leagueId)).toEqual([
      { leagueId, league: 'Report League', teamId: gulls.id, team: 'Gulls', allocated: 8, usedInPeriod: 3, used: 3, remaining: 5 },
      { leagueId, league: 'Report League', teamId: pilots.id, team: 'Pilots', allocated: 5, usedInPeriod: 0, used: 0, remaining: 5 },
    ]);
    // The league's own page gives each team the same figures.
    const page = (await leagueManager.get(`/api/rinks/${desk.world.slug}/leagues/${leagueId}`)).body.teams as { id: string; allocated: number; used: number; remaining: number }[];
    expect(page.map((t) => [t.id, t.allocated, t.used, t.remaining]).sort()).toEqual(
      [
        [gulls.id, 8, 3, 5],
        [pilots.id, 5, 0, 5],
      ].sort(),
    );
    const earlier = await leagueManager.get(`/api/rinks/${desk.world.slug}/reports/leagues?${period}`);
    expect(earlier.body.tables.teams.find((t: { teamId: string }) => t.teamId === gulls.id)).toMatchObject({ usedInPeriod: 0, used: 3 });
  });
});

describe('filters and access', () => {
  it('answers bad filters with a 400 naming the field', async () => {
    const res = await manager.get(`/api/rinks/${desk.world.slug}/reports/throughput?from=2026-11-05&to=2026-11-01`);
    expect(res.status).toBe(400);
    expect(res.body.error.fields).toHaveProperty(['query.to']);
    const half = await manager.get(`/api/rinks/${desk.world.slug}/reports/throughput?${period}&compareFrom=2026-10-01`);
    expect(res.status).toBe(400);
    expect(Object.keys(half.body.error.fields)).toEqual(['query.compareTo']);
  });

  it('shows a league manager only league usage, and a technician no report', async () => {
    const leagueManager = await api.signIn(desk.world.staff.league_manager.email, PASSWORD);
    expect((await leagueManager.get(`/api/rinks/${desk.world.slug}/reports/throughput?${period}`)).status).toBe(404);
    expect((await leagueManager.get(`/api/rinks/${desk.world.slug}/reports/leagues?${period}`)).status).toBe(200);
    const technician = await api.signIn(desk.world.staff.technician.email, PASSWORD);
    expect((await technician.get(`/api/rinks/${desk.world.slug}/reports/leagues?${period}`)).status).toBe(403);
  });
});
