import { randomUUID } from 'node:crypto';
import { createService, createSkateProfile, createStation } from '@rinkwright/db/testing';
import { currentDb } from '@rinkwright/db/unscoped';
import { and, count, eq, type SQL } from 'drizzle-orm';
import type { MySqlColumn, MySqlTable } from 'drizzle-orm/mysql-core';
import type { Client } from './app';
import { createCustomerAt, createRinkWithStaff, uniqueEmail, type RinkWorld } from './world';

// A rink's counter ready for work: one active station, one service, one skater with an e-mail address.
// Written with the shared factories, so each test starts from rows it made itself.

/** 2.9 mm, the hockey runner of the worked examples (trade-facts.md, "Edge level"; runners are about 3 mm). */
export const HOCKEY_WIDTH_NM = 2_900_000;
/** 1/2" = 12.7 mm, a usual shop default hollow (trade-facts.md, "Hollow geometry"). */
export const HALF_INCH_NM = 12_700_000;
/** 0.001" (1 in = 25.4 mm exactly, trade-facts.md, "Units"). */
export const THOU_NM = 25_400;

export interface Desk {
  world: RinkWorld;
  station: { id: string; name: string };
  service: { id: string; name: string; priceMinor: number };
  skater: { id: string; name: string; email: string };
}

export async function createDesk(rinkName: string, options: { stationStatus?: 'active' | 'maintenance' | 'retired' } = {}): Promise<Desk> {
  const world = await createRinkWithStaff(rinkName);
  const db = currentDb();
  const station = await createStation(db, world.id, { name: 'Station One', status: options.stationStatus ?? 'active' });
  const service = await createService(db, world.id, { name: 'Standard sharpening', priceMinor: 1200 });
  const email = uniqueEmail('skater');
  const skater = await createCustomerAt(world.id, { name: 'Robin Testwood', email });
  return { world, station, service, skater: { id: skater.id, name: skater.name, email } };
}

/** A skate profile of the desk's skater, or of another customer of the same rink. */
export const profileFor = (desk: Desk, input: { bladeWidthNm?: number; preferredHollowNm?: number } = {}, customerId = desk.skater.id) =>
  createSkateProfile(currentDb(), desk.world.id, customerId, input);

/** A fresh client-made key, as the counter makes one per action. */
export const newKey = (label = 'desk') => `${label}-${randomUUID()}`;

/** A counter write: the API refuses one without an Idempotency-Key. */
export function write(agent: Client, path: string, body: object = {}, key = newKey()) {
  return agent.post(path).set('Idempotency-Key', key).send(body);
}

export const pair = (desk: Desk, extra: Record<string, unknown> = {}) => ({ label: 'Game skates', serviceId: desk.service.id, ...extra });

export const ticketBody = (desk: Desk, pairs = 1, extra: Record<string, unknown> = {}) => ({
  customerId: desk.skater.id,
  pairs: Array.from({ length: pairs }, (_, i) => pair(desk, { label: `Pair ${i + 1}` })),
  ...extra,
});

export interface TicketPair {
  id: string;
  position: number;
  label: string;
  bladeWidthNm: number | null;
  hollowNm: number | null;
  sharpenings: { id: string; passes: number; correctsId: string | null; technician: string; readings: { blade: string; attempt: number; readingNm: number; tiltMillideg: number | null; takenAt: string; takenBy: string }[] }[];
}

export interface TicketBody {
  id: string;
  number: number;
  state: string;
  promisedAt: string;
  pairCount: number;
  pairsDone: number;
  pairs: TicketPair[];
  events: { fromState: string | null; toState: string; stationName: string | null; reason: string | null; at: string; by: string }[];
}

/** Takes a ticket in and fails loudly unless it was made, so later steps start from a real ticket. */
export async function takeIn(agent: Client, desk: Desk, pairs = 1, extra: Record<string, unknown> = {}): Promise<TicketBody> {
  const response = await write(agent, `/api/rinks/${desk.world.slug}/tickets`, ticketBody(desk, pairs, extra));
  if (response.status !== 201) throw new Error(`intake answered ${response.status}: ${JSON.stringify(response.body)}`);
  return response.body as TicketBody;
}

export const logBody = (desk: Desk, extra: Record<string, unknown> = {}) => ({
  stationId: desk.station.id,
  hollowNm: HALF_INCH_NM,
  passes: 4,
  bladeWidthNm: HOCKEY_WIDTH_NM,
  readings: [
    { blade: 'left', readingNm: 5_080 },
    { blade: 'right', readingNm: -2_540 },
  ],
  ...extra,
});

/** Logs one pair of a ticket and fails loudly unless it was logged. */
export async function logPair(agent: Client, desk: Desk, ticketId: string, pairId: string, extra: Record<string, unknown> = {}): Promise<TicketBody> {
  const response = await write(agent, `/api/rinks/${desk.world.slug}/tickets/${ticketId}/sharpenings`, logBody(desk, { pairId, ...extra }));
  if (response.status !== 201) throw new Error(`logging answered ${response.status}: ${JSON.stringify(response.body)}`);
  return response.body as TicketBody;
}

export function transition(agent: Client, desk: Desk, ticketId: string, body: object, key = newKey('move')) {
  return write(agent, `/api/rinks/${desk.world.slug}/tickets/${ticketId}/transitions`, body, key);
}

/** Rows of a table that belong to one rink, read straight from the database rather than through the API. */
export async function rowsOf(table: MySqlTable & { tenantId: MySqlColumn }, tenantId: string, where?: SQL): Promise<number> {
  const [row] = await currentDb().select({ n: count() }).from(table).where(and(eq(table.tenantId, tenantId), where));
  return row?.n ?? 0;
}
