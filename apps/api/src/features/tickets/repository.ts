import { randomUUID } from 'node:crypto';
import { and, asc, count, desc, eq, gte, inArray, isNull, max, sql } from 'drizzle-orm';
import {
  customer,
  isDuplicateKey,
  levelReading,
  scoped,
  serviceItem,
  sharpening,
  skateProfile,
  station,
  ticket,
  ticketEvent,
  ticketPair,
  user,
  wheel,
  type Scope,
} from '@rinkwright/db';
import type { TicketState } from '@rinkwright/core';

export type TicketRow = typeof ticket.$inferSelect;
type NewPair = Omit<typeof ticketPair.$inferInsert, 'tenantId'>;
type NewSharpening = Omit<typeof sharpening.$inferInsert, 'tenantId'>;
type NewReading = Omit<typeof levelReading.$inferInsert, 'tenantId'>;

export const findStation = (tenantId: string, stationId: string) => scoped(tenantId).findOne(station, eq(station.id, stationId));
export const activeStations = (tenantId: string) => scoped(tenantId).find(station, { where: eq(station.status, 'active'), orderBy: asc(station.name) });
export const findCustomer = (tenantId: string, customerId: string) => scoped(tenantId).findOne(customer, eq(customer.id, customerId));
export const findServices = (tenantId: string, ids: string[]) => scoped(tenantId).find(serviceItem, { where: inArray(serviceItem.id, ids) });
export const findProfiles = (tenantId: string, customerId: string, ids: string[]) =>
  ids.length === 0 ? Promise.resolve([]) : scoped(tenantId).find(skateProfile, { where: and(eq(skateProfile.customerId, customerId), inArray(skateProfile.id, ids)) });
export const findTicket = (tenantId: string, ticketId: string) => scoped(tenantId).findOne(ticket, eq(ticket.id, ticketId));
export const mountedWheel = async (tenantId: string, stationId: string) =>
  (await scoped(tenantId).find(wheel, { where: and(eq(wheel.stationId, stationId), isNull(wheel.removedAt)), limit: 1 }))[0];

/** Opens a ticket with its pairs and its first event. The number is the rink's next; a race retries. */
/** `within` runs in the same transaction (the pairs' credits are redeemed there, so a refusal keeps no ticket). */
export async function insertTicket(tenantId: string, row: Omit<TicketRow, 'tenantId' | 'number'>, pairs: NewPair[], within?: (tx: Scope) => Promise<void>): Promise<number> {
  for (let attempt = 0; ; attempt++) {
    try {
      return await scoped(tenantId).transaction(async (tx) => {
        const [last] = await tx.findJoined(ticket, { fields: { n: max(ticket.number) }, joins: [] });
        const number = (last?.n ?? 0) + 1;
        await tx.insert(ticket, { ...row, number });
        await tx.insert(ticketPair, pairs);
        await tx.insert(ticketEvent, { id: randomUUID(), ticketId: row.id, fromState: null, toState: row.state, at: row.droppedAt, byUserId: row.createdBy });
        if (within) await within(tx);
        return number;
      });
    } catch (error) {
      if (!isDuplicateKey(error) || attempt >= 4) throw error;
    }
  }
}

/** A ticket as the lists show it: its customer, and how many of its pairs are done, counted in the query. */
function summaryFields() {
  const pairs = sql<number>`(select count(*) from ${ticketPair} where ${ticketPair.tenantId} = ${ticket.tenantId} and ${ticketPair.ticketId} = ${ticket.id})`.mapWith(Number);
  const done = sql<number>`(select count(distinct ${sharpening.ticketPairId}) from ${sharpening} where ${sharpening.tenantId} = ${ticket.tenantId} and ${sharpening.ticketId} = ${ticket.id})`.mapWith(Number);
  return {
    id: ticket.id,
    number: ticket.number,
    state: ticket.state,
    stationId: ticket.stationId,
    payment: ticket.payment,
    droppedAt: ticket.droppedAt,
    promisedAt: ticket.promisedAt,
    readyAt: ticket.readyAt,
    customerId: customer.id,
    customerName: customer.name,
    memberCode: customer.memberCode,
    pairCount: pairs,
    pairsDone: done,
  };
}

export function listTickets(tenantId: string, filter: { states: TicketState[]; stationId?: string | undefined; customerId?: string | undefined }) {
  return scoped(tenantId).findJoined(ticket, {
    fields: summaryFields(),
    joins: [{ table: customer, on: eq(customer.id, ticket.customerId) }],
    where: and(
      inArray(ticket.state, filter.states),
      filter.stationId ? eq(ticket.stationId, filter.stationId) : undefined,
      filter.customerId ? eq(ticket.customerId, filter.customerId) : undefined,
    ),
    orderBy: filter.states.includes('collected') ? [desc(ticket.droppedAt)] : [asc(ticket.promisedAt), asc(ticket.number)],
    limit: 200,
  });
}

/** One ticket's summary with its notes, in whatever state it is. */
export async function findTicketSummary(tenantId: string, ticketId: string) {
  const [row] = await scoped(tenantId).findJoined(ticket, {
    fields: { ...summaryFields(), notes: ticket.notes, voidReason: ticket.voidReason },
    joins: [{ table: customer, on: eq(customer.id, ticket.customerId) }],
    where: eq(ticket.id, ticketId),
  });
  return row;
}

export async function ticketParts(tenantId: string, ticketId: string) {
  const scope = scoped(tenantId);
  const [pairs, sharpenings, readings, events] = await Promise.all([
    scope.findJoined(ticketPair, {
      fields: {
        id: ticketPair.id,
        position: ticketPair.position,
        label: ticketPair.label,
        skateProfileId: ticketPair.skateProfileId,
        bladeWidthNm: ticketPair.bladeWidthNm,
        hollowNm: ticketPair.hollowNm,
        serviceId: ticketPair.serviceId,
        serviceName: serviceItem.name,
        priceMinor: ticketPair.priceMinor,
        notes: ticketPair.notes,
      },
      joins: [{ table: serviceItem, on: eq(serviceItem.id, ticketPair.serviceId) }],
      where: eq(ticketPair.ticketId, ticketId),
      orderBy: asc(ticketPair.position),
    }),
    scope.findJoined(sharpening, {
      fields: {
        id: sharpening.id,
        ticketPairId: sharpening.ticketPairId,
        stationId: sharpening.stationId,
        stationName: station.name,
        wheelId: sharpening.wheelId,
        technician: user.name,
        hollowNm: sharpening.hollowNm,
        passes: sharpening.passes,
        bladeWidthNm: sharpening.bladeWidthNm,
        doneAt: sharpening.doneAt,
        correctsId: sharpening.correctsId,
        correctionReason: sharpening.correctionReason,
      },
      joins: [
        { table: station, on: eq(station.id, sharpening.stationId) },
        { table: user, on: eq(user.id, sharpening.technicianId) },
      ],
      where: eq(sharpening.ticketId, ticketId),
      orderBy: [asc(sharpening.createdAt), asc(sharpening.id)],
    }),
    scope.findJoined(levelReading, {
      fields: {
        id: levelReading.id,
        sharpeningId: levelReading.sharpeningId,
        blade: levelReading.blade,
        attempt: levelReading.attempt,
        readingNm: levelReading.readingNm,
        tiltMillideg: levelReading.tiltMillideg,
        takenAt: levelReading.takenAt,
        takenBy: user.name,
      },
      joins: [
        { table: sharpening, on: eq(sharpening.id, levelReading.sharpeningId) },
        { table: user, on: eq(user.id, levelReading.takenBy) },
      ],
      where: eq(sharpening.ticketId, ticketId),
      orderBy: [asc(levelReading.blade), asc(levelReading.attempt)],
    }),
    scope.findJoined(ticketEvent, {
      fields: {
        fromState: ticketEvent.fromState,
        toState: ticketEvent.toState,
        stationId: ticketEvent.stationId,
        reason: ticketEvent.reason,
        at: ticketEvent.at,
        by: user.name,
      },
      joins: [{ table: user, on: eq(user.id, ticketEvent.byUserId) }],
      where: eq(ticketEvent.ticketId, ticketId),
      orderBy: [asc(ticketEvent.at), asc(ticketEvent.id)],
    }),
  ]);
  return { pairs, sharpenings, readings, events };
}

export const stationNames = async (tenantId: string) => new Map((await scoped(tenantId).find(station)).map((s) => [s.id, s.name]));

/** Moves the ticket from one state to another, only if it is still in the state the caller saw. */
export async function moveTicket(
  tenantId: string,
  ticketId: string,
  from: TicketState,
  set: Partial<Omit<TicketRow, 'id' | 'tenantId'>> & { state: TicketState },
  event: { stationId: string | null; reason: string | null; at: Date; byUserId: string },
  within?: (tx: Scope) => Promise<void>,
): Promise<boolean> {
  return scoped(tenantId).transaction(async (tx) => {
    const moved = await tx.update(ticket, set, and(eq(ticket.id, ticketId), eq(ticket.state, from))!);
    if (moved === 0) return false;
    await tx.insert(ticketEvent, { id: randomUUID(), ticketId, fromState: from, toState: set.state, ...event });
    if (within) await within(tx);
    return true;
  });
}

/**
 * Logs a pair in one transaction that first takes the ticket's row lock, so two tablets logging on one ticket at
 * once take turns: the second sees the first's pair and sharpening before it decides a new pair's position or
 * whether the named pair is done. The ticket must still be open for work. Logging at a station puts the ticket on
 * that station (as the technician would by hand), in the same transaction, so a refused log moves nothing.
 */
export async function insertSharpening(
  tenantId: string,
  input: {
    ticketId: string;
    putOn: { stationId: string; at: Date; byUserId: string };
    newPair?: Omit<NewPair, 'position'>;
    sharpening: NewSharpening;
    readings: NewReading[];
    /** Runs under the ticket's lock, after a new pair is written (a batch pair draws its credit here). */
    withinNewPair?: (tx: Scope, pairId: string) => Promise<void>;
  },
): Promise<'logged' | 'already_logged' | 'closed'> {
  return scoped(tenantId).transaction(async (tx: Scope) => {
    const [open] = await tx.lock(ticket, and(eq(ticket.id, input.ticketId), inArray(ticket.state, ['waiting', 'on_station']))!);
    if (!open) return 'closed';
    if (!input.newPair && (await tx.count(sharpening, and(eq(sharpening.ticketPairId, input.sharpening.ticketPairId), isNull(sharpening.correctsId)))) > 0) {
      return 'already_logged';
    }
    if (open.state === 'waiting' || open.stationId !== input.putOn.stationId) {
      const { stationId, at, byUserId } = input.putOn;
      await tx.update(ticket, { state: 'on_station', stationId, startedAt: open.startedAt ?? at }, eq(ticket.id, open.id));
      await tx.insert(ticketEvent, { id: randomUUID(), ticketId: open.id, fromState: open.state, toState: 'on_station', stationId, reason: null, at, byUserId });
    }
    if (input.newPair) {
      const [last] = await tx.findJoined(ticketPair, { fields: { n: max(ticketPair.position) }, joins: [], where: eq(ticketPair.ticketId, input.ticketId) });
      await tx.insert(ticketPair, { ...input.newPair, position: (last?.n ?? 0) + 1 });
      if (input.withinNewPair) await input.withinNewPair(tx, input.newPair.id);
    }
    await tx.insert(sharpening, input.sharpening);
    if (input.readings.length) await tx.insert(levelReading, input.readings);
    return 'logged';
  });
}

export const pairIdsOf = async (tenantId: string, ticketId: string) => (await scoped(tenantId).find(ticketPair, { where: eq(ticketPair.ticketId, ticketId) })).map((p) => p.id);

export const findPair = (tenantId: string, ticketId: string, pairId: string) =>
  scoped(tenantId).findOne(ticketPair, and(eq(ticketPair.id, pairId), eq(ticketPair.ticketId, ticketId))!);

export const originalSharpeningsOfPair = (tenantId: string, pairId: string) =>
  scoped(tenantId).count(sharpening, and(eq(sharpening.ticketPairId, pairId), isNull(sharpening.correctsId)));

export const findSharpening = (tenantId: string, sharpeningId: string) => scoped(tenantId).findOne(sharpening, eq(sharpening.id, sharpeningId));

export const readingsOf = (tenantId: string, sharpeningId: string) => scoped(tenantId).find(levelReading, { where: eq(levelReading.sharpeningId, sharpeningId) });

export const insertReadings = (tenantId: string, rows: NewReading[]) => scoped(tenantId).insert(levelReading, rows);

export const insertCorrection = (tenantId: string, row: NewSharpening) => scoped(tenantId).insert(sharpening, row);

export const countUnsharpenedPairs = async (tenantId: string, ticketId: string) => {
  const [row] = await scoped(tenantId).findJoined(ticketPair, {
    fields: { n: count() },
    joins: [],
    where: and(
      eq(ticketPair.ticketId, ticketId),
      sql`not exists (select 1 from ${sharpening} where ${sharpening.tenantId} = ${ticketPair.tenantId} and ${sharpening.ticketPairId} = ${ticketPair.id})`,
    ),
  });
  return row?.n ?? 0;
};

/** Sharpenings of the last weeks in time order per station, for each station's pace. */
export const recentSharpenings = (tenantId: string, since: Date) =>
  scoped(tenantId).findJoined(sharpening, {
    fields: { stationId: sharpening.stationId, doneAt: sharpening.doneAt },
    joins: [],
    where: and(gte(sharpening.doneAt, since), isNull(sharpening.correctsId)),
    orderBy: [asc(sharpening.stationId), asc(sharpening.doneAt)],
  });

export const openQueue = (tenantId: string) =>
  listTickets(tenantId, { states: ['waiting', 'on_station'] });
