import { bandsFor, classifyLevel, DRIFT_DEFAULTS, EFFECT_READINGS, TURNAROUND_BUCKET_MINUTES, TURNAROUND_LAST_BUCKET, type LevelBands } from '@rinkwright/core';
import { hourKey, scoped, type Scope } from '@rinkwright/db';
import { readDeskSettings } from '../../lib/desk-settings';
import { groupBy } from '../../lib/sorted';
import { driftAlertOf, DRIFT_WINDOW } from '../../lib/drift';
import { consecutiveRuns, localClock, nextDay, type LocalClock } from './local-time';
import * as repo from './repository';
import { withRollups } from './rollup';

// Keeps a rink's summary tables current. Rows written since the rink's watermark name the local days they
// belong to (a sharpening's day, a ticket's ready day, a payment's paid day, an entry's day); each such day is
// recomputed whole from the raw rows and replaced, so a refresh can run any number of times and the result
// is the same. The report routes refresh before they read, and the worker refreshes every rink as it goes.


/**
 * How far before the watermark a refresh looks again: a row stamped just before the last refresh whose
 * transaction committed just after it is still found. Kept short, because every refresh in that window
 * recomputes the days it names; the daily sweep looks back two days for anything later still.
 */
export const OVERLAP_MS = 10_000;

export interface RefreshResult {
  days: number;
  full: boolean;
}

/** Brings the rink's summaries up to now. `full` recomputes every day the rink has data for. */
export async function refreshReports(tenantId: string, options: { full?: boolean; since?: Date } = {}): Promise<RefreshResult> {
  return scoped(tenantId).transaction(async (s) => {
    const through = await repo.lockWatermark(s);
    // Taken after the lock: everything written before this moment is in the summaries when the refresh ends.
    const now = new Date();
    const rink = await s.rink();
    const clock = localClock(rink?.timeZone ?? 'UTC');
    const full = options.full === true || through === null || through.getTime() === 0;
    let runs: { first: string; last: string }[];
    if (full) {
      const span = (await repo.dataSpan(s)).map((d) => clock.of(d).day).sort();
      const first = span[0];
      const last = span[span.length - 1];
      runs = first && last ? [{ first, last }] : [];
    } else {
      const since = options.since && options.since < through ? options.since : new Date(through.getTime() - OVERLAP_MS);
      const changed = await repo.changedInstants(s, since);
      runs = consecutiveRuns(changed.map((d) => clock.of(d).day));
    }
    let days = 0;
    // Nothing new (most refreshes): the settings and stations a rebuild needs are not even read.
    if (runs.length > 0) {
      const settings = await readDeskSettings(tenantId);
      const drift = (values: number[]) => driftAlertOf(values, settings);
      const stations = new Map((await repo.stationsOf(s)).map((st) => [st.id, bandsFor({ rink: settings, station: st, precision: st.precision })]));
      const bandsOf = (stationId: string) => stations.get(stationId) ?? bandsFor({ rink: settings, station: null, precision: false });
      for (const run of runs) days += await rebuildDays(s, clock, run, bandsOf, drift);
    }
    // A full rebuild also clears summaries of days that no longer have any data.
    if (full) await repo.clearOutside(s, runs[0] ?? null);
    await measureLeveling(s, full ? 'all' : runs.map((run) => ({ start: clock.startOf(run.first), end: clock.startOf(nextDay(run.last)) })));
    await repo.saveWatermark(s, now);
    return { days, full };
  });
}

const key = (...parts: (string | number | null)[]) => parts.map((p) => p ?? '').join('|');

async function rebuildDays(s: Scope, clock: LocalClock, run: { first: string; last: string }, bandsOf: (stationId: string) => LevelBands, drift: (values: number[]) => boolean): Promise<number> {
  const range = { start: clock.startOf(run.first), end: clock.startOf(nextDay(run.last)) };
  const [sharpenings, readings, tickets, paid, refunds, entries] = await Promise.all([
    repo.sharpeningsIn(s, range),
    repo.readingsIn(s, range),
    repo.ticketsReadyIn(s, range),
    repo.paymentsPaidIn(s, range),
    repo.refundsIn(s, range),
    repo.entriesIn(s, range),
  ]);

  const corrected = new Set(sharpenings.flatMap((sh) => (sh.correctsId ? [sh.correctsId] : [])));
  const work = new Map<string, repo.WorkDayRow>();
  const wheels = new Map<string, repo.WheelDayRow>();
  const workOf = new Map<string, repo.WorkDayRow>();
  // Each staffed hour counts once: once per technician, and once per technician at a station.
  const staffedBy = new Set<string>();
  const staffedAt = new Set<string>();
  for (const sh of sharpenings) {
    const { day, hour } = clock.of(sh.doneAt);
    const k = key(day, sh.stationId, sh.technicianId);
    let row = work.get(k);
    if (!row) {
      row = { day, stationId: sh.stationId, technicianId: sh.technicianId, pairs: 0, firstReadings: 0, firstTrue: 0, firstFair: 0, firstOff: 0, reruns: 0, firstAbsNm: 0, staffedTotal: 0, staffedStation: 0 };
      work.set(k, row);
    }
    workOf.set(sh.id, row);
    // A correction replaces an earlier record of the same pair: the pair counts once, the passes of the latest record.
    if (sh.wheelId) {
      const w = key(sh.wheelId, day);
      const wheelRow = wheels.get(w) ?? { wheelId: sh.wheelId, day, pairs: 0, passes: 0 };
      wheels.set(w, wheelRow);
      if (!corrected.has(sh.id)) wheelRow.passes += sh.passes;
      if (!sh.correctsId) wheelRow.pairs += 1;
    }
    if (sh.correctsId) continue;
    row.pairs += 1;
    row[hourKey(hour)] = (row[hourKey(hour)] ?? 0) + 1;
    const byTechnician = key(day, hour, sh.technicianId);
    const atStation = key(day, hour, sh.stationId, sh.technicianId);
    if (!staffedBy.has(byTechnician)) {
      staffedBy.add(byTechnician);
      row.staffedTotal += 1;
    }
    if (!staffedAt.has(atStation)) {
      staffedAt.add(atStation);
      row.staffedStation += 1;
    }
  }
  const stationOfSharpening = new Map(sharpenings.map((sh) => [sh.id, sh.stationId]));
  for (const r of readings) {
    const row = r.sharpeningId ? workOf.get(r.sharpeningId) : undefined;
    if (!row) continue;
    if (r.attempt === 1) {
      row.firstReadings += 1;
      row.firstAbsNm += Math.abs(r.readingNm);
      const band = classifyLevel(r.readingNm, bandsOf(stationOfSharpening.get(r.sharpeningId!) ?? ''));
      if (band === 'true') row.firstTrue += 1;
      else if (band === 'fair') row.firstFair += 1;
      else row.firstOff += 1;
    } else if (r.attempt === 2) {
      row.reruns += 1;
    }
  }

  const turnaround = new Map<string, repo.TurnaroundRow>();
  for (const t of tickets) {
    if (!t.readyAt) continue;
    const minutes = (t.readyAt.getTime() - t.droppedAt.getTime()) / 60_000;
    // A ready time before the drop-off can only be a clock or data error: left out, as the median is.
    if (!(minutes >= 0)) continue;
    const bucket = Math.min(Math.floor(minutes / TURNAROUND_BUCKET_MINUTES), TURNAROUND_LAST_BUCKET);
    const { day } = clock.of(t.readyAt);
    const k = key(day, t.stationId, bucket);
    const row = turnaround.get(k) ?? { day, stationId: t.stationId ?? '', bucket, tickets: 0, onTime: 0 };
    row.tickets += 1;
    if (t.readyAt.getTime() <= t.promisedAt.getTime()) row.onTime += 1;
    turnaround.set(k, row);
  }

  const money = new Map<string, repo.MoneyDayRow>();
  const moneyRow = (day: string, productId: string, channel: string) => {
    const k = key(day, productId, channel);
    const row = money.get(k) ?? { day, productId, channel, sales: 0, salesMinor: 0, feesMinor: 0, refunds: 0, refundsMinor: 0 };
    money.set(k, row);
    return row;
  };
  for (const p of paid) {
    if (!p.paidAt) continue;
    const row = moneyRow(clock.of(p.paidAt).day, p.productId, p.channel);
    row.sales += 1;
    row.salesMinor += p.amountMinor;
    row.feesMinor += p.feeMinor;
  }
  for (const r of refunds) {
    const row = moneyRow(clock.of(r.createdAt).day, r.productId, r.channel);
    row.refunds += 1;
    row.refundsMinor += r.amountMinor;
  }

  const credit = new Map<string, repo.CreditDayRow>();
  for (const e of entries) {
    const day = clock.of(e.createdAt).day;
    const k = key(day, e.kind, e.productId);
    const row = credit.get(k) ?? { day, kind: e.kind, productId: e.productId ?? '', credits: 0, valueMinor: 0 };
    row.credits += e.credits;
    row.valueMinor += e.valueMinor;
    credit.set(k, row);
  }

  const driftDays: repo.DriftDayRow[] = [];
  for (const stationId of await repo.stationsWithSeriesIn(s, range)) driftDays.push(...(await driftTransitions(s, clock, stationId, range, drift)));

  await repo.replaceDays(s, run, { work: withRollups([...work.values()]), wheels: [...wheels.values()], turnaround: [...turnaround.values()], money: [...money.values()], credit: [...credit.values()], drift: driftDays });
  return Math.round((range.end.getTime() - range.start.getTime()) / 86_400_000);
}

/**
 * The drift watch over a station's series in the range, on the window of readings ending at each look: a change from no alert to alert is one raised, back again one cleared, on the reading's local day.
 */
async function driftTransitions(s: Scope, clock: LocalClock, stationId: string, range: repo.Range, drift: (values: number[]) => boolean): Promise<repo.DriftDayRow[]> {
  const [before, during] = await Promise.all([repo.seriesBefore(s, stationId, range.start, DRIFT_WINDOW), repo.seriesIn(s, stationId, range)]);
  const series = [...before.reverse(), ...during];
  const values = series.map((r) => r.readingNm);
  let alert = before.length > 0 && drift(values.slice(0, before.length));
  const days = new Map<string, repo.DriftDayRow>();
  for (let i = before.length; i < series.length; i++) {
    // The watch raises on violations among its last DRIFT_DEFAULTS.recentWindow readings, so looking after every
    // that many readings (and after the last) sees every violation, at a fifth of the work on a busy station.
    if ((i - before.length + 1) % DRIFT_DEFAULTS.recentWindow !== 0 && i !== series.length - 1) continue;
    const now = drift(values.slice(Math.max(0, i + 1 - DRIFT_WINDOW), i + 1));
    if (now !== alert) {
      const day = clock.of(series[i]!.takenAt).day;
      const row = days.get(day) ?? { day, stationId, raised: 0, cleared: 0 };
      if (now) row.raised += 1;
      else row.cleared += 1;
      days.set(day, row);
    }
    alert = now;
  }
  return [...days.values()];
}

/**
 * Keeps report_leveling current. An adjustment is measured when it has no stored effect yet (a new one, or every one
 * after the table was added), on a full rebuild, and when a rebuilt range reaches into the window of readings its
 * effect was taken from, or its window is still open (schema/reports.ts).
 */
async function measureLeveling(s: Scope, changed: 'all' | { start: Date; end: Date }[]): Promise<void> {
  const counts = await repo.levelingCounts(s);
  if (counts.adjustments === 0 || (changed !== 'all' && changed.length === 0 && counts.adjustments === counts.measured)) return;
  const [adjustments, windows] = await Promise.all([repo.allAdjustments(s), repo.measuredWindows(s)]);
  const stored = new Map(windows.map((w) => [w.adjustmentId, w]));
  // An adjustment's windows end at its neighbours, so a new one at a station has its neighbours measured again too.
  const byStation = groupBy(
    [...adjustments].sort((a, b) => a.at.getTime() - b.at.getTime()),
    (a) => a.stationId,
  );
  const rows: repo.LevelingRow[] = [];
  for (const list of byStation.values()) {
    const anyNew = list.some((a) => !stored.has(a.id));
    for (const [k, a] of list.entries()) {
      const w = stored.get(a.id);
      const due = changed === 'all' || anyNew || !w || changed.some((r) => (w.windowFrom === null || w.windowFrom < r.end) && (w.windowTo === null || w.windowTo >= r.start));
      if (!due) continue;
      // Newest first before it, oldest first after it: the last of each is the window's far end.
      const [previous, next] = [list[k - 1]?.at, list[k + 1]?.at];
      const before = await repo.effectReadings(s, a.stationId, a.at, 'before', previous, EFFECT_READINGS);
      const after = await repo.effectReadings(s, a.stationId, a.at, 'after', next, EFFECT_READINGS);
      rows.push({
        adjustmentId: a.id,
        stationId: a.stationId,
        at: a.at,
        amountMilli: a.amountMilli,
        beforeReadings: before.length,
        beforeSumNm: before.reduce((n, r) => n + r.readingNm, 0),
        afterReadings: after.length,
        afterSumNm: after.reduce((n, r) => n + r.readingNm, 0),
        // A side short of readings is still closed when a neighbour ends it: nothing beyond that can count.
        windowFrom: before.length === EFFECT_READINGS ? before[before.length - 1]!.takenAt : (previous ?? null),
        windowTo: after.length === EFFECT_READINGS ? after[after.length - 1]!.takenAt : (next ?? null),
      });
    }
  }
  await repo.replaceLeveling(s, rows);
}
