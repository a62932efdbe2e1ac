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

export function summarize(label: string, connections: number, result: autocannon.Result): LoadRun {
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
  };
}

export async function measure(spec: LoadSpec): Promise<WarmedRun> {
  const warm = await autocannon(options(spec, spec.warmupSeconds, spec.warmupRequests));
  const result = await autocannon(options(spec, spec.seconds, spec.maxRequests));
  return { warmup: summarize(`${spec.label} (warm-up)`, spec.connections, warm), run: summarize(spec.label, spec.connections, result) };
}
