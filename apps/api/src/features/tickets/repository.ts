import { randomUUID } from 'node:crypto';
import { and, asc, count, desc, eq, getTableColumns, gte, inArray, isNull, max, sql } from 'drizzle-orm';
import { alias } from 'drizzle-orm/mysql-core';
import {
  customer,
  isDuplicateKey,
  levelReading,
  preparedInsert,
  preparedJoined,
  preparedUpdate,
  scoped,
  serviceItem,
  step,
  sharpening,
  skateProfile,
  station,
  ticket,
  ticketEvent,
  ticketPair,
  user,
  wheel,
  type RowOf,
  type Scope,
  type Step,
} from '@rinkwright/db';
import type { TicketState } from '@rinkwright/core';
import { compareText } from '../../lib/sorted';

export type TicketRow = typeof ticket.$inferSelect;
type NewPair = Omit<typeof ticketPair.$inferInsert, 'tenantId'>;
type NewSharpening = Omit<typeof sharpening.$inferInsert, 'tenantId'>;

export const findStation = (tenantId: string, stationId: string) => scoped(tenantId).findOne(station, eq(station.id, stationId));

export const activeStations = (tenantId: string) => scoped(tenantId).find(station, { where: eq(station.status, 'active'), orderBy: asc(station.name) });
export const findCustomer = (tenantId: string, customerId: string) => scoped(tenantId).findOne(customer, eq(customer.id, customerId));
export const findServices = (s: Scope, ids: string[]) => s.find(serviceItem, { where: inArray(serviceItem.id, ids) });
export const findProfiles = (tenantId: string, customerId: string, ids: string[]) =>
  ids.length === 0 ? Promise.resolve([]) : scoped(tenantId).find(skateProfile, { where: and(eq(skateProfile.customerId, customerId), inArray(skateProfile.id, ids)) });
export const findTicket = (tenantId: string, ticketId: string) => scoped(tenantId).findOne(ticket, eq(ticket.id, ticketId));
// Logging a pair starts with this lock, so it is built once (like the log's other statements below).
const ticketLocked = preparedJoined(ticket, ['ticketId'], (value) => ({
  fields: getTableColumns(ticket),
  joins: [],
  where: eq(ticket.id, value('ticketId')),
  index: 'PRIMARY',
  lock: true,
}));

/** Inside a transaction: the ticket with its row locked (one row, or none), so two tablets writing to one ticket take turns. */
export const lockTicket = (ticketId: string): Step<TicketRow[]> => step.select(ticketLocked, { ticketId });

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

/** A ticket's own fields as the lists and its page show them, with its customer. */
function ticketHeadFields() {
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
  };
}

/** A ticket as the lists show it, and how many of its pairs are done, counted in the query. */
function summaryFields() {
  const pairs = sql<number>`(select count(*) from ${ticketPair} where ${ticketPair.tenantId} = ${ticket.tenantId} and ${ticketPair.ticketId} = ${ticket.id})`.mapWith(Number);
  const done = sql<number>`(select count(distinct ${sharpening.ticketPairId}) from ${sharpening} where ${sharpening.tenantId} = ${ticket.tenantId} and ${sharpening.ticketId} = ${ticket.id})`.mapWith(Number);
  return { ...ticketHeadFields(), pairCount: pairs, pairsDone: done };
}

/** The states of the queue: few tickets, read by their state's index. */
const QUEUE_STATES: readonly TicketState[] = ['waiting', 'on_station', 'ready'];

function ticketList(shape: { states: TicketState[]; byStation: boolean; byCustomer: boolean }) {
  // The queue's lists are read by state (named, so MariaDB skips weighing the other indexes on every poll); a
  // customer's list, or one of done tickets, is left to the planner.
  const queue = !shape.byCustomer && shape.states.every((state) => QUEUE_STATES.includes(state));
  return preparedJoined(ticket, ['stationId', 'customerId'], (value) => ({
    fields: summaryFields(),
    joins: [{ table: customer, on: eq(customer.id, ticket.customerId), index: 'PRIMARY' }],
    index: queue ? 'ticket_tenant_state_idx' : undefined,
    where: and(
      inArray(ticket.state, shape.states),
      shape.byStation ? eq(ticket.stationId, value('stationId')) : undefined,
      shape.byCustomer ? eq(ticket.customerId, value('customerId')) : undefined,
    ),
    orderBy: shape.states.includes('collected') ? [desc(ticket.droppedAt)] : [asc(ticket.promisedAt), asc(ticket.number)],
    limit: 200,
  }));
}

/** One prepared list per shape of filter (the queue board polls the open one). */
const ticketLists = new Map<string, ReturnType<typeof ticketList>>();

export function listTickets(tenantId: string, filter: { states: TicketState[]; stationId?: string | undefined; customerId?: string | undefined }) {
  const shape = { states: [...filter.states].sort(), byStation: filter.stationId !== undefined, byCustomer: filter.customerId !== undefined };
  const key = JSON.stringify(shape);
  let list = ticketLists.get(key);
  if (!list) ticketLists.set(key, (list = ticketList(shape)));
  return scoped(tenantId).run(list, { stationId: filter.stationId ?? null, customerId: filter.customerId ?? null });
}

/**
 * A ticket with its customer and its pairs, a row per pair (one row with null pair fields when it has none). With
 * the two reads below it is the whole ticket: three statements, where a read per part took five. None is ordered in
 * SQL (`orderTicketRows` orders them): ordering by a joined table's column cost each a temporary table, two fifths of
 * its time, and a logged pair orders the rows it adds to them the same way.
 */
const ticketWithPairs = preparedJoined(ticket, ['ticketId'], (value) => ({
  fields: {
    ...ticketHeadFields(),
    notes: ticket.notes,
    voidReason: ticket.voidReason,
    pairId: ticketPair.id,
    position: ticketPair.position,
    label: ticketPair.label,
    skateProfileId: ticketPair.skateProfileId,
    bladeWidthNm: ticketPair.bladeWidthNm,
    hollowNm: ticketPair.hollowNm,
    serviceId: ticketPair.serviceId,
    serviceName: serviceItem.name,
    priceMinor: ticketPair.priceMinor,
    pairNotes: ticketPair.notes,
  },
  joins: [
    { table: customer, on: eq(customer.id, ticket.customerId), index: 'PRIMARY' },
    { table: ticketPair, on: eq(ticketPair.ticketId, ticket.id), left: true, index: 'ticket_pair_tenant_ticket_position_unique' },
    { table: serviceItem, on: eq(serviceItem.id, ticketPair.serviceId), left: true, index: 'PRIMARY' },
  ],
  where: eq(ticket.id, value('ticketId')),
  index: 'PRIMARY',
}));

/** Who took a reading: the user table a second time, beside the sharpening's technician. */
const taker = alias(user, 'taker');

/** The ticket's sharpenings, a row per reading (one row with null reading fields when it has none). */
const sharpeningsWithReadings = preparedJoined(sharpening, ['ticketId'], (value) => ({
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
    createdAt: sharpening.createdAt,
    readingId: levelReading.id,
    blade: levelReading.blade,
    attempt: levelReading.attempt,
    readingNm: levelReading.readingNm,
    tiltMillideg: levelReading.tiltMillideg,
    takenAt: levelReading.takenAt,
    takenBy: taker.name,
  },
  joins: [
    { table: station, on: eq(station.id, sharpening.stationId), index: 'PRIMARY' },
    { table: user, on: eq(user.id, sharpening.technicianId) },
    { table: levelReading, on: eq(levelReading.sharpeningId, sharpening.id), left: true, index: 'level_reading_tenant_sharpening_idx' },
    { table: taker, on: eq(taker.id, levelReading.takenBy), left: true },
  ],
  where: eq(sharpening.ticketId, value('ticketId')),
  index: 'sharpening_tenant_ticket_pair_idx',
}));

const eventsOfTicket = preparedJoined(ticketEvent, ['ticketId'], (value) => ({
  fields: {
    id: ticketEvent.id,
    fromState: ticketEvent.fromState,
    toState: ticketEvent.toState,
    stationId: ticketEvent.stationId,
    stationName: station.name,
    reason: ticketEvent.reason,
    at: ticketEvent.at,
    by: user.name,
  },
  joins: [
    { table: user, on: eq(user.id, ticketEvent.byUserId) },
    { table: station, on: eq(station.id, ticketEvent.stationId), left: true, index: 'PRIMARY' },
  ],
  where: eq(ticketEvent.ticketId, value('ticketId')),
  index: 'ticket_event_tenant_ticket_idx',
}));

/** The three reads of a whole ticket (`ticketRows`), for a round trip that sends more. */
export const ticketReads = (ticketId: string) =>
  [step.select(ticketWithPairs, { ticketId }), step.select(sharpeningsWithReadings, { ticketId }), step.select(eventsOfTicket, { ticketId })] as const;

type Reads = ReturnType<typeof ticketReads>;
type ResultOf<S> = S extends Step<infer R> ? R : never;
export interface TicketRows {
  pairs: ResultOf<Reads[0]>;
  sharpenings: ResultOf<Reads[1]>;
  events: ResultOf<Reads[2]>;
}

/**
 * A ticket's rows in the order its page shows them: pairs by position; sharpenings in the order they were written,
 * each one's readings by blade (left first) and attempt; the history in time order.
 */
export function orderTicketRows(rows: TicketRows): TicketRows {
  rows.pairs.sort((a, b) => a.position - b.position);
  rows.sharpenings.sort(
    (a, b) =>
      a.createdAt.getTime() - b.createdAt.getTime() ||
      compareText(a.id, b.id) ||
      // A sharpening without readings has one row, whose reading fields are null.
      compareText(a.blade ?? '', b.blade ?? '') ||
      (a.attempt ?? 0) - (b.attempt ?? 0),
  );
  rows.events.sort((a, b) => a.at.getTime() - b.at.getTime() || compareText(a.id, b.id));
  return rows;
}

/** A ticket as it stands in `s`, with its pairs, sharpenings, readings and history; every ticket page reads it. */
export async function ticketRows(s: Scope, ticketId: string): Promise<TicketRows> {
  const [pairs, sharpenings, events] = await s.together(ticketReads(ticketId));
  return orderTicketRows({ pairs, sharpenings, events });
}

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

// A logged pair's station, the wheel on it and the technician's name, in one read (the pair is checked against the
// ticket's own rows, read in the same round trip).
const logTargets = preparedJoined(station, ['stationId', 'userId'], (value) => ({
  fields: { id: station.id, name: station.name, status: station.status, wheelId: wheel.id, technician: user.name },
  joins: [
    { table: wheel, on: and(eq(wheel.stationId, station.id), isNull(wheel.removedAt))!, left: true, index: 'wheel_tenant_station_idx' },
    { table: user, on: eq(user.id, value('userId')), left: true },
  ],
  where: eq(station.id, value('stationId')),
  index: 'PRIMARY',
  limit: 1,
}));

/**
 * Where a pair is logged: the station with the wheel mounted on it (`wheelId` null when none), and the name of the
 * technician logging it. No row when the rink has no such station.
 */
export const logTarget = (stationId: string, userId: string) => step.select(logTargets, { stationId, userId });

const toStation = preparedUpdate(ticket, ['ticketId', 'stationId', 'startedAt'], (value) => ({
  set: { state: 'on_station' as const, stationId: sql`${value('stationId')}`, startedAt: sql`${value('startedAt')}` },
  where: eq(ticket.id, value('ticketId')),
  index: 'PRIMARY',
}));
const eventInsert = preparedInsert(ticketEvent, ['id', 'ticketId', 'fromState', 'toState', 'stationId', 'reason', 'at', 'byUserId']);

/** Puts the ticket on a station, as the technician would by hand, with its event (`eventId`). */
export function putOnStation(from: TicketRow, to: { stationId: string; at: Date; byUserId: string; eventId: string }): Step<number>[] {
  const { stationId, at, byUserId, eventId } = to;
  return [
    step.update(toStation, { ticketId: from.id, stationId, startedAt: from.startedAt ?? at }),
    step.insert(eventInsert, { id: eventId, ticketId: from.id, fromState: from.state, toState: 'on_station', stationId, reason: null, at, byUserId }),
  ];
}

const pairInsert = preparedInsert(ticketPair, ['id', 'ticketId', 'position', 'label', 'skateProfileId', 'bladeWidthNm', 'hollowNm', 'serviceId', 'priceMinor', 'notes']);

/** A pair added to a ticket; the caller gives it the position after the last, read under the ticket's lock. */
export const insertPair = (pair: RowOf<typeof pairInsert>) => step.insert(pairInsert, pair);

const sharpeningInsert = preparedInsert(sharpening, [
  'id',
  'ticketId',
  'ticketPairId',
  'stationId',
  'wheelId',
  'technicianId',
  'hollowNm',
  'passes',
  'bladeWidthNm',
  'doneAt',
  'correctsId',
  'correctionReason',
  'createdAt',
]);

const readingInsert = preparedInsert(levelReading, ['id', 'stationId', 'sharpeningId', 'kind', 'blade', 'attempt', 'readingNm', 'tiltMillideg', 'takenAt', 'takenBy']);
export type NewReading = RowOf<typeof readingInsert>;

/** A sharpening with its readings (none for a pair logged without a gauge). */
export function insertSharpening(row: Required<NewSharpening>, readings: NewReading[]): Step<number>[] {
  return [step.insert(sharpeningInsert, row), ...(readings.length ? [step.insertRows(readingInsert, readings)] : [])];
}

export const pairIdsOf = async (tenantId: string, ticketId: string) => (await scoped(tenantId).find(ticketPair, { where: eq(ticketPair.ticketId, ticketId) })).map((p) => p.id);

export const findSharpening = (tenantId: string, sharpeningId: string) => scoped(tenantId).findOne(sharpening, eq(sharpening.id, sharpeningId));

export const readingsOf = (tenantId: string, sharpeningId: string) => scoped(tenantId).find(levelReading, { where: eq(levelReading.sharpeningId, sharpeningId) });

export const insertReadings = async (tenantId: string, rows: NewReading[]) => {
  if (rows.length) await scoped(tenantId).together([step.insertRows(readingInsert, rows)]);
};

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
