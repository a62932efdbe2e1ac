import http from 'node:http';
import { performance } from 'node:perf_hooks';
import type { Pool, RowDataPacket } from 'mysql2/promise';
import { OVERLAP_MS } from '../../apps/api/src/features/reports/refresh';
import { addDays, localTimeUtc } from '../../packages/db/src/bench-seed';

// The cross-station reports against the question they answer, asked of the raw rows: a sharpening ⋈ level
// reading join grouped by station over the same rink and local days. Both are timed one request at a time, and
// their per-station figures are compared, so a fast report that counts differently does not pass unnoticed.

export interface Timing {
  runs: number;
  p50: number;
  p95: number;
  max: number;
}

export function timing(samples: number[]): Timing {
  const sorted = [...samples].sort((a, b) => a - b);
  // Nearest rank: the smallest sample with at least p of the samples at or below it.
  const rank = (p: number) => sorted[Math.max(0, Math.ceil(p * sorted.length) - 1)] ?? 0;
  const round = (x: number) => Math.round(x * 10) / 10;
  return { runs: sorted.length, p50: round(rank(0.5)), p95: round(rank(0.95)), max: round(sorted[sorted.length - 1] ?? 0) };
}

export async function timed<T>(fn: () => Promise<T>): Promise<{ ms: number; value: T }> {
  const began = performance.now();
  const value = await fn();
  return { ms: performance.now() - began, value };
}

export interface StationFigures {
  stationId: string;
  pairs: number;
  firstReadings: number;
  firstTrue: number;
  firstFair: number;
  firstOff: number;
  reruns: number;
  firstAbsNm: number;
}

/** The local days from–to of a rink as a half-open UTC range. */
export function utcRange(timeZone: string, from: string, to: string): { from: Date; to: Date } {
  return { from: new Date(localTimeUtc(timeZone, from, 0)), to: new Date(localTimeUtc(timeZone, addDays(to, 1), 0)) };
}

/** The naive way: every sharpening of the period joined to its readings, grouped by station, each time it is asked. */
export async function naiveStationFigures(pool: Pool, input: { tenantId: string; from: Date; to: Date; trueNm: number; fairNm: number }): Promise<StationFigures[]> {
  const [rows] = await pool.query<RowDataPacket[]>(
    `SELECT s.station_id AS stationId,
            COUNT(DISTINCT s.id) AS pairs,
            COALESCE(SUM(r.attempt = 1), 0) AS firstReadings,
            COALESCE(SUM(r.attempt = 1 AND ABS(r.reading_nm) <= ?), 0) AS firstTrue,
            COALESCE(SUM(r.attempt = 1 AND ABS(r.reading_nm) > ? AND ABS(r.reading_nm) <= ?), 0) AS firstFair,
            COALESCE(SUM(r.attempt = 1 AND ABS(r.reading_nm) > ?), 0) AS firstOff,
            COALESCE(SUM(r.attempt = 2), 0) AS reruns,
            COALESCE(SUM(CASE WHEN r.attempt = 1 THEN ABS(r.reading_nm) END), 0) AS firstAbsNm
       FROM sharpening s
       LEFT JOIN level_reading r ON r.tenant_id = s.tenant_id AND r.sharpening_id = s.id AND r.kind = 'sharpening'
      WHERE s.tenant_id = ? AND s.done_at >= ? AND s.done_at < ? AND s.corrects_id IS NULL
      GROUP BY s.station_id
      ORDER BY s.station_id`,
    [input.trueNm, input.trueNm, input.fairNm, input.fairNm, input.tenantId, input.from, input.to],
  );
  return rows.map((r) => ({
    stationId: String(r.stationId),
    pairs: Number(r.pairs),
    firstReadings: Number(r.firstReadings),
    firstTrue: Number(r.firstTrue),
    firstFair: Number(r.firstFair),
    firstOff: Number(r.firstOff),
    reruns: Number(r.reruns),
    firstAbsNm: Number(r.firstAbsNm),
  }));
}

interface ReportStationRow {
  stationId: string;
  pairs?: number;
  firstReadings?: number;
  trueShare?: number | null;
  offShare?: number | null;
}

/** Where the report and the raw rows disagree, per station and figure; empty when they agree. */
export function compareFigures(naive: StationFigures[], throughput: ReportStationRow[], quality: ReportStationRow[]): string[] {
  const problems: string[] = [];
  const close = (a: number | null | undefined, b: number) => a !== null && a !== undefined && Math.abs(a - b) < 1e-6;
  for (const n of naive) {
    const t = throughput.find((row) => row.stationId === n.stationId);
    const q = quality.find((row) => row.stationId === n.stationId);
    if (t?.pairs !== n.pairs) problems.push(`station ${n.stationId}: pairs ${t?.pairs ?? 'missing'} in the report, ${n.pairs} in the rows`);
    if (q?.firstReadings !== n.firstReadings) problems.push(`station ${n.stationId}: first readings ${q?.firstReadings ?? 'missing'} in the report, ${n.firstReadings} in the rows`);
    if (n.firstReadings > 0) {
      if (!close(q?.trueShare, n.firstTrue / n.firstReadings)) problems.push(`station ${n.stationId}: true share ${q?.trueShare ?? 'missing'} in the report, ${n.firstTrue / n.firstReadings} in the rows`);
      if (!close(q?.offShare, n.firstOff / n.firstReadings)) problems.push(`station ${n.stationId}: off share ${q?.offShare ?? 'missing'} in the report, ${n.firstOff / n.firstReadings} in the rows`);
    }
  }
  return problems;
}

/** A GET without a time limit: a first report call may build a year of summaries, longer than fetch waits for headers. */
export function getJson(url: string, headers: Record<string, string>): Promise<{ status: number; body: unknown }> {
  return new Promise((resolve, reject) => {
    const request = http.get(url, { headers }, (response) => {
      const chunks: Buffer[] = [];
      response.on('data', (chunk: Buffer) => chunks.push(chunk));
      response.on('end', () => {
        const text = Buffer.concat(chunks).toString('utf8');
        try {
          resolve({ status: response.statusCode ?? 0, body: JSON.parse(text) as unknown });
        } catch {
          resolve({ status: response.statusCode ?? 0, body: text });
        }
      });
      response.on('error', reject);
    });
    request.on('error', reject);
  });
}

export type ReportsMeasurement =
  | { available: false; note: string }
  | {
      available: true;
      from: string;
      to: string;
      pairsInRange: number;
      /**
       * The first call of each report, which brings the rink's summaries up to date. A refresh looks OVERLAP_MS back
       * for rows that committed late, so the calls in that time after the load runs' writes recompute their day again.
       */
      firstCallMs: { throughput: number; quality: number };
      /** How long the bench waited after the first calls, so that the samples are of reports on current summaries. */
      settledMs: number;
      throughput: Timing;
      quality: Timing;
      naive: Timing;
      figuresAgree: boolean;
      disagreements: string[];
    };

interface ReportBody {
  tables: { byStation: ReportStationRow[] };
}

/** Repeats `fn` until `runs` samples or `budgetMs` have passed, whichever comes first, but at least `least` times. */
async function sample<T>(fn: () => Promise<T>, o: { runs: number; least: number; budgetMs: number }): Promise<{ ms: number[]; last: T }> {
  const ms: number[] = [];
  const began = performance.now();
  let last: T | undefined;
  while (ms.length < o.runs && (ms.length < o.least || performance.now() - began < o.budgetMs)) {
    const t = await timed(fn);
    ms.push(t.ms);
    last = t.value;
  }
  return { ms, last: last as T };
}

export async function measureReports(input: {
  apiBase: string;
  slug: string;
  /** The client's cookies, renewed as a browser's are (bench.ts, BrowserCookies). */
  cookie: () => Promise<string>;
  pool: Pool;
  tenantId: string;
  timeZone: string;
  from: string;
  to: string;
  bands: { trueNm: number; fairNm: number };
  runs: number;
  budgetMs: number;
}): Promise<ReportsMeasurement> {
  const headers = { cookie: await input.cookie() };
  const probe = await getJson(`${input.apiBase}/api/rinks/${input.slug}/reports`, headers);
  if (probe.status !== 200) return { available: false, note: `GET /api/rinks/:rinkSlug/reports answered ${probe.status}: the report routes are not in this API build` };
  const get = async (report: 'throughput' | 'quality'): Promise<ReportBody> => {
    const answer = await getJson(`${input.apiBase}/api/rinks/${input.slug}/reports/${report}?from=${input.from}&to=${input.to}`, headers);
    if (answer.status !== 200) throw new Error(`GET …/reports/${report} answered ${answer.status}: ${JSON.stringify(answer.body).slice(0, 300)}`);
    return answer.body as ReportBody;
  };
  const firstThroughput = await timed(() => get('throughput'));
  const firstQuality = await timed(() => get('quality'));
  // Past the refresh's look-back, the writes of the load runs are behind every later report.
  const settledMs = OVERLAP_MS + 1000;
  await new Promise((resolve) => setTimeout(resolve, settledMs));
  const bounds = { runs: input.runs, least: 5, budgetMs: input.budgetMs };
  headers.cookie = await input.cookie();
  const throughput = await sample(() => get('throughput'), bounds);
  headers.cookie = await input.cookie();
  const quality = await sample(() => get('quality'), bounds);
  const range = utcRange(input.timeZone, input.from, input.to);
  const naive = await sample(() => naiveStationFigures(input.pool, { tenantId: input.tenantId, ...range, ...input.bands }), { runs: 10, least: 3, budgetMs: input.budgetMs });
  const disagreements = compareFigures(naive.last, throughput.last.tables.byStation, quality.last.tables.byStation);
  return {
    available: true,
    from: input.from,
    to: input.to,
    pairsInRange: naive.last.reduce((n, s) => n + s.pairs, 0),
    firstCallMs: { throughput: Math.round(firstThroughput.ms), quality: Math.round(firstQuality.ms) },
    settledMs,
    throughput: timing(throughput.ms),
    quality: timing(quality.ms),
    naive: timing(naive.ms),
    figuresAgree: disagreements.length === 0,
    disagreements: disagreements.slice(0, 20),
  };
}
