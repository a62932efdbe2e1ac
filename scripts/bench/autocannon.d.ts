// The part of autocannon's API the bench uses (the package ships no types).
declare module 'autocannon' {
  namespace autocannon {
    interface Stats {
      average: number;
      mean: number;
      stddev: number;
      min: number;
      max: number;
      total: number;
      p50: number;
      p90: number;
      p97_5: number;
      p99: number;
    }

    interface Result {
      duration: number;
      errors: number;
      timeouts: number;
      non2xx: number;
      '2xx': number;
      '4xx': number;
      '5xx': number;
      statusCodeStats: Record<string, { count: number }>;
      latency: Stats & { totalCount: number };
      requests: Stats & { sent: number };
    }

    interface Request {
      method?: string;
      path?: string;
      headers?: Record<string, string>;
      body?: string;
      setupRequest?: (request: Request, context: Record<string, unknown>) => Request;
      onResponse?: (status: number, body: string, context: Record<string, unknown>, headers: Record<string, string>) => void;
    }

    interface Options {
      url: string;
      connections?: number;
      duration?: number;
      maxOverallRequests?: number;
      timeout?: number;
      pipelining?: number;
      method?: string;
      headers?: Record<string, string>;
      body?: string;
      requests?: Request[];
    }
  }

  function autocannon(options: autocannon.Options): Promise<autocannon.Result>;
  export default autocannon;
}
