import { stringify } from 'csv-stringify/sync';
import {
  reportColumns,
  TURNAROUND_BUCKET_MINUTES,
  TURNAROUND_LAST_BUCKET,
  wheelWear,
  type LeagueReport,
  type MoneyReport,
  type QualityReport,
  type ReportName,
  type ReportQuery,
  type ThroughputReport,
} from '@rinkwright/core';
import { reportScope, scoped, type Scope } from '@rinkwright/db';
import { AppError } from '../../http/errors';
import { firstIndex, groupBy, runningTotals } from '../../lib/sorted';
import type { RinkContext } from '../../http/route';
import { localClock, nextDay } from './local-time';
import { refreshReports } from './refresh';
import * as repo from './repository';
import * as ledger from '../../lib/ledger/ledger';

// The four reports of a rink, from its summary tables (read on the reports database). A report first brings
// the summaries up to date, so what it shows includes the last write.

type Period = { from: string; to: string };
type Filters = Pick<ReportQuery, 'stationId' | 'technicianId'>;

const ratio = (part: number, whole: number) => (whole > 0 ? part / whole : null);
const round2 = (v: number | null) => (v === null ? null : Math.round(v * 100) / 100);

/** Minutes within which a share p of the tickets were ready, read off the histogram to the bucket's upper end. */
function histogramPercentile(buckets: { bucket: number; tickets: number }[], p: number): number | null {
  const total = buckets.reduce((n, b) => n + b.tickets, 0);
  if (total === 0) return null;
  const sorted = [...buckets].sort((a, b) => a.bucket - b.bucket);
  const rank = Math.ceil(p * total);
  let seen = 0;
  for (const b of sorted) {
    seen += b.tickets;
    if (seen >= rank) return Math.min(b.bucket + 1, TURNAROUND_LAST_BUCKET) * TURNAROUND_BUCKET_MINUTES;
  }
  return null;
}

/** The period's figures from its work (pairs, staffed hours) and its tickets made ready, by turnaround bucket. */
function throughputTotals(work: { pairs: number; staffedAcross: number }, turnaround: { bucket: number; tickets: number; onTime: number }[]) {
  const { pairs, staffedAcross: hours } = work;
  const ready = turnaround.reduce((n, r) => n + r.tickets, 0);
  const onTime = turnaround.reduce((n, r) => n + r.onTime, 0);
  const byBucket = new Map<number, number>();
  for (const r of turnaround) byBucket.set(r.bucket, (byBucket.get(r.bucket) ?? 0) + r.tickets);
  const buckets = [...byBucket].map(([bucket, tickets]) => ({ bucket, tickets }));
  return {
    pairs,
    staffedHours: hours,
    pairsPerStaffedHour: round2(ratio(pairs, hours)),
    ticketsReady: ready,
    medianTurnaroundMinutes: histogramPercentile(buckets, 0.5),
    p90TurnaroundMinutes: histogramPercentile(buckets, 0.9),
    promisedHitRate: ratio(onTime, ready),
  };
}

async function comparedThroughput(s: Scope, period: Period, filters: Filters) {
  const f = { from: period.from, to: period.to, stationId: filters.stationId, technicianId: filters.technicianId };
  const [[work], turnaround] = await Promise.all([repo.workBy(s, f, 'all'), repo.turnaroundRows(s, f)]);
  return throughputTotals(work ?? { pairs: 0, staffedAcross: 0 }, turnaround);
}

/** ISO weekday (1 = Monday) of a local day written YYYY-MM-DD. */
const isoWeekday = (day: string) => ((new Date(`${day}T00:00:00Z`).getUTCDay() + 6) % 7) + 1;

const perHour = (r: { pairs: number; staffedHours: number }) => ({ pairs: r.pairs, staffedHours: r.staffedHours, pairsPerStaffedHour: round2(ratio(r.pairs, r.staffedHours)) });

export async function throughput(s: Scope, q: ReportQuery): Promise<ThroughputReport> {
  const f = { from: q.from, to: q.to, stationId: q.stationId, technicianId: q.technicianId };
  // Three groupings of the day rows: the period's totals are the stations' sums, the heat map the days'.
  const [turnaround, compare, stations, people, byStation, byTechnician, byDay] = await Promise.all([
    repo.turnaroundRows(s, f),
    q.compareFrom && q.compareTo ? comparedThroughput(s, { from: q.compareFrom, to: q.compareTo }, q) : null,
    repo.stationsOf(s),
    repo.techniciansOf(s),
    repo.workBy(s, f, 'station'),
    repo.workBy(s, f, 'technician'),
    repo.workBy(s, f, 'day'),
  ]);
  const totals = throughputTotals({ pairs: byStation.reduce((n, r) => n + r.pairs, 0), staffedAcross: byStation.reduce((n, r) => n + r.staffedAcross, 0) }, turnaround);
  const stationName = new Map(stations.map((st) => [st.id, st.name]));
  const personName = new Map(people.map((p) => [p.id, p.name]));
  const days = new Map<string, { pairs: number; ticketsReady: number; onTime: number }>();
  for (let d = q.from; d <= q.to; d = nextDay(d)) days.set(d, { pairs: 0, ticketsReady: 0, onTime: 0 });
  const heat = new Map<string, { weekday: number; hour: number; pairs: number }>();
  for (const r of byDay) {
    days.get(r.day)!.pairs += r.pairs;
    const weekday = isoWeekday(r.day);
    r.pairsByHour.forEach((pairs, hour) => {
      if (pairs === 0) return;
      const cell = heat.get(`${weekday}|${hour}`) ?? { weekday, hour, pairs: 0 };
      cell.pairs += pairs;
      heat.set(`${weekday}|${hour}`, cell);
    });
  }
  for (const r of turnaround) {
    const day = days.get(r.day)!;
    day.ticketsReady += r.tickets;
    day.onTime += r.onTime;
  }
  return {
    period: { from: q.from, to: q.to },
    totals,
    compare: compare && q.compareFrom && q.compareTo ? { period: { from: q.compareFrom, to: q.compareTo }, totals: compare } : null,
    tables: {
      byDay: [...days].map(([day, v]) => ({ day, ...v })),
      byStation: byStation.map((r) => ({ stationId: r.stationId, station: stationName.get(r.stationId) ?? 'Removed station', ...perHour(r) })).sort((a, b) => a.station.localeCompare(b.station)),
      byTechnician: byTechnician
        .map((r) => ({ technicianId: r.technicianId, technician: personName.get(r.technicianId) ?? 'Former staff', ...perHour(r) }))
        .sort((a, b) => a.technician.localeCompare(b.technician)),
      byHour: [...heat.values()].sort((a, b) => a.weekday - b.weekday || a.hour - b.hour),
    },
  };
}

function qualityOf(rows: { firstReadings: number; firstTrue: number; firstFair: number; firstOff: number; reruns: number; firstAbsNm: number }[]) {
  const t = rows.reduce((a, r) => ({ firstReadings: a.firstReadings + r.firstReadings, firstTrue: a.firstTrue + r.firstTrue, firstFair: a.firstFair + r.firstFair, firstOff: a.firstOff + r.firstOff, reruns: a.reruns + r.reruns, firstAbsNm: a.firstAbsNm + r.firstAbsNm }), {
    firstReadings: 0,
    firstTrue: 0,
    firstFair: 0,
    firstOff: 0,
    reruns: 0,
    firstAbsNm: 0,
  });
  return {
    firstReadings: t.firstReadings,
    trueShare: ratio(t.firstTrue, t.firstReadings),
    fairShare: ratio(t.firstFair, t.firstReadings),
    offShare: ratio(t.firstOff, t.firstReadings),
    reRunRate: ratio(t.reruns, t.firstReadings),
    meanAbsReadingNm: t.firstReadings > 0 ? Math.round(t.firstAbsNm / t.firstReadings) : null,
  };
}

const meanOf = (sum: number, count: number) => (count > 0 ? Math.round(sum / count) : null);

export async function quality(s: Scope, q: ReportQuery, zone: string): Promise<QualityReport> {
  const clock = localClock(zone);
  const range = { start: clock.startOf(q.from), end: clock.startOf(nextDay(q.to)) };
  // The wheel table reads in two steps; every table's reads run at once.
  const wear = repo.wheelsIn(s, range).then(async (all) => {
    const wheels = all.filter((w) => !q.stationId || w.stationId === q.stationId);
    const [usage, dressings] = await Promise.all([repo.wheelDays(s, wheels.map((w) => w.id)), repo.measuredDressingsOf(s, wheels.map((w) => w.id))]);
    return { wheels, usage, dressings };
  });
  const [work, compareWork, stations, drift, leveled, { wheels, usage, dressings }] = await Promise.all([
    repo.workBy(s, { from: q.from, to: q.to, stationId: q.stationId, technicianId: q.technicianId }, 'station'),
    q.compareFrom && q.compareTo ? repo.workBy(s, { from: q.compareFrom, to: q.compareTo, stationId: q.stationId, technicianId: q.technicianId }, 'all') : null,
    repo.stationsOf(s),
    repo.driftRows(s, { from: q.from, to: q.to, stationId: q.stationId }),
    repo.levelingIn(s, range, q.stationId),
    wear,
  ]);
  const shown = stations.filter((st) => !q.stationId || st.id === q.stationId);
  const byStation = [];
  for (const st of shown) {
    const rows = work.filter((r) => r.stationId === st.id);
    const alerts = drift.get(st.id) ?? { raised: 0, cleared: 0 };
    if (rows.length === 0 && alerts.raised === 0 && alerts.cleared === 0) continue;
    byStation.push({ stationId: st.id, station: st.name, ...qualityOf(rows), driftAlertsRaised: alerts.raised, driftAlertsCleared: alerts.cleared });
  }
  const leveling = leveled.map((a) => {
    const st = stations.find((x) => x.id === a.stationId);
    return {
      stationId: a.stationId,
      station: st?.name ?? 'Removed station',
      at: a.at.toISOString(),
      amountMilli: a.amountMilli,
      unit: st?.adjustUnit ?? 'turns',
      meanBeforeNm: meanOf(a.beforeSumNm, a.beforeReadings),
      meanAfterNm: meanOf(a.afterSumNm, a.afterReadings),
    };
  });
  const daysOf = groupBy(usage, (u) => u.wheelId);
  const dressingsOf = groupBy(dressings, (d) => d.wheelId);
  const wheelRows = wheels.map((w) => {
    const days = daysOf.get(w.id) ?? [];
    // Passes before each measured diameter, to the day (the summaries count passes per local day): the sum of the
    // days before the dressing's own, from running totals of the days in order.
    const through = runningTotals(days.map((d) => d.passes));
    const passesBefore = (at: Date) => {
      const day = clock.of(at).day;
      return through[firstIndex(days, (d) => d.day >= day)] ?? 0;
    };
    const points = [{ passes: 0, diameterNm: w.diameterNewNm, at: w.mountedAt }, ...(dressingsOf.get(w.id) ?? []).map((e) => ({ passes: passesBefore(e.at), diameterNm: e.diameterNm!, at: e.at }))];
    const wear = wheelWear({ points, minDiameterNm: w.minDiameterNm, now: range.end });
    return {
      wheelId: w.id,
      wheel: w.label,
      station: stations.find((x) => x.id === w.stationId)?.name ?? 'Removed station',
      mountedAt: w.mountedAt.toISOString(),
      removedAt: w.removedAt?.toISOString() ?? null,
      pairs: days.reduce((n, d) => n + d.pairs, 0),
      passes: through[days.length] ?? 0,
      predictedPasses: wear.lastPasses !== null && wear.passesLeft !== null ? wear.lastPasses + wear.passesLeft : null,
    };
  });
  return {
    period: { from: q.from, to: q.to },
    totals: qualityOf(work),
    compare: compareWork && q.compareFrom && q.compareTo ? { period: { from: q.compareFrom, to: q.compareTo }, totals: qualityOf(compareWork) } : null,
    tables: { byStation, leveling, wheels: wheelRows },
  };
}

async function moneyTotals(s: Scope, period: Period, currency: string) {
  const [money, credits] = await Promise.all([repo.moneyRows(s, period), repo.creditRows(s, period)]);
  const credit = (kind: string) => credits.filter((c) => c.kind === kind);
  return {
    money,
    credits,
    totals: {
      currency,
      sales: money.reduce((n, r) => n + r.sales, 0),
      salesMinor: money.reduce((n, r) => n + r.salesMinor, 0),
      refundsMinor: money.reduce((n, r) => n + r.refundsMinor, 0),
      feesMinor: money.reduce((n, r) => n + r.feesMinor, 0),
      // Redemptions and expiries are negative entries; a reversal of one counts back against it.
      redemptions: -credit('redeem').reduce((n, c) => n + c.credits, 0),
      redemptionValueMinor: -credit('redeem').reduce((n, c) => n + c.valueMinor, 0),
      breakageCredits: -credit('expire').reduce((n, c) => n + c.credits, 0),
      breakageMinor: -credit('expire').reduce((n, c) => n + c.valueMinor, 0),
    },
  };
}

/** Monthly recurring value of a membership price: a yearly price counts a twelfth (rounded to the minor unit). */
const monthly = (amountMinor: number, interval: string | null) => (interval === 'year' ? Math.round(amountMinor / 12) : amountMinor);

export async function money(s: Scope, q: ReportQuery, zone: string, currency: string): Promise<MoneyReport> {
  const clock = localClock(zone);
  const start = clock.startOf(q.from);
  const end = clock.startOf(nextDay(q.to));
  const [current, compare, products, outstanding, memberships] = await Promise.all([
    moneyTotals(s, q, currency),
    q.compareFrom && q.compareTo ? moneyTotals(s, { from: q.compareFrom, to: q.compareTo }, currency) : null,
    repo.productsOf(s),
    repo.outstandingThrough(s, q.to),
    repo.membershipsWithPrice(s),
  ]);
  // A canceled membership's last change is its cancellation.
  const canceledAt = (m: (typeof memberships)[number]) => (m.state === 'canceled' ? m.updatedAt : null);
  const liveAt = (m: (typeof memberships)[number], at: Date) => m.state !== 'incomplete' && m.createdAt < at && !(canceledAt(m) && canceledAt(m)! <= at);
  const activeAtEnd = memberships.filter((m) => liveAt(m, end));
  const activeAtStart = memberships.filter((m) => liveAt(m, start)).length;
  const canceledInPeriod = memberships.filter((m) => {
    const at = canceledAt(m);
    return at !== null && at >= start && at < end;
  }).length;
  const names = new Map(products.map((p) => [p.id, p.name]));
  const byProduct = new Map<string, MoneyReport['tables']['byProduct'][number]>();
  for (const r of current.money) {
    const k = `${r.productId}|${r.channel}`;
    const row = byProduct.get(k) ?? { productId: r.productId, product: names.get(r.productId) ?? 'Removed product', channel: r.channel, sales: 0, salesMinor: 0, refunds: 0, refundsMinor: 0, feesMinor: 0 };
    row.sales += r.sales;
    row.salesMinor += r.salesMinor;
    row.refunds += r.refunds;
    row.refundsMinor += r.refundsMinor;
    row.feesMinor += r.feesMinor;
    byProduct.set(k, row);
  }
  const days = new Map<string, { salesMinor: number; refundsMinor: number; redemptions: number; breakageCredits: number }>();
  for (let d = q.from; d <= q.to; d = nextDay(d)) days.set(d, { salesMinor: 0, refundsMinor: 0, redemptions: 0, breakageCredits: 0 });
  for (const r of current.money) {
    days.get(r.day)!.salesMinor += r.salesMinor;
    days.get(r.day)!.refundsMinor += r.refundsMinor;
  }
  for (const c of current.credits) {
    if (c.kind === 'redeem') days.get(c.day)!.redemptions -= c.credits;
    if (c.kind === 'expire') days.get(c.day)!.breakageCredits -= c.credits;
  }
  return {
    period: { from: q.from, to: q.to },
    totals: current.totals,
    compare: compare && q.compareFrom && q.compareTo ? { period: { from: q.compareFrom, to: q.compareTo }, totals: compare.totals } : null,
    outstanding,
    memberships: {
      active: activeAtEnd.length,
      monthlyRecurringMinor: activeAtEnd.reduce((n, m) => n + monthly(m.amountMinor, m.interval), 0),
      canceledInPeriod,
      churnRate: ratio(canceledInPeriod, activeAtStart),
    },
    tables: {
      byProduct: [...byProduct.values()].sort((a, b) => a.product.localeCompare(b.product) || a.channel.localeCompare(b.channel)),
      byDay: [...days].map(([day, v]) => ({ day, ...v })),
    },
  };
}

export async function leagues(s: Scope, q: ReportQuery, zone: string, managerUserId?: string): Promise<LeagueReport> {
  const clock = localClock(zone);
  const range = { start: clock.startOf(q.from), end: clock.startOf(nextDay(q.to)) };
  const list = await repo.leaguesOf(s, managerUserId);
  const ids = list.map((l) => l.id);
  const [teams, usage] = await Promise.all([repo.teamsOf(s, ids), ledger.teamUsage(s, ids, range)]);
  const name = new Map(list.map((l) => [l.id, l.name]));
  const rows = teams.map((t) => {
    const u = usage.get(t.id);
    return { leagueId: t.leagueId, league: name.get(t.leagueId) ?? '', teamId: t.id, team: t.name, allocated: u?.allocated ?? 0, usedInPeriod: u?.usedInRange ?? 0, used: u?.used ?? 0, remaining: u?.remaining ?? 0 };
  });
  return {
    period: { from: q.from, to: q.to },
    tables: { teams: rows.sort((a, b) => a.league.localeCompare(b.league) || a.team.localeCompare(b.team)) },
  };
}

// ---- the rink's routes ----------------------------------------------------------------------------------------

// The rink's own row comes from the primary: a replica a moment behind must not make a new rink unknown.
async function rinkOf(tenantId: string) {
  const rink = await scoped(tenantId).rink();
  if (!rink) throw AppError.notFound('No such rink');
  return rink;
}

/** The filters' choices and the rink's today (its own time zone), for the report screens. */
export async function reportOptions(tenantId: string) {
  const s = reportScope(tenantId);
  const rink = await rinkOf(tenantId);
  const [stations, people] = await Promise.all([repo.stationsOf(s), repo.techniciansOf(s)]);
  return {
    timeZone: rink.timeZone,
    currency: rink.currency,
    today: localClock(rink.timeZone).of(new Date()).day,
    stations: stations.map((st) => ({ id: st.id, name: st.name })),
    technicians: people.filter((p) => p.role !== 'league_manager').map((p) => ({ id: p.id, name: p.name })),
  };
}

/** One report of one rink, its summaries refreshed first. League usage can be narrowed to one manager's leagues. */
export async function reportOf(tenantId: string, report: ReportName, q: ReportQuery, leagueManagerId?: string) {
  await refreshReports(tenantId);
  const rink = await rinkOf(tenantId);
  const s = reportScope(tenantId);
  if (report === 'throughput') return throughput(s, q);
  if (report === 'quality') return quality(s, q, rink.timeZone);
  if (report === 'money') return money(s, q, rink.timeZone, rink.currency);
  return leagues(s, q, rink.timeZone, leagueManagerId);
}

/** A league manager sees only the league report, and only their leagues; everyone else with report access sees all. */
export function rinkReport(ctx: RinkContext, report: ReportName, q: ReportQuery) {
  if (report !== 'leagues' && ctx.role === 'league_manager') throw AppError.notFound('No such report');
  return reportOf(ctx.tenantId, report, q, ctx.role === 'league_manager' ? ctx.userId : undefined);
}

/** A report's table as CSV, for the rink's staff or the platform admin. */
export async function reportCsv(tenantId: string, report: ReportName, table: string, answer: { tables: Record<string, Record<string, unknown>[]> }) {
  const rink = await rinkOf(tenantId);
  return tableCsv(report, table, answer, { currency: rink.currency, unitPreference: rink.unitPreference });
}

const NM_PER_THOU = 25_400;
const NM_PER_HUNDREDTH_MM = 10_000;

/**
 * One table of a report as CSV, with the screen's column labels as its header row. Money is written in the
 * currency's major unit and readings in the rink's unit, so a spreadsheet shows what the screen shows.
 */
function tableCsv(report: ReportName, table: string, answer: { tables: Record<string, Record<string, unknown>[]> }, rink: { currency: string; unitPreference: 'in' | 'mm' }): string {
  const columns = reportColumns(report, table);
  const rows = answer.tables[table];
  if (!columns || !rows) throw AppError.notFound('No such table in this report');
  const digits = new Intl.NumberFormat('en', { style: 'currency', currency: rink.currency }).resolvedOptions().maximumFractionDigits ?? 2;
  const cell = (format: string, value: unknown) => {
    if (typeof value !== 'number') return value ?? '';
    if (format === 'share') return value.toFixed(4);
    if (format === 'minor') return (value / 10 ** digits).toFixed(digits);
    // Readings as the screens show them: thousandths of an inch, or hundredths of a millimetre.
    if (format === 'nm') return rink.unitPreference === 'in' ? (value / NM_PER_THOU).toFixed(2) : (value / NM_PER_HUNDREDTH_MM).toFixed(2);
    return value;
  };
  const label = (c: { label: string; format: string }) => (c.format === 'minor' ? `${c.label} (${rink.currency})` : c.format === 'nm' ? `${c.label} (${rink.unitPreference === 'in' ? 'thou' : 'hundredths mm'})` : c.label);
  return stringify(
    rows.map((r) => columns.map((c) => cell(c.format, r[c.key]))),
    { header: true, columns: columns.map(label) },
  );
}
