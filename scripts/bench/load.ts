import { readFileSync } from 'node:fs';
import autocannon from 'autocannon';

// One bounded load run: a short warm-up whose figures are dropped, then the measured run, which ends after
// `seconds` or `maxRequests` requests, whichever comes first.

export interface LoadSpec {
  label: string;
  url: string;
  connections: number;
  seconds: number;
  warmupSeconds: number;
  maxRequests: number;
  warmupRequests: number;
  headers?: Record<string, string>;
  request: autocannon.Request;
}

export interface LoadRun {
  label: string;
  connections: number;
  seconds: number;
  /** Requests sent, answered, and answered 2xx. */
  sent: number;
  answered: number;
  ok: number;
  non2xx: number;
  errors: number;
  timeouts: number;
  statusCodes: Record<string, number>;
  /** 2xx answers per second of the measured run. */
  okPerSecond: number;
  latencyMs: { p50: number; p90: number; p99: number; max: number; mean: number };
  /** Share of the machine's CPU time the hypervisor gave to other guests during the run; null where /proc/stat is not. */
  cpuStolenPercent: number | null;
}

/** The all-CPU line of /proc/stat: ticks so far in all states, and in `steal`. */
export interface CpuTicks {
  total: number;
  steal: number;
}

/**
 * Reads the first line of /proc/stat. Its fields, per proc(5), are user, nice, system, idle, iowait, irq, softirq,
 * steal, guest and guest_nice; guest time is already counted in user (and guest_nice in nice), so the total is
 * the first eight.
 */
export function parseCpuTicks(procStat: string): CpuTicks {
  const line = procStat.split('\n', 1)[0] ?? '';
  const [name, ...fields] = line.trim().split(/\s+/);
  const ticks = fields.slice(0, 8).map(Number);
  if (name !== 'cpu' || ticks.length < 8 || ticks.some((n) => !Number.isFinite(n))) throw new Error(`not the all-CPU line of /proc/stat: ${line}`);
  return { total: ticks.reduce((a, b) => a + b, 0), steal: ticks[7]! };
}

/** Stolen ticks as a percentage of all ticks between two readings, to one decimal. */
export function stolenPercent(before: CpuTicks, after: CpuTicks): number {
  const total = after.total - before.total;
  return total > 0 ? Math.round(((after.steal - before.steal) / total) * 1000) / 10 : 0;
}

function cpuTicks(): CpuTicks | null {
  try {
    return parseCpuTicks(readFileSync('/proc/stat', 'utf8'));
  } catch {
    return null;
  }
}

export interface WarmedRun {
  run: LoadRun;
  warmup: LoadRun;
}

function options(spec: LoadSpec, seconds: number, maxRequests: number): autocannon.Options {
  return {
    url: spec.url,
    connections: spec.connections,
    duration: seconds,
    maxOverallRequests: Math.max(maxRequests, spec.connections),
    timeout: 10,
    pipelining: 1,
    headers: spec.headers ?? {},
    requests: [spec.request],
  };
}

export function summarize(label: string, connections: number, result: autocannon.Result, cpuStolenPercent: number | null = null): LoadRun {
  const statusCodes = Object.fromEntries(Object.entries(result.statusCodeStats).map(([code, { count }]) => [code, count]));
  return {
    label,
    connections,
    seconds: result.duration,
    sent: result.requests.sent,
    answered: result.latency.totalCount,
    ok: result['2xx'],
    non2xx: result.non2xx,
    errors: result.errors,
    timeouts: result.timeouts,
    statusCodes,
    okPerSecond: result.duration > 0 ? Math.round((result['2xx'] / result.duration) * 10) / 10 : 0,
    latencyMs: { p50: result.latency.p50, p90: result.latency.p90, p99: result.latency.p99, max: result.latency.max, mean: Math.round(result.latency.mean * 100) / 100 },
    cpuStolenPercent,
  };
}

export async function measure(spec: LoadSpec): Promise<WarmedRun> {
  const warm = await autocannon(options(spec, spec.warmupSeconds, spec.warmupRequests));
  const before = cpuTicks();
  const result = await autocannon(options(spec, spec.seconds, spec.maxRequests));
  const after = cpuTicks();
  const stolen = before && after ? stolenPercent(before, after) : null;
  return { warmup: summarize(`${spec.label} (warm-up)`, spec.connections, warm), run: summarize(spec.label, spec.connections, result, stolen) };
}
