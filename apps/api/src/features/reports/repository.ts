import { and, asc, eq, gt, gte, inArray, isNotNull, isNull, lt, max, min, ne, sql, sum, type SQL } from 'drizzle-orm';
import type { AnyMySqlColumn } from 'drizzle-orm/mysql-core';
import {
  creditEntry,
  creditLot,
  leagueTeam,
  league,
  levelReading,
  levelingAdjustment,
  membership,
  payment,
  product,
  productPrice,
  refund,
  reportCreditDay,
  reportDriftDay,
  reportLeveling,
  reportMoneyDay,
  reportRefresh,
  reportTurnaround,
  reportWheelDay,
  reportWorkDay,
  HOURS,
  ROLLUP_KEY,
  hourKey,
  sharpening,
  station,
  ticket,
  ticketEvent,
  user,
  wheel,
  wheelEvent,
  member,
  isDuplicateKey,
  type Scope,
} from '@rinkwright/db';

// The reports' only door to the database: the raw rows a refresh summarises (read on the primary, inside the
// refresh's transaction), the summary rows it writes, and the summary reads of the reports (on the reports
// scope, which is a replica when one is set).

export type Range = { start: Date; end: Date };
const inRange = (column: Parameters<typeof gte>[0], r: Range) => and(gte(column, r.start), lt(column, r.end));
const n = (v: unknown) => Number(v ?? 0);

// ---- the watermark ---------------------------------------------------------------------------------------------

/** Locks the rink's refresh row (made on first use), so two refreshes of one rink never interleave. */
export async function lockWatermark(s: Scope): Promise<Date | null> {
  const [row] = await s.lock(reportRefresh, s.filter(reportRefresh));
  if (row) return row.through;
  await s.insert(reportRefresh, { through: new Date(0), refreshedAt: new Date(0) }).catch((error: unknown) => {
    // Another refresh made the row a moment ago: its lock below waits for that refresh to finish.
    if (!isDuplicateKey(error)) throw error;
  });
  await s.lock(reportRefresh, s.filter(reportRefresh));
  return null;
}

export const saveWatermark = (s: Scope, through: Date) => s.update(reportRefresh, { through, refreshedAt: new Date() }, s.filter(reportRefresh));

// ---- what changed since the watermark (business times of the rows written since) -------------------------------

export async function changedInstants(s: Scope, since: Date): Promise<Date[]> {
  const [sharpened, read, checks, events, entries, paid, refunded] = await Promise.all([
    s.findJoined(sharpening, { fields: { at: sharpening.doneAt }, joins: [], where: gte(sharpening.createdAt, since) }),
    s.findJoined(levelReading, {
      fields: { at: sharpening.doneAt },
      joins: [{ table: sharpening, on: eq(sharpening.id, levelReading.sharpeningId) }],
      where: gte(levelReading.takenAt, since),
    }),
    // Check readings belong to no sharpening: they count on their own day, in the drift watch.
    s.findJoined(levelReading, { fields: { at: levelReading.takenAt }, joins: [], where: and(gte(levelReading.takenAt, since), eq(levelReading.kind, 'check')) }),
    s.findJoined(ticketEvent, {
      fields: { at: ticketEvent.at, readyAt: ticket.readyAt },
      joins: [{ table: ticket, on: eq(ticket.id, ticketEvent.ticketId) }],
      where: gte(ticketEvent.at, since),
    }),
    s.findJoined(creditEntry, { fields: { at: creditEntry.createdAt }, joins: [], where: gte(creditEntry.createdAt, since) }),
    s.findJoined(payment, { fields: { at: payment.paidAt }, joins: [], where: gte(payment.paidAt, since) }),
    s.findJoined(refund, { fields: { at: refund.createdAt }, joins: [], where: gte(refund.createdAt, since) }),
  ]);
  const instants: Date[] = [];
  for (const list of [sharpened, read, checks, entries, paid, refunded]) for (const r of list) if (r.at) instants.push(r.at);
  for (const e of events) {
    instants.push(e.at);
    if (e.readyAt) instants.push(e.readyAt);
  }
  return instants;
}

/** The first and last business times of everything the rink has, for a full rebuild. */
export async function dataSpan(s: Scope): Promise<Date[]> {
  const spans = await Promise.all([
    s.findJoined(sharpening, { fields: { a: min(sharpening.doneAt), b: max(sharpening.doneAt) }, joins: [] }),
    s.findJoined(ticket, { fields: { a: min(ticket.readyAt), b: max(ticket.readyAt) }, joins: [], where: isNotNull(ticket.readyAt) }),
    s.findJoined(creditEntry, { fields: { a: min(creditEntry.createdAt), b: max(creditEntry.createdAt) }, joins: [] }),
    s.findJoined(payment, { fields: { a: min(payment.paidAt), b: max(payment.paidAt) }, joins: [] }),
    s.findJoined(refund, { fields: { a: min(refund.createdAt), b: max(refund.createdAt) }, joins: [] }),
  ]);
  return spans.flatMap(([r]) => [r?.a, r?.b]).filter((d): d is Date => d instanceof Date);
}

// ---- raw rows of a range -----------------------------------------------------------------------------------------

export const sharpeningsIn = (s: Scope, r: Range) =>
  s.findJoined(sharpening, {
    fields: { id: sharpening.id, stationId: sharpening.stationId, technicianId: sharpening.technicianId, wheelId: sharpening.wheelId, passes: sharpening.passes, doneAt: sharpening.doneAt, correctsId: sharpening.correctsId },
    joins: [],
    where: inRange(sharpening.doneAt, r),
  });

/** Sharpening readings of the sharpenings done in the range. */
export const readingsIn = (s: Scope, r: Range) =>
  s.findJoined(levelReading, {
    fields: { sharpeningId: levelReading.sharpeningId, blade: levelReading.blade, attempt: levelReading.attempt, readingNm: levelReading.readingNm },
    joins: [{ table: sharpening, on: eq(sharpening.id, levelReading.sharpeningId) }],
    where: and(inRange(sharpening.doneAt, r), eq(levelReading.kind, 'sharpening')),
  });

export const ticketsReadyIn = (s: Scope, r: Range) =>
  s.findJoined(ticket, {
    fields: { stationId: ticket.stationId, droppedAt: ticket.droppedAt, promisedAt: ticket.promisedAt, readyAt: ticket.readyAt },
    joins: [],
    where: inRange(ticket.readyAt, r),
  });

export const paymentsPaidIn = (s: Scope, r: Range) =>
  s.findJoined(payment, {
    fields: { productId: payment.productId, channel: payment.channel, amountMinor: payment.amountMinor, feeMinor: payment.feeMinor, paidAt: payment.paidAt },
    joins: [],
    where: inRange(payment.paidAt, r),
  });

export const refundsIn = (s: Scope, r: Range) =>
  s.findJoined(refund, {
    fields: { productId: payment.productId, channel: payment.channel, amountMinor: refund.amountMinor, createdAt: refund.createdAt },
    joins: [{ table: payment, on: eq(payment.id, refund.paymentId) }],
    where: inRange(refund.createdAt, r),
  });

/** Entries of the range; a reversal carries the kind of the entry it reverses. */
export async function entriesIn(s: Scope, r: Range) {
  const rows = await s.findJoined(creditEntry, {
    fields: { id: creditEntry.id, kind: creditEntry.kind, reversesId: creditEntry.reversesId, credits: creditEntry.credits, valueMinor: creditEntry.valueMinor, createdAt: creditEntry.createdAt, productId: creditLot.productId },
    joins: [{ table: creditLot, on: eq(creditLot.id, creditEntry.lotId) }],
    where: inRange(creditEntry.createdAt, r),
  });
  const reversed = [...new Set(rows.flatMap((e) => (e.kind === 'reversal' && e.reversesId ? [e.reversesId] : [])))];
  const kinds = new Map<string, string>();
  for (let i = 0; i < reversed.length; i += 500) {
    const found = await s.findJoined(creditEntry, { fields: { id: creditEntry.id, kind: creditEntry.kind }, joins: [], where: inArray(creditEntry.id, reversed.slice(i, i + 500)) });
    for (const f of found) kinds.set(f.id, f.kind);
  }
  return rows.map((e) => ({ ...e, kind: e.kind === 'reversal' && e.reversesId ? (kinds.get(e.reversesId) ?? 'reversal') : e.kind }));
}

// ---- summary rows: a range of days is replaced as a whole ----------------------------------------------------------

export type WorkDayRow = Omit<typeof reportWorkDay.$inferInsert, 'tenantId'>;
export type WheelDayRow = Omit<typeof reportWheelDay.$inferInsert, 'tenantId'>;
export type TurnaroundRow = Omit<typeof reportTurnaround.$inferInsert, 'tenantId'>;
export type MoneyDayRow = Omit<typeof reportMoneyDay.$inferInsert, 'tenantId'>;
export type CreditDayRow = Omit<typeof reportCreditDay.$inferInsert, 'tenantId'>;
export type DriftDayRow = Omit<typeof reportDriftDay.$inferInsert, 'tenantId'>;

export async function replaceDays(
  s: Scope,
  days: { first: string; last: string },
  rows: { work: WorkDayRow[]; wheels: WheelDayRow[]; turnaround: TurnaroundRow[]; money: MoneyDayRow[]; credit: CreditDayRow[]; drift: DriftDayRow[] },
): Promise<void> {
  const tables = [
    [reportWorkDay, rows.work],
    [reportWheelDay, rows.wheels],
    [reportTurnaround, rows.turnaround],
    [reportMoneyDay, rows.money],
    [reportCreditDay, rows.credit],
    [reportDriftDay, rows.drift],
  ] as const;
  for (const [table, list] of tables) {
    await s.remove(table, sql`${table.day} >= ${days.first} and ${table.day} <= ${days.last}`);
    for (let i = 0; i < list.length; i += 1000) await s.insert(table, list.slice(i, i + 1000) as never);
  }
}

/** Removes summary rows outside a span of days (all of them without one): a full rebuild leaves nothing stale. */
export async function clearOutside(s: Scope, span: { first: string; last: string } | null): Promise<void> {
  for (const table of [reportWorkDay, reportWheelDay, reportTurnaround, reportMoneyDay, reportCreditDay, reportDriftDay]) {
    await s.remove(table, span ? sql`(${table.day} < ${span.first} or ${table.day} > ${span.last})` : sql`1 = 1`);
  }
}

// ---- reading the summaries --------------------------------------------------------------------------------------------

export interface SummaryFilter {
  from: string;
  to: string;
  stationId?: string | undefined;
  technicianId?: string | undefined;
}

const dayIn = (column: AnyMySqlColumn, f: SummaryFilter) => sql`${column} >= ${f.from} and ${column} <= ${f.to}`;
/**
 * The day rows of a grouping's grain (schema/reports.ts, ROLLUP_KEY): a station (technician) named by the filter, else
 * every station's (technician's) own rows when grouping by it, else their rollup.
 */
const workWhere = (f: SummaryFilter, by: WorkGrouping) => {
  const w = reportWorkDay;
  const grain = (column: AnyMySqlColumn, named: string | undefined, grouped: boolean) => (named ? eq(column, named) : grouped ? ne(column, ROLLUP_KEY) : eq(column, ROLLUP_KEY));
  return and(dayIn(w.day, f), grain(w.stationId, f.stationId, by === 'station'), grain(w.technicianId, f.technicianId, by === 'technician'));
};

const workSums = {
  pairs: sum(reportWorkDay.pairs),
  firstReadings: sum(reportWorkDay.firstReadings),
  firstTrue: sum(reportWorkDay.firstTrue),
  firstFair: sum(reportWorkDay.firstFair),
  firstOff: sum(reportWorkDay.firstOff),
  reruns: sum(reportWorkDay.reruns),
  firstAbsNm: sum(reportWorkDay.firstAbsNm),
};
type WorkSums = { [K in keyof typeof workSums]: number };

export type WorkGrouping = 'all' | 'station' | 'technician' | 'day';

/**
 * Work summed by one grouping, in the database, so a long period never brings its day rows over the wire. Staffed
 * hours are the distinct (day, hour, technician) with a pair, summed from the rows the refresh marked: within one
 * station an hour counts per technician there (`staffedHours` of a station row), across stations once per
 * technician (`staffedAcross`, whose sum over the station rows is the period's). The day grouping also sums the
 * pairs of each local hour, for the weekday-and-hour heat map.
 */
export async function workBy(s: Scope, f: SummaryFilter, by: WorkGrouping) {
  const w = reportWorkDay;
  const keys: Record<string, AnyMySqlColumn> = { all: {}, station: { stationId: w.stationId }, technician: { technicianId: w.technicianId }, day: { day: w.day } }[by];
  const groupBy = { all: [], station: [w.stationId], technician: [w.technicianId], day: [w.day] }[by];
  const hours = by === 'day' ? Object.fromEntries(HOURS.map((h) => [hourKey(h), sum(w[hourKey(h)])])) : {};
  const rows = await s.findJoined(w, {
    fields: {
      ...keys,
      ...workSums,
      staffedHours: by === 'station' || f.stationId ? sum(w.staffedStation) : sum(w.staffedTotal),
      staffedAcross: f.stationId ? sum(w.staffedStation) : sum(w.staffedTotal),
      ...hours,
    },
    joins: [],
    where: workWhere(f, by),
    groupBy,
  });
  return rows.map((r) => {
    const row = r as Record<string, unknown>;
    return {
      stationId: (row.stationId as string | undefined) ?? '',
      technicianId: (row.technicianId as string | undefined) ?? '',
      day: (row.day as string | undefined) ?? '',
      staffedHours: n(row.staffedHours),
      staffedAcross: n(row.staffedAcross),
      pairsByHour: by === 'day' ? HOURS.map((h) => n(row[hourKey(h)])) : [],
      ...(Object.fromEntries(Object.keys(workSums).map((k) => [k, n(row[k])])) as WorkSums),
    };
  });
}

/** Pairs and passes of each wheel per local day (a wheel's life, and the passes before each of its dressings). */
export async function wheelDays(s: Scope, wheelIds: string[]) {
  if (wheelIds.length === 0) return [];
  return s.findJoined(reportWheelDay, {
    fields: { wheelId: reportWheelDay.wheelId, day: reportWheelDay.day, pairs: reportWheelDay.pairs, passes: reportWheelDay.passes },
    joins: [],
    where: inArray(reportWheelDay.wheelId, wheelIds),
    orderBy: asc(reportWheelDay.day),
  });
}

export async function turnaroundRows(s: Scope, f: SummaryFilter) {
  const rows = await s.findJoined(reportTurnaround, {
    fields: { day: reportTurnaround.day, bucket: reportTurnaround.bucket, tickets: sum(reportTurnaround.tickets), onTime: sum(reportTurnaround.onTime) },
    joins: [],
    where: and(dayIn(reportTurnaround.day, f), f.stationId ? eq(reportTurnaround.stationId, f.stationId) : undefined),
    groupBy: [reportTurnaround.day, reportTurnaround.bucket],
  });
  return rows.map((r) => ({ day: r.day, bucket: r.bucket, tickets: n(r.tickets), onTime: n(r.onTime) }));
}

export async function moneyRows(s: Scope, f: SummaryFilter) {
  const rows = await s.findJoined(reportMoneyDay, {
    fields: {
      day: reportMoneyDay.day,
      productId: reportMoneyDay.productId,
      channel: reportMoneyDay.channel,
      sales: sum(reportMoneyDay.sales),
      salesMinor: sum(reportMoneyDay.salesMinor),
      feesMinor: sum(reportMoneyDay.feesMinor),
      refunds: sum(reportMoneyDay.refunds),
      refundsMinor: sum(reportMoneyDay.refundsMinor),
    },
    joins: [],
    where: dayIn(reportMoneyDay.day, f),
    groupBy: [reportMoneyDay.day, reportMoneyDay.productId, reportMoneyDay.channel],
  });
  return rows.map((r) => ({ day: r.day, productId: r.productId, channel: r.channel, sales: n(r.sales), salesMinor: n(r.salesMinor), feesMinor: n(r.feesMinor), refunds: n(r.refunds), refundsMinor: n(r.refundsMinor) }));
}

export async function creditRows(s: Scope, f: SummaryFilter) {
  const rows = await s.findJoined(reportCreditDay, {
    fields: { day: reportCreditDay.day, kind: reportCreditDay.kind, credits: sum(reportCreditDay.credits), valueMinor: sum(reportCreditDay.valueMinor) },
    joins: [],
    where: dayIn(reportCreditDay.day, f),
    groupBy: [reportCreditDay.day, reportCreditDay.kind],
  });
  return rows.map((r) => ({ day: r.day, kind: r.kind, credits: n(r.credits), valueMinor: n(r.valueMinor) }));
}

export async function driftRows(s: Scope, f: SummaryFilter) {
  const rows = await s.findJoined(reportDriftDay, {
    fields: { stationId: reportDriftDay.stationId, raised: sum(reportDriftDay.raised), cleared: sum(reportDriftDay.cleared) },
    joins: [],
    where: and(dayIn(reportDriftDay.day, f), f.stationId ? eq(reportDriftDay.stationId, f.stationId) : undefined),
    groupBy: [reportDriftDay.stationId],
  });
  return new Map(rows.map((r) => [r.stationId, { raised: n(r.raised), cleared: n(r.cleared) }]));
}

/** Stations with readings of the drift watch's series in a range. */
export const stationsWithSeriesIn = async (s: Scope, r: Range) =>
  (await s.findJoined(levelReading, { fields: { stationId: levelReading.stationId }, joins: [], where: inRange(levelReading.takenAt, r), groupBy: [levelReading.stationId] })).map((x) => x.stationId);

/** Σ of every entry up to and including a day: the credits outstanding then and their value. */
export async function outstandingThrough(s: Scope, day: string) {
  const [row] = await s.findJoined(reportCreditDay, { fields: { credits: sum(reportCreditDay.credits), valueMinor: sum(reportCreditDay.valueMinor) }, joins: [], where: sql`${reportCreditDay.day} <= ${day}` });
  return { credits: n(row?.credits), valueMinor: n(row?.valueMinor) };
}

// ---- small tables read directly (a rink has few of these rows) ---------------------------------------------------------

export const stationsOf = (s: Scope) => s.find(station, { orderBy: asc(station.name) });
export const productsOf = (s: Scope) => s.findJoined(product, { fields: { id: product.id, name: product.name, kind: product.kind }, joins: [], orderBy: asc(product.name) });
export const techniciansOf = (s: Scope) =>
  s.findJoined(member, { fields: { id: user.id, name: user.name, role: member.role }, joins: [{ table: user, on: eq(user.id, member.userId) }], orderBy: asc(user.name) });

// ---- leveling effects (report_leveling) -------------------------------------------------------------------------------

export type LevelingRow = Omit<typeof reportLeveling.$inferInsert, 'tenantId'>;

/** How many adjustments the rink has, and how many have their effect stored: equal means none is missing. */
export async function levelingCounts(s: Scope): Promise<{ adjustments: number; measured: number }> {
  const [adjustments, measured] = await Promise.all([s.count(levelingAdjustment), s.count(reportLeveling)]);
  return { adjustments, measured };
}

export const allAdjustments = (s: Scope) =>
  s.findJoined(levelingAdjustment, {
    fields: { id: levelingAdjustment.id, stationId: levelingAdjustment.stationId, at: levelingAdjustment.at, amountMilli: levelingAdjustment.amountMilli },
    joins: [],
  });

export const measuredWindows = (s: Scope) =>
  s.findJoined(reportLeveling, { fields: { adjustmentId: reportLeveling.adjustmentId, windowFrom: reportLeveling.windowFrom, windowTo: reportLeveling.windowTo }, joins: [] });

export async function replaceLeveling(s: Scope, rows: LevelingRow[]): Promise<void> {
  for (let i = 0; i < rows.length; i += 1000) {
    const part = rows.slice(i, i + 1000);
    await s.remove(reportLeveling, inArray(reportLeveling.adjustmentId, part.map((r) => r.adjustmentId)));
    await s.insert(reportLeveling, part);
  }
}

/** The stored effects of the adjustments in a range, oldest first. */
export const levelingIn = (s: Scope, r: Range, stationId?: string) =>
  s.find(reportLeveling, { where: and(inRange(reportLeveling.at, r), stationId ? eq(reportLeveling.stationId, stationId) : undefined), orderBy: asc(reportLeveling.at) });

/** The drift watch's series of a station (check readings and first readings): those in the range, oldest first. */
export const seriesIn = (s: Scope, stationId: string, r: Range) =>
  s.findJoined(levelReading, {
    fields: { takenAt: levelReading.takenAt, readingNm: levelReading.readingNm },
    joins: [],
    where: and(eq(levelReading.stationId, stationId), inRange(levelReading.takenAt, r), sql`(${levelReading.kind} = 'check' or ${levelReading.attempt} = 1)`),
    orderBy: asc(levelReading.takenAt),
  });

/** The same series' last `limit` values before a moment, newest first. */
export const seriesBefore = (s: Scope, stationId: string, at: Date, limit: number) =>
  s.findJoined(levelReading, {
    fields: { takenAt: levelReading.takenAt, readingNm: levelReading.readingNm },
    joins: [],
    where: and(eq(levelReading.stationId, stationId), lt(levelReading.takenAt, at), sql`(${levelReading.kind} = 'check' or ${levelReading.attempt} = 1)`),
    orderBy: sql`${levelReading.takenAt} desc`,
    limit,
  });

/**
 * The first readings that show an adjustment's effect (`effectWindows` in @rinkwright/core says which): before it, the
 * last `limit` after the previous adjustment (newest first); after it, the first `limit` before the next one (oldest
 * first). `neighbour` is that previous or next adjustment's time, when there is one.
 */
export const effectReadings = (s: Scope, stationId: string, at: Date, side: 'before' | 'after', neighbour: Date | undefined, limit: number) =>
  s.findJoined(levelReading, {
    fields: { readingNm: levelReading.readingNm, takenAt: levelReading.takenAt },
    joins: [],
    where: and(
      eq(levelReading.stationId, stationId),
      sql`(${levelReading.kind} = 'check' or ${levelReading.attempt} = 1)`,
      side === 'before' ? lt(levelReading.takenAt, at) : gt(levelReading.takenAt, at),
      neighbour ? (side === 'before' ? gt(levelReading.takenAt, neighbour) : lt(levelReading.takenAt, neighbour)) : undefined,
    ),
    orderBy: side === 'before' ? sql`${levelReading.takenAt} desc` : asc(levelReading.takenAt),
    limit,
  });

/** Wheels in use at some time in the range (mounted before its end, not removed before its start). */
export const wheelsIn = (s: Scope, r: Range) =>
  s.find(wheel, { where: and(lt(wheel.mountedAt, r.end), sql`(${wheel.removedAt} is null or ${wheel.removedAt} >= ${r.start})`), orderBy: asc(wheel.mountedAt) });

/** The dressings of these wheels that measured the diameter, oldest first: the points of a wheel's wear. */
export const measuredDressingsOf = (s: Scope, wheelIds: string[]) =>
  wheelIds.length === 0
    ? Promise.resolve([])
    : s.findJoined(wheelEvent, {
        fields: { wheelId: wheelEvent.wheelId, at: wheelEvent.at, diameterNm: wheelEvent.diameterNm },
        joins: [],
        where: and(inArray(wheelEvent.wheelId, wheelIds), eq(wheelEvent.kind, 'dressing'), isNotNull(wheelEvent.diameterNm)),
        orderBy: asc(wheelEvent.at),
      });

/** Every membership with its product's billing interval and current price (a rink has few). */
export const membershipsWithPrice = (s: Scope) =>
  s.findJoined(membership, {
    fields: { state: membership.state, createdAt: membership.createdAt, updatedAt: membership.updatedAt, interval: product.interval, amountMinor: productPrice.amountMinor },
    joins: [
      { table: product, on: eq(product.id, membership.productId) },
      { table: productPrice, on: and(eq(productPrice.productId, product.id), isNull(productPrice.retiredAt)) as SQL },
    ],
  });

export const teamsOf = (s: Scope, leagueIds: string[]) => (leagueIds.length === 0 ? Promise.resolve([]) : s.find(leagueTeam, { where: inArray(leagueTeam.leagueId, leagueIds) }));

export const leaguesOf = (s: Scope, managerUserId?: string) =>
  s.find(league, { where: managerUserId ? eq(league.managerUserId, managerUserId) : undefined, orderBy: asc(league.name) });

