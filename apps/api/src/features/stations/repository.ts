import { randomUUID } from 'node:crypto';
import { and, asc, count, desc, eq, gte, inArray, isNotNull, isNull, or, sql } from 'drizzle-orm';
import { alias } from 'drizzle-orm/mysql-core';
import { levelReading, levelingAdjustment, scoped, sharpening, station, ticket, user, wheel, wheelEvent } from '@rinkwright/db';
import type { StationInput } from '@rinkwright/core';

/** An original sharpening, joined to the corrections that point at it. */
const corrected = alias(sharpening, 'corrected');

/** The rink's stations by name, or just the one asked for. */
export const listStations = (tenantId: string, onlyId?: string) => scoped(tenantId).find(station, { where: onlyId ? eq(station.id, onlyId) : undefined, orderBy: asc(station.name) });

export const findStation = (tenantId: string, stationId: string) => scoped(tenantId).findOne(station, eq(station.id, stationId));

export async function createStation(tenantId: string, input: StationInput & { id: string }) {
  await scoped(tenantId).insert(station, input);
}

export const updateStation = (tenantId: string, stationId: string, input: StationInput) =>
  scoped(tenantId).update(station, input, eq(station.id, stationId));

export const stationNameTaken = async (tenantId: string, name: string, exceptId?: string) => {
  const rows = await scoped(tenantId).find(station, { where: eq(station.name, name), limit: 2 });
  return rows.some((r) => r.id !== exceptId);
};

export const currentWheels = (tenantId: string, stationId?: string) => scoped(tenantId).find(wheel, { where: and(isNull(wheel.removedAt), stationId ? eq(wheel.stationId, stationId) : undefined) });

export const wheelEvents = (tenantId: string, wheelIds: string[]) =>
  wheelIds.length === 0 ? Promise.resolve([]) : scoped(tenantId).find(wheelEvent, { where: inArray(wheelEvent.wheelId, wheelIds), orderBy: asc(wheelEvent.at) });

/**
 * Passes ground on each wheel so far: each logged pair counts once, with the passes of its latest correction
 * when it was corrected (a correction replaces the record's numbers, it is not another pair).
 */
export async function passesByWheel(tenantId: string, wheelIds: string[]): Promise<Map<string, number>> {
  const [totals] = await passesOnWheels(tenantId, wheelIds, [null]);
  return totals ?? new Map();
}

/** Passes ground on a wheel before each time: what the wheel had done when a dressing measured it. */
export async function passesOnWheelBefore(tenantId: string, wheelId: string, times: Date[]): Promise<number[]> {
  return (await passesOnWheels(tenantId, [wheelId], times)).map((byWheel) => byWheel.get(wheelId) ?? 0);
}

/**
 * Per time (null: now), the passes on each wheel by the pairs done before it. The originals are summed in the
 * database over the wheel index; the few corrections are then applied as the difference their latest one makes.
 */
async function passesOnWheels(tenantId: string, wheelIds: string[], times: (Date | null)[]): Promise<Map<string, number>[]> {
  const result = times.map(() => new Map<string, number>());
  if (wheelIds.length === 0 || times.length === 0) return result;
  const s = scoped(tenantId);
  const before = (t: Date | null) => (t ? sql`${sharpening.doneAt} < ${t}` : sql`true`);
  const sums = Object.fromEntries(times.map((t, i) => [`t${i}`, sql<number>`coalesce(sum(case when ${before(t)} then ${sharpening.passes} else 0 end), 0)`.mapWith(Number)]));
  const [originals, corrections] = await Promise.all([
    s.findJoined(sharpening, { fields: { wheelId: sharpening.wheelId, ...sums }, joins: [], where: and(inArray(sharpening.wheelId, wheelIds), isNull(sharpening.correctsId)), groupBy: [sharpening.wheelId] }),
    s.findJoined(corrected, {
      fields: { originalId: corrected.id, wheelId: corrected.wheelId, doneAt: corrected.doneAt, was: corrected.passes, passes: sharpening.passes, createdAt: sharpening.createdAt, id: sharpening.id },
      // `corrects_id is not null` lets the join start from the few corrections (their index) rather than every record.
      joins: [{ table: sharpening, on: and(eq(sharpening.tenantId, corrected.tenantId), isNotNull(sharpening.correctsId), eq(sharpening.correctsId, corrected.id))! }],
      where: and(inArray(corrected.wheelId, wheelIds), isNull(corrected.correctsId)),
    }),
  ]);
  for (const row of originals) {
    const values = row as unknown as Record<string, number>;
    times.forEach((_, i) => result[i]!.set(row.wheelId as string, values[`t${i}`] ?? 0));
  }
  const latest = new Map<string, (typeof corrections)[number]>();
  for (const c of corrections) {
    const seen = latest.get(c.originalId);
    if (!seen || c.createdAt > seen.createdAt || (c.createdAt.getTime() === seen.createdAt.getTime() && c.id > seen.id)) latest.set(c.originalId, c);
  }
  for (const c of latest.values()) {
    times.forEach((t, i) => {
      if (t && !(c.doneAt < t)) return;
      const byWheel = result[i]!;
      byWheel.set(c.wheelId as string, (byWheel.get(c.wheelId as string) ?? 0) + c.passes - c.was);
    });
  }
  return result;
}

export async function queueCounts(tenantId: string) {
  return scoped(tenantId).findJoined(ticket, {
    fields: { stationId: ticket.stationId, state: ticket.state, n: count() },
    joins: [],
    where: inArray(ticket.state, ['waiting', 'on_station']),
    groupBy: [ticket.stationId, ticket.state],
  });
}

export async function mountWheel(
  tenantId: string,
  input: { id: string; stationId: string; label: string; grit: number; diameterNewNm: number; minDiameterNm: number; ratedMaxRpm: number; hollowNm: number; byUserId: string; eventIds: [string, string] },
) {
  const now = new Date();
  await scoped(tenantId).transaction(async (tx) => {
    const mounted = await tx.find(wheel, { where: and(eq(wheel.stationId, input.stationId), isNull(wheel.removedAt)) });
    for (const old of mounted) {
      await tx.update(wheel, { removedAt: now }, eq(wheel.id, old.id));
      await tx.insert(wheelEvent, { id: randomUUID(), wheelId: old.id, stationId: input.stationId, kind: 'removal', at: now, byUserId: input.byUserId });
    }
    const { eventIds, hollowNm, byUserId, ...rest } = input;
    await tx.insert(wheel, { ...rest, mountedAt: now, mountedBy: byUserId });
    await tx.insert(wheelEvent, { id: eventIds[0], wheelId: input.id, stationId: input.stationId, kind: 'mount', diameterNm: input.diameterNewNm, at: now, byUserId });
    // A millisecond after the mount, so the wheel log lists the mount first.
    await tx.insert(wheelEvent, { id: eventIds[1], wheelId: input.id, stationId: input.stationId, kind: 'dressing', hollowNm, diameterNm: input.diameterNewNm, at: new Date(now.getTime() + 1), byUserId });
  });
}

export const addWheelEvent = (tenantId: string, row: Omit<typeof wheelEvent.$inferInsert, 'tenantId'>) => scoped(tenantId).insert(wheelEvent, row);

export async function removeWheel(tenantId: string, wheelId: string, stationId: string, byUserId: string) {
  const now = new Date();
  await scoped(tenantId).transaction(async (tx) => {
    await tx.update(wheel, { removedAt: now }, eq(wheel.id, wheelId));
    await tx.insert(wheelEvent, { id: randomUUID(), wheelId, stationId, kind: 'removal', at: now, byUserId });
  });
}

export const addAdjustment = (tenantId: string, row: Omit<typeof levelingAdjustment.$inferInsert, 'tenantId'>) => scoped(tenantId).insert(levelingAdjustment, row);

export const addCheckReading = (tenantId: string, row: Omit<typeof levelReading.$inferInsert, 'tenantId'>) => scoped(tenantId).insert(levelReading, row);

/** The drift watch's series of a station since a time, oldest first: its first readings of each blade (attempt 1) and its check readings. */
export function readingsSince(tenantId: string, stationId: string, since: Date) {
  return scoped(tenantId).findJoined(levelReading, {
    fields: { kind: levelReading.kind, attempt: levelReading.attempt, readingNm: levelReading.readingNm, takenAt: levelReading.takenAt },
    joins: [],
    where: and(eq(levelReading.stationId, stationId), gte(levelReading.takenAt, since), or(eq(levelReading.kind, 'check'), eq(levelReading.attempt, 1))),
    orderBy: [asc(levelReading.takenAt), asc(levelReading.id)],
  });
}

export function adjustmentsOf(tenantId: string, stationId: string) {
  return scoped(tenantId).findJoined(levelingAdjustment, {
    fields: { id: levelingAdjustment.id, amountMilli: levelingAdjustment.amountMilli, note: levelingAdjustment.note, at: levelingAdjustment.at, by: user.name },
    joins: [{ table: user, on: eq(user.id, levelingAdjustment.byUserId) }],
    where: eq(levelingAdjustment.stationId, stationId),
    orderBy: [desc(levelingAdjustment.at)],
  });
}

/** The latest readings the drift watch charts (first readings and check readings), oldest first. */
export async function latestSeries(tenantId: string, stationId: string, limit: number): Promise<number[]> {
  const rows = await scoped(tenantId).find(levelReading, {
    where: and(eq(levelReading.stationId, stationId), or(eq(levelReading.kind, 'check'), eq(levelReading.attempt, 1))),
    orderBy: [desc(levelReading.takenAt), desc(levelReading.id)],
    limit,
  });
  return rows.map((r) => r.readingNm).reverse();
}
