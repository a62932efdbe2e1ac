import { randomUUID } from 'node:crypto';
import { and, asc, count, desc, eq, gte, inArray, isNull, or } from 'drizzle-orm';
import { levelReading, levelingAdjustment, scoped, sharpening, station, ticket, user, wheel, wheelEvent } from '@rinkwright/db';
import type { StationInput } from '@rinkwright/core';

export const listStations = (tenantId: string) => scoped(tenantId).find(station, { orderBy: asc(station.name) });

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

export const currentWheels = (tenantId: string) => scoped(tenantId).find(wheel, { where: isNull(wheel.removedAt) });

export const wheelEvents = (tenantId: string, wheelIds: string[]) =>
  wheelIds.length === 0 ? Promise.resolve([]) : scoped(tenantId).find(wheelEvent, { where: inArray(wheelEvent.wheelId, wheelIds), orderBy: asc(wheelEvent.at) });

/**
 * Passes ground on each wheel so far: each logged pair counts once, with the passes of its latest correction
 * when it was corrected (a correction replaces the record's numbers, it is not another pair).
 */
export async function passesByWheel(tenantId: string, wheelIds: string[]): Promise<Map<string, number>> {
  if (wheelIds.length === 0) return new Map();
  const rows = await scoped(tenantId).find(sharpening, { where: inArray(sharpening.wheelId, wheelIds), orderBy: [asc(sharpening.createdAt), asc(sharpening.id)] });
  const totals = new Map<string, number>();
  for (const [wheelId, passes] of effectivePasses(rows)) totals.set(wheelId, (totals.get(wheelId) ?? 0) + passes);
  return totals;
}

/** Per original sharpening, its wheel and its passes as last corrected, with the time the pair was done. */
function effectivePasses(rows: (typeof sharpening.$inferSelect)[]): [string, number, Date][] {
  const latest = new Map<string, number>();
  for (const r of rows) if (r.correctsId) latest.set(r.correctsId, r.passes);
  return rows.filter((r) => !r.correctsId && r.wheelId).map((r) => [r.wheelId as string, latest.get(r.id) ?? r.passes, r.doneAt]);
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

/** The station's first readings of each blade (attempt 1) and its check readings, oldest first, since a time. */
export function readingsSince(tenantId: string, stationId: string, since: Date) {
  return scoped(tenantId).findJoined(levelReading, {
    fields: {
      id: levelReading.id,
      kind: levelReading.kind,
      blade: levelReading.blade,
      attempt: levelReading.attempt,
      readingNm: levelReading.readingNm,
      takenAt: levelReading.takenAt,
      sharpeningId: levelReading.sharpeningId,
    },
    joins: [],
    where: and(eq(levelReading.stationId, stationId), gte(levelReading.takenAt, since)),
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

/** Passes ground on a wheel before a time: what the wheel had done when a dressing measured it. */
export async function passesOnWheelBefore(tenantId: string, wheelId: string, times: Date[]): Promise<number[]> {
  const rows = effectivePasses(await scoped(tenantId).find(sharpening, { where: eq(sharpening.wheelId, wheelId), orderBy: asc(sharpening.createdAt) }));
  return times.map((t) => rows.filter(([, , doneAt]) => doneAt < t).reduce((sum, [, passes]) => sum + passes, 0));
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
