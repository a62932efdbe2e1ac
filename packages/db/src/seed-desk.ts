import { randomUUID } from 'node:crypto';
import type { Faker } from '@faker-js/faker';
import { eq } from 'drizzle-orm';
import type { Database } from './client';
import {
  customer,
  levelReading,
  levelingAdjustment,
  serviceItem,
  sharpening,
  skateProfile,
  station,
  ticket,
  ticketEvent,
  ticketPair,
  wheel,
  wheelEvent,
} from './schema/index';

// Six months of counter history for a demo rink, from the seeded Faker: stations with wheels and their
// dressings, services, skate profiles, tickets with their pairs and sharpenings, and a level reading per blade.
// One station can be told to drift out of level over the last weeks, so the drift watch and the leveling advice
// have something to show. All values are plausible trade values (trade-facts.md), not measurements.

const DAY = 86_400_000;
const MINUTE = 60_000;
const INCH = 25_400_000;
const THOU = 25_400;
/** How far one turn of the demo stations' adjusting screw moves the reading: the response the advice should find. */
const RESPONSE_NM_PER_TURN = 20_000;

export interface DeskSeedOptions {
  rinkId: string;
  technicianIds: string[];
  stationNames: string[];
  driftingStation?: string;
  ticketsPerDay: number;
  priceMinor: number;
  days: number;
  now: Date;
}

function normal(faker: Faker): number {
  const u = faker.number.float({ min: 1e-9, max: 1, fractionDigits: 9 });
  const v = faker.number.float({ min: 0, max: 1, fractionDigits: 9 });
  return Math.sqrt(-2 * Math.log(u)) * Math.cos(2 * Math.PI * v);
}

async function insertAll<T>(rows: T[], insert: (chunk: T[]) => Promise<unknown>) {
  for (let i = 0; i < rows.length; i += 500) await insert(rows.slice(i, i + 500));
}

export async function seedDesk(db: Database, faker: Faker, o: DeskSeedOptions): Promise<void> {
  const tenantId = o.rinkId;
  // Days start at midnight UTC, so the counter's hours (13:00–24:00 UTC, morning to evening on the Atlantic coast)
  // do not move with the time of day the seed runs.
  const start = new Date(Math.floor((o.now.getTime() - o.days * DAY) / DAY) * DAY);
  const services = [
    { name: 'Standard sharpening', kind: 'standard' as const, priceMinor: o.priceMinor },
    { name: 'Profiling', kind: 'profiling' as const, priceMinor: o.priceMinor * 3 },
    { name: 'New steel fitted', kind: 'new_steel' as const, priceMinor: o.priceMinor * 2 },
    { name: 'Blade guards', kind: 'add_on' as const, priceMinor: Math.round(o.priceMinor * 0.75) },
  ].map((s) => ({ id: randomUUID(), tenantId, active: 1, createdAt: start, ...s }));
  await db.insert(serviceItem).values(services);
  const standard = services[0]!;

  const stations = o.stationNames.map((name) => ({
    id: randomUUID(),
    tenantId,
    name,
    status: 'active' as const,
    rpm: 3450,
    adjustUnit: 'turns' as const,
    adjustStepMilli: 125,
    ownTrueNm: null,
    ownFairNm: null,
    precision: false,
    createdAt: start,
  }));
  await db.insert(station).values(stations);

  const wheels = stations.map((s) => ({
    id: randomUUID(),
    tenantId,
    stationId: s.id,
    label: `${s.name} wheel`,
    grit: 80,
    diameterNewNm: 7 * INCH,
    minDiameterNm: 6 * INCH,
    ratedMaxRpm: 4140,
    mountedAt: start,
    mountedBy: o.technicianIds[0]!,
    removedAt: null,
  }));
  await db.insert(wheel).values(wheels);

  const customers = await db.select({ id: customer.id }).from(customer).where(eq(customer.tenantId, tenantId));
  const profiles = customers.slice(0, Math.ceil(customers.length * 0.6)).map((c) => ({
    id: randomUUID(),
    tenantId,
    customerId: c.id,
    label: faker.helpers.arrayElement(['Game skates', 'Practice skates', 'Goalie skates', 'Figure skates']),
    bladeWidthNm: faker.helpers.arrayElement([2_900_000, 2_900_000, 3_000_000, 4_000_000]),
    preferredHollowNm: faker.helpers.arrayElement([INCH / 2, INCH / 2, (INCH * 5) / 8, (INCH * 7) / 16, (INCH * 3) / 4]),
    profileRadiusNm: null,
    notes: null,
    createdAt: start,
    updatedAt: start,
  }));
  await insertAll(profiles, (c) => db.insert(skateProfile).values(c));

  const tickets: (typeof ticket.$inferInsert)[] = [];
  const pairs: (typeof ticketPair.$inferInsert)[] = [];
  const events: (typeof ticketEvent.$inferInsert)[] = [];
  const sharpenings: (typeof sharpening.$inferInsert)[] = [];
  const readings: (typeof levelReading.$inferInsert)[] = [];
  const adjustments: (typeof levelingAdjustment.$inferInsert)[] = [];
  const wheelEvents: (typeof wheelEvent.$inferInsert)[] = [];
  const offset = new Map(stations.map((s) => [s.id, faker.number.int({ min: -6, max: 6 }) * 1000]));
  const diameter = new Map(wheels.map((w) => [w.stationId, w.diameterNewNm]));
  const lastDressing = new Map(stations.map((s) => [s.id, start.getTime()]));
  const busyUntil = new Map(stations.map((s) => [s.id, 0]));
  for (const w of wheels) {
    wheelEvents.push({ id: randomUUID(), tenantId, wheelId: w.id, stationId: w.stationId, kind: 'mount', diameterNm: w.diameterNewNm, at: start, byUserId: w.mountedBy, hollowNm: null, note: null });
    wheelEvents.push({ id: randomUUID(), tenantId, wheelId: w.id, stationId: w.stationId, kind: 'dressing', hollowNm: INCH / 2, diameterNm: w.diameterNewNm, at: start, byUserId: w.mountedBy, note: null });
  }

  let number = 0;
  for (let day = 0; day <= o.days; day++) {
    const dayStart = start.getTime() + day * DAY;
    const count = Math.max(0, Math.round(o.ticketsPerDay + normal(faker) * 2));
    for (let n = 0; n < count; n++) {
      const dropped = new Date(dayStart + (13 + faker.number.float({ min: 0, max: 11 })) * 3_600_000);
      if (dropped > o.now) continue;
      number += 1;
      const owner = faker.helpers.arrayElement(customers);
      const stationRow = faker.helpers.arrayElement(stations);
      const technicianId = faker.helpers.arrayElement(o.technicianIds);
      const pairCount = faker.helpers.weightedArrayElement([
        { weight: 7, value: 1 },
        { weight: 2, value: 2 },
        { weight: 1, value: 3 },
      ]);
      const ageMinutes = (o.now.getTime() - dropped.getTime()) / MINUTE;
      const state = ageMinutes > 180 ? 'collected' : ageMinutes > 60 ? 'ready' : ageMinutes > 25 ? 'on_station' : 'waiting';
      const ticketId = randomUUID();
      let clock = Math.max(dropped.getTime() + 5 * MINUTE, busyUntil.get(stationRow.id) ?? 0);
      for (let p = 1; p <= pairCount; p++) {
        const pairId = randomUUID();
        pairs.push({ id: pairId, tenantId, ticketId, position: p, skateProfileId: null, label: `Pair ${p}`, bladeWidthNm: 2_900_000, hollowNm: INCH / 2, serviceId: standard.id, priceMinor: standard.priceMinor, notes: null });
        if (state === 'waiting') continue;
        clock += (6 + faker.number.float({ min: 0, max: 4 })) * MINUTE;
        const doneAt = new Date(clock);
        const sharpeningId = randomUUID();
        const passes = faker.number.int({ min: 3, max: 6 });
        sharpenings.push({ id: sharpeningId, tenantId, ticketId, ticketPairId: pairId, stationId: stationRow.id, wheelId: wheels.find((w) => w.stationId === stationRow.id)!.id, technicianId, hollowNm: INCH / 2, passes, bladeWidthNm: 2_900_000, doneAt, createdAt: doneAt });
        const daysLeft = (o.now.getTime() - doneAt.getTime()) / DAY;
        const drift = stationRow.name === o.driftingStation && daysLeft < 21 ? ((21 - daysLeft) / 21) * 1.6 * THOU : 0;
        for (const blade of ['left', 'right'] as const) {
          const value = Math.round((offset.get(stationRow.id) ?? 0) + drift + normal(faker) * 0.35 * THOU);
          readings.push({ id: randomUUID(), tenantId, stationId: stationRow.id, sharpeningId, kind: 'sharpening', blade, attempt: 1, readingNm: value, tiltMillideg: null, takenAt: doneAt, takenBy: technicianId });
          if (Math.abs(value) > 1.5 * THOU && faker.number.float({ min: 0, max: 1 }) < 0.7) {
            readings.push({ id: randomUUID(), tenantId, stationId: stationRow.id, sharpeningId, kind: 'sharpening', blade, attempt: 2, readingNm: Math.round(value / 3), tiltMillideg: null, takenAt: new Date(clock + 2 * MINUTE), takenBy: technicianId });
          }
        }
      }
      busyUntil.set(stationRow.id, clock);
      const readyAt = state === 'ready' || state === 'collected' ? new Date(clock + MINUTE) : null;
      tickets.push({
        id: ticketId,
        tenantId,
        number,
        customerId: owner.id,
        state,
        stationId: state === 'waiting' ? null : stationRow.id,
        payment: 'counter',
        notes: null,
        droppedAt: dropped,
        promisedAt: new Date(dropped.getTime() + (20 + 8 * pairCount) * MINUTE),
        startedAt: state === 'waiting' ? null : new Date(dropped.getTime() + 5 * MINUTE),
        readyAt,
        collectedAt: state === 'collected' ? new Date((readyAt?.getTime() ?? clock) + 90 * MINUTE) : null,
        voidReason: null,
        createdBy: technicianId,
      });
      events.push({ id: randomUUID(), tenantId, ticketId, fromState: null, toState: 'waiting', stationId: null, reason: null, at: dropped, byUserId: technicianId });
      if (state !== 'waiting') events.push({ id: randomUUID(), tenantId, ticketId, fromState: 'waiting', toState: 'on_station', stationId: stationRow.id, reason: null, at: new Date(dropped.getTime() + 5 * MINUTE), byUserId: technicianId });
      if (readyAt) events.push({ id: randomUUID(), tenantId, ticketId, fromState: 'on_station', toState: 'ready', stationId: stationRow.id, reason: null, at: readyAt, byUserId: technicianId });
      if (state === 'collected') events.push({ id: randomUUID(), tenantId, ticketId, fromState: 'ready', toState: 'collected', stationId: stationRow.id, reason: null, at: new Date((readyAt?.getTime() ?? clock) + 90 * MINUTE), byUserId: technicianId });
    }

    // Upkeep after each day: dress every two weeks, and re-level a station that has wandered.
    for (const s of stations) {
      // Next morning, before the counter opens: after every reading of the day, before any of the next.
      const at = new Date(dayStart + DAY + 11 * 3_600_000);
      if (at > o.now) continue;
      const w = wheels.find((x) => x.stationId === s.id)!;
      if (at.getTime() - (lastDressing.get(s.id) ?? 0) >= 14 * DAY) {
        const after = (diameter.get(s.id) ?? w.diameterNewNm) - faker.number.int({ min: 180_000, max: 260_000 });
        diameter.set(s.id, after);
        lastDressing.set(s.id, at.getTime());
        wheelEvents.push({ id: randomUUID(), tenantId, wheelId: w.id, stationId: s.id, kind: 'dressing', hollowNm: INCH / 2, diameterNm: after, at, byUserId: o.technicianIds[0]!, note: null });
      }
      const current = offset.get(s.id) ?? 0;
      const inFinalWeeks = (o.now.getTime() - at.getTime()) / DAY < 24;
      const phase = (day + stations.indexOf(s) * 9) % 30;
      if (!inFinalWeeks && phase === 0 && day > 0) {
        // A holder knocked out of level (a dropped blade, a loose clamp): the next check finds it.
        offset.set(s.id, current + faker.helpers.arrayElement([-1, 1]) * faker.number.int({ min: 15_000, max: 32_000 }));
      } else if (!inFinalWeeks && phase === 3 && day > 3) {
        const turns = Math.round(-current / RESPONSE_NM_PER_TURN / 0.125) * 0.125;
        if (turns !== 0) {
          adjustments.push({ id: randomUUID(), tenantId, stationId: s.id, amountMilli: Math.round(turns * 1000), note: 'Re-levelled after check readings', at, byUserId: o.technicianIds[0]! });
          offset.set(s.id, current + turns * RESPONSE_NM_PER_TURN);
        }
      } else {
        // Holders creep a little between re-levellings.
        offset.set(s.id, current + normal(faker) * 300);
      }
    }
  }

  await insertAll(tickets, (c) => db.insert(ticket).values(c));
  await insertAll(pairs, (c) => db.insert(ticketPair).values(c));
  await insertAll(events, (c) => db.insert(ticketEvent).values(c));
  await insertAll(sharpenings, (c) => db.insert(sharpening).values(c));
  await insertAll(readings, (c) => db.insert(levelReading).values(c));
  await insertAll(adjustments, (c) => db.insert(levelingAdjustment).values(c));
  await insertAll(wheelEvents, (c) => db.insert(wheelEvent).values(c));
}
