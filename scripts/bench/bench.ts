import { existsSync, mkdirSync, readFileSync, statSync, writeFileSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import mysql, { type Pool, type RowDataPacket } from 'mysql2/promise';
import { createDbHandle } from '@rinkwright/db/unscoped';
import { runMigrations } from '@rinkwright/db/testing';
import { envSchema } from '../../apps/api/src/env';
import { DEFAULT_DESK_SETTINGS } from '../../apps/api/src/lib/desk-settings';
import { BENCH_SEED_VERSION, addDays, checkLedger, grantLoadAccounts, seedBench, type BenchSeedResult, type BenchSize, type LedgerCheck } from '../../packages/db/src/bench-seed';
import { closeLoadTickets, openLoadTickets, type LoadPair } from './fixtures';
import { measure, type LoadRun, type LoadSpec } from './load';
import { measureReports, type ReportsMeasurement, type Timing } from './reports';
import { writeResults, type BenchResults, type Goal, type RedemptionRound } from './results';
import { measureWeb } from './web-size';

// `pnpm bench`: seeds (or reuses) the large data set, starts the built API and the bare endpoint next to it,
// runs the four comparisons and writes bench/results.json and bench/results.md. Every figure printed is measured
// in this run; each goal says whether the measurement met it.

export interface Service {
  pid: number;
  logFile: string;
  stop(): Promise<void>;
}

export interface BenchConfig {
  root: string;
  dataDir: string;
  databaseUrl: string;
  authSecret: string;
  apiEntry: string;
  /** Node's flags for the API, and for the bare endpoint too, so the two run alike. */
  nodeFlags: string[];
  webDist: string;
  apiPort: number;
  barePort: number;
  size: BenchSize;
  seconds: number;
  warmupSeconds: number;
  reseed: boolean;
  startService(spec: { name: string; args: string[]; env: Record<string, string>; port: number; health: string }): Promise<Service>;
}

const SEED = 20_261_201;
const NAMESPACE = 'be0c4000';
/** Every staff user of the data set signs in with this; the data set is local and invented. */
const PASSWORD = 'bench-password-2026';
const CONNECTIONS = [8, 32] as const;
const MAX_REQUESTS = 30_000;
/**
 * Each logged pair needs a waiting pair of its own, so a log run is capped by count too, above what the 10 s take:
 * autocannon splits the cap between the connections and stops each at its share. At 6,000, two 8-connection runs
 * answered exactly 6,000 in their 10 s (599.4 a second), a figure the cap set rather than the API.
 */
const LOG_MAX_REQUESTS = 10_000;
const LOG_WARMUP_REQUESTS = 1_000;
const LOAD_ACCOUNTS = 128;
const LOAD_CREDITS = 4_000;
/** Rounds of the redemption comparison at each connection count: odd, so the median is one round's. */
const REDEMPTION_ROUNDS = 3;
const REPORT_RUNS = 30;
/** Per report: a slow report is sampled fewer times rather than holding the bench for minutes. */
const REPORT_BUDGET_MS = 30_000;
const REPORT_DAYS = 90;
const DB_POOL_SIZE = '10';

interface SeedRecord {
  database: string;
  version: number;
  size: BenchSize;
  seed: number;
  namespace: string;
  seededAt: string;
  seconds: number;
  result: BenchSeedResult;
}

const say = (line: string) => console.log(line);

/** The round whose ratio is the median of its connection count's rounds (their number is odd). */
function medianRound(rounds: RedemptionRound[], key: 'throughputRatio' | 'p99Ratio'): RedemptionRound {
  return [...rounds].sort((a, b) => a[key] - b[key])[Math.floor(rounds.length / 2)]!;
}

function databaseOf(url: string): { name: string; server: string; where: string } {
  const parsed = new URL(url);
  const name = decodeURIComponent(parsed.pathname.replace(/^\//, ''));
  // The bench drops and re-creates its database when the seeded size changes: only a database meant for it.
  if (!/^[A-Za-z0-9_]+_bench$/.test(name)) throw new Error(`the bench database must be named …_bench, not "${name}" (it is dropped when re-seeded)`);
  parsed.pathname = '/';
  return { name, server: parsed.toString(), where: `${parsed.hostname}:${parsed.port || '3306'}/${name}` };
}

async function recreateDatabase(server: string, name: string, drop: boolean) {
  const conn = await mysql.createConnection({ uri: server });
  try {
    if (drop) await conn.query(`DROP DATABASE IF EXISTS \`${name}\``);
    await conn.query(`CREATE DATABASE IF NOT EXISTS \`${name}\` CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci`);
  } finally {
    await conn.end();
  }
}

function readMarker(file: string): SeedRecord | undefined {
  try {
    return JSON.parse(readFileSync(file, 'utf8')) as SeedRecord;
  } catch {
    return undefined;
  }
}

const sameSize = (a: BenchSize, b: BenchSize) => a.rinks === b.rinks && a.sharpenings === b.sharpenings && a.ledgerEntries === b.ledgerEntries;
const fmt = (n: number) => n.toLocaleString('en-US');

/** How far a reused data set may have grown through earlier runs' load runs, as a share of what was seeded. */
const REUSE_GROWTH = 0.02;

/**
 * What keeps a seeded data set from being reused: a table with none of its seeded rows left, or one that earlier
 * runs' load runs have grown past REUSE_GROWTH. A full run adds about 40% to the seeded ledger entries (its
 * redemptions) and 56,000 stored answers, and the runs of one afternoon took the database from about 5 to 10 GB,
 * past the buffer pool: logging a pair measured 65 ms p99 there against 46 ms on a fresh seed.
 */
async function growthSinceSeeding(pool: Pool, seeded: Record<string, number>): Promise<string[]> {
  const tables = { sharpening: seeded.sharpening ?? 0, ticket: seeded.ticket ?? 0, credit_entry: seeded.credit_entry ?? 0 };
  const found: string[] = [];
  for (const [table, count] of Object.entries(tables)) {
    const [rows] = await pool.query<RowDataPacket[]>(`SELECT COUNT(*) AS n FROM ${table}`);
    const now = Number(rows[0]?.n ?? 0);
    if (now < count) found.push(`${table} has ${fmt(now)} rows of the ${fmt(count)} seeded`);
    else if (now > count * (1 + REUSE_GROWTH)) found.push(`${table} has grown from ${fmt(count)} to ${fmt(now)} rows`);
  }
  // The seed stores no answers: every one is a load run's.
  const [answers] = await pool.query<RowDataPacket[]>('SELECT COUNT(*) AS n FROM idempotency_key');
  const stored = Number(answers[0]?.n ?? 0);
  if (stored > (seeded.credit_entry ?? 0) * REUSE_GROWTH) found.push(`${fmt(stored)} stored answers`);
  return found;
}

/** The seeded data set: reused when the marker names this database and size and it has not grown, else seeded. */
async function ensureDataSet(config: BenchConfig): Promise<{ record: SeedRecord; reused: boolean; ledger: LedgerCheck }> {
  const db = databaseOf(config.databaseUrl);
  const markerFile = path.join(config.dataDir, 'bench', 'seed.json');
  const marker = readMarker(markerFile);
  await recreateDatabase(db.server, db.name, false);
  await runMigrations(config.databaseUrl);
  const matches = !config.reseed && marker && marker.database === db.where && marker.version === BENCH_SEED_VERSION && sameSize(marker.size, config.size) && marker.namespace === NAMESPACE;
  if (matches) {
    const handle = createDbHandle(config.databaseUrl, { connectionLimit: 2 });
    try {
      const grown = await growthSinceSeeding(handle.pool, marker.result.counts);
      if (grown.length === 0) {
        say(`- reusing the data set seeded ${marker.seededAt} in ${db.where} (${fmt(marker.size.sharpenings)} sharpenings; BENCH_RESEED=1 seeds again)`);
        return { record: marker, reused: true, ledger: await checkLedger(handle.pool, { tenantIds: marker.result.rinkIds }) };
      }
      say(`- not reusing the data set seeded ${marker.seededAt}: ${grown.join('; ')}`);
    } finally {
      await handle.close();
    }
  }
  say(`* seeding ${fmt(config.size.rinks)} rinks, ${fmt(config.size.sharpenings)} sharpenings and ${fmt(config.size.ledgerEntries)} ledger entries into ${db.where}`);
  await recreateDatabase(db.server, db.name, true);
  await runMigrations(config.databaseUrl);
  const handle = createDbHandle(config.databaseUrl, { connectionLimit: 4 });
  try {
    const began = Date.now();
    let reported = 0;
    const now = new Date();
    const result = await seedBench(handle.pool, {
      ...config.size,
      namespace: NAMESPACE,
      seed: SEED,
      now,
      password: PASSWORD,
      onProgress: ({ rinks, sharpenings }) => {
        const tenth = Math.floor((sharpenings / config.size.sharpenings) * 10);
        if (tenth > reported) {
          reported = tenth;
          say(`  ${rinks} rinks, ${fmt(sharpenings)} sharpenings (${((Date.now() - began) / 1000).toFixed(0)} s)`);
        }
      },
    });
    const seconds = (Date.now() - began) / 1000;
    say(`- seeded in ${seconds.toFixed(1)} s: ${Object.entries(result.counts).map(([t, n]) => `${t} ${fmt(n)}`).join(', ')}`);
    const record: SeedRecord = { database: db.where, version: BENCH_SEED_VERSION, size: config.size, seed: SEED, namespace: NAMESPACE, seededAt: now.toISOString(), seconds, result };
    mkdirSync(path.dirname(markerFile), { recursive: true });
    writeFileSync(markerFile, `${JSON.stringify(record, null, 2)}\n`);
    return { record, reused: false, ledger: await checkLedger(handle.pool, { tenantIds: result.rinkIds }) };
  } finally {
    await handle.close();
  }
}

/**
 * A signed-in load client's cookies, kept as a browser keeps them. better-auth renews the signed session copy once it
 * is SESSION_CACHE_SECONDS (60 s) old, and a browser sends the renewed cookie from its next request on; autocannon
 * sends the same headers all run long. So each load run starts from a newly written copy, which outlives the run
 * (a warm-up and a run are 15 s), and no run measures a client that ignores every Set-Cookie. Asking only whether
 * the session works was not enough: it renews nothing while the copy is valid, so a run that began with a copy of
 * ten seconds left spent the rest on expired cookies, each request reading the session from the database (customer
 * search at 32 connections gave 300/s against 590–770/s at 8 in two bench runs).
 */
class BrowserCookies {
  constructor(
    private readonly base: string,
    private jar: Map<string, string>,
  ) {}

  get header(): string {
    return [...this.jar].map(([name, value]) => `${name}=${value}`).join('; ');
  }

  /** The cookies with a signed session copy written just now: better-auth reads the session and writes a new copy. */
  async fresh(): Promise<string> {
    const answer = await fetch(`${this.base}/api/auth/get-session?disableCookieCache=true`, { headers: { cookie: this.header } });
    const body: unknown = answer.status === 200 ? await answer.json() : null;
    if (!body) throw new Error(`a load client's session stopped working (get-session answered ${answer.status})`);
    this.jar = withCookies(this.jar, answer.headers.getSetCookie());
    return this.header;
  }
}

function withCookies(jar: Map<string, string>, setCookies: string[]): Map<string, string> {
  const next = new Map(jar);
  for (const line of setCookies) {
    const pair = line.split(';')[0] ?? '';
    const at = pair.indexOf('=');
    if (at > 0) next.set(pair.slice(0, at), pair.slice(at + 1));
  }
  return next;
}

async function signIn(base: string, email: string): Promise<BrowserCookies> {
  const response = await fetch(`${base}/api/auth/sign-in/email`, {
    method: 'POST',
    headers: { 'content-type': 'application/json', origin: base },
    body: JSON.stringify({ email, password: PASSWORD }),
  });
  if (response.status !== 200) throw new Error(`sign-in of ${email} answered ${response.status}: ${await response.text()}`);
  const cookies = new BrowserCookies(base, withCookies(new Map(), response.headers.getSetCookie()));
  await cookies.fresh();
  return cookies;
}

async function one<T extends RowDataPacket>(pool: Pool, sql: string, values: unknown[]): Promise<T> {
  const [rows] = await pool.query<T[]>(sql, values);
  const row = rows[0];
  if (!row) throw new Error(`no row for: ${sql}`);
  return row;
}

interface RedemptionCheck {
  granted: number;
  /** Redemptions written (the ledger's entries), the 201s the load generator saw, and those cut off at a run's end. */
  redeemed: number;
  answered201: number;
  cutOff: number;
  finalBalance: number;
  /** granted − redeemed == final balance, every 201 has its entry, and every lot's remaining is Σ its entries. */
  exact: boolean;
  ledger: LedgerCheck;
}

/** Waits until the requests a run's end cut off have finished on the server: the count of entries stops moving. */
async function settle(pool: Pool, tenantId: string, accountIds: string[]): Promise<void> {
  const entries = async () => Number((await one(pool, 'SELECT COUNT(*) AS n FROM credit_entry WHERE tenant_id = ? AND account_id IN (?)', [tenantId, accountIds])).n);
  const deadline = Date.now() + 30_000;
  for (let before = await entries(); Date.now() < deadline; ) {
    await new Promise((resolve) => setTimeout(resolve, 1_000));
    const now = await entries();
    if (now === before) return;
    before = now;
  }
}

async function checkRedemptions(pool: Pool, tenantId: string, accounts: { accountIds: string[]; granted: number }, answered: Set<string>, maxCutOff: number): Promise<RedemptionCheck> {
  await settle(pool, tenantId, accounts.accountIds);
  // One snapshot for the entries and the balance, so a late commit cannot fall between the two reads.
  const conn = await pool.getConnection();
  let keys: string[];
  let finalBalance: number;
  try {
    await conn.query('START TRANSACTION WITH CONSISTENT SNAPSHOT');
    const [entries] = await conn.query<RowDataPacket[]>("SELECT idem_key AS k FROM credit_entry WHERE tenant_id = ? AND account_id IN (?) AND kind = 'redeem'", [tenantId, accounts.accountIds]);
    const [balance] = await conn.query<RowDataPacket[]>('SELECT COALESCE(SUM(remaining), 0) AS n FROM credit_lot WHERE tenant_id = ? AND account_id IN (?)', [tenantId, accounts.accountIds]);
    await conn.query('COMMIT');
    keys = entries.map((e) => String(e.k).replace(/^redeem:/, ''));
    finalBalance = Number(balance[0]?.n ?? 0);
  } finally {
    conn.release();
  }
  const written = new Set(keys);
  const phantom = [...answered].filter((key) => !written.has(key)).length;
  const cutOff = written.size - (answered.size - phantom);
  const ledger = await checkLedger(pool, { tenantIds: [tenantId], accountIds: accounts.accountIds });
  const exact = phantom === 0 && keys.length === written.size && accounts.granted - written.size === finalBalance && cutOff >= 0 && cutOff <= maxCutOff && ledger.mismatched === 0 && ledger.negative === 0;
  return { granted: accounts.granted, redeemed: written.size, answered201: answered.size, cutOff, finalBalance, exact, ledger };
}

function loadMachine(mariadb: string) {
  const cpus = os.cpus();
  return {
    cpu: cpus[0]?.model.trim() ?? 'unknown',
    cores: cpus.length,
    memoryGb: Math.round((os.totalmem() / 1024 ** 3) * 10) / 10,
    node: process.version,
    mariadb,
    os: `${os.type()} ${os.release()}`,
  };
}

const stolen = (run: LoadRun) => (run.cpuStolenPercent === null ? '' : `, CPU stolen ${run.cpuStolenPercent}%`);
const loadAverage = () => os.loadavg().map((x) => Math.round(x * 100) / 100);

export async function runBench(config: BenchConfig): Promise<number> {
  const startedAt = new Date();
  const loadAtStart = loadAverage();
  const { record, reused, ledger: seededLedger } = await ensureDataSet(config);
  const large = record.result.large;
  say(`- seeded ledger: ${fmt(seededLedger.lots)} lots, ${seededLedger.mismatched} whose remaining is not Σ entries, ${seededLedger.valueMismatched} whose values do not add up`);

  const apiBase = `http://127.0.0.1:${config.apiPort}`;
  const bareBase = `http://127.0.0.1:${config.barePort}`;
  const apiEnv: Record<string, string> = {
    NODE_ENV: 'production',
    HOST: '127.0.0.1',
    PORT: String(config.apiPort),
    APP_URL: apiBase,
    DATABASE_URL: config.databaseUrl,
    DB_POOL_SIZE,
    BETTER_AUTH_SECRET: config.authSecret,
    LOG_LEVEL: 'warn',
    AUTH_RATE_LIMIT_MAX: '1000000',
    API_RATE_LIMIT_MAX: '100000000',
    // The nightly jobs would expire lots and send mail in the middle of a measurement.
    WORKER_ENABLED: 'false',
    // Nothing measured here calls the payment service or sends mail; these ports refuse at once.
    STRIPE_API_BASE: 'http://127.0.0.1:9',
    SMTP_PORT: '9',
  };
  // The API sees only the settings above, never one the shell happens to carry (a replica URL, another port).
  for (const key of Object.keys(envSchema.shape)) if (!(key in apiEnv)) delete process.env[key];
  say(`* starting the API (${path.relative(config.root, config.apiEntry)}, built ${statSync(config.apiEntry).mtime.toISOString()}) on ${apiBase} and the bare endpoint on ${bareBase}`);
  await config.startService({ name: 'api', args: [...config.nodeFlags, config.apiEntry], env: apiEnv, port: config.apiPort, health: `${apiBase}/api/health` });
  await config.startService({
    name: 'bare',
    args: [...config.nodeFlags, path.join(config.root, 'scripts', 'bench', 'bare-server.mjs')],
    env: { BARE_PORT: String(config.barePort), DATABASE_URL: config.databaseUrl, DB_POOL_SIZE },
    port: config.barePort,
    health: `${bareBase}/ping`,
  });

  const technician = await signIn(apiBase, large.technicianEmail);
  const manager = await signIn(apiBase, large.managerEmail);
  const handle = createDbHandle(config.databaseUrl, { connectionLimit: 4 });
  const pool = handle.pool;
  try {
    const mariadb = String((await one(pool, 'SELECT VERSION() AS v', [])).v);
    const managerId = String((await one(pool, 'SELECT id FROM user WHERE email = ?', [large.managerEmail])).id);
    const technicianId = String((await one(pool, 'SELECT id FROM user WHERE email = ?', [large.technicianEmail])).id);
    const tag = Date.now().toString(36);
    const seconds = config.seconds;
    const spec = (label: string, url: string, connections: number, request: LoadSpec['request'], headers: Record<string, string>, maxRequests = MAX_REQUESTS, warmupRequests = MAX_REQUESTS): LoadSpec => ({
      label,
      url,
      connections,
      seconds,
      warmupSeconds: config.warmupSeconds,
      maxRequests,
      warmupRequests,
      headers,
      request,
    });
    const apiJson = { 'content-type': 'application/json', origin: apiBase };

    // ---- 1. redemption against the bare endpoint ----------------------------------------------------------------
    say('* 1. redemption: the API route against the bare Express + mysql2 endpoint');
    const apiAccounts = await grantLoadAccounts(pool, { tenantId: large.id, count: LOAD_ACCOUNTS, credits: LOAD_CREDITS, label: `Load skater ${tag} (API)`, actorUserId: managerId });
    const bareAccounts = await grantLoadAccounts(pool, { tenantId: large.id, count: LOAD_ACCOUNTS, credits: LOAD_CREDITS, label: `Load skater ${tag} (bare)`, actorUserId: managerId });
    const answered = { api: new Set<string>(), bare: new Set<string>() };
    /** Each round's keys are its own: a key used again would be a replay (the API) or a refusal (the bare one). */
    const redeemRequest = (target: 'api' | 'bare', connections: number, round: number): LoadSpec['request'] => {
      let n = 0;
      return {
        method: 'POST',
        setupRequest: (request) => {
          const i = n++;
          const key = `bench-${tag}-${target}${connections}-r${round}-${i}`;
          const requestPath =
            target === 'api'
              ? `/api/rinks/${large.slug}/customers/${apiAccounts.customerIds[i % LOAD_ACCOUNTS]}/redemptions`
              : `/tenants/${large.id}/accounts/${bareAccounts.accountIds[i % LOAD_ACCOUNTS]}/redemptions`;
          return { ...request, path: requestPath, headers: { ...request.headers, 'idempotency-key': key }, body: '{}' };
        },
        onResponse: (status, _body, _context, headers) => {
          const key = Object.entries(headers).find(([name]) => name.toLowerCase() === 'idempotency-key')?.[1];
          if (status === 201 && key) answered[target].add(key);
        },
      };
    };
    // The machine's speed moves from one minute to the next, so the two are compared in rounds that alternate which
    // goes first, and each goal takes the round with the median ratio: its figures are one pair of runs, made minutes
    // apart at most. The throughput goal is judged at 32 connections, the p99 goal at 8.
    const redemption: Record<'api' | 'bare', Record<number, LoadRun>> = { api: {}, bare: {} };
    const rounds: RedemptionRound[] = [];
    const judged: Record<number, RedemptionRound> = {};
    for (const connections of CONNECTIONS) {
      const ofConnections: RedemptionRound[] = [];
      for (let round = 1; round <= REDEMPTION_ROUNDS; round++) {
        const runs: Partial<Record<'api' | 'bare', LoadRun>> = {};
        for (const target of round % 2 === 1 ? (['bare', 'api'] as const) : (['api', 'bare'] as const)) {
          const label = `${target === 'api' ? 'API' : 'bare'} redemption, ${connections} connections`;
          const { run } =
            target === 'api'
              ? await measure(spec(label, apiBase, connections, redeemRequest('api', connections, round), { ...apiJson, cookie: await technician.fresh() }))
              : await measure(spec(label, bareBase, connections, redeemRequest('bare', connections, round), { 'content-type': 'application/json' }));
          runs[target] = run;
          say(`  round ${round}, ${run.label}: ${fmt(run.okPerSecond)} redemptions/s, p50 ${run.latencyMs.p50} ms, p99 ${run.latencyMs.p99} ms, non-2xx ${run.non2xx}, errors ${run.errors}${stolen(run)}`);
        }
        const api = runs.api!;
        const bare = runs.bare!;
        ofConnections.push({
          round,
          connections,
          api,
          bare,
          throughputRatio: bare.okPerSecond > 0 ? api.okPerSecond / bare.okPerSecond : 0,
          p99Ratio: bare.latencyMs.p99 > 0 ? api.latencyMs.p99 / bare.latencyMs.p99 : Infinity,
        });
      }
      const median = (judged[connections] = medianRound(ofConnections, connections === 8 ? 'p99Ratio' : 'throughputRatio'));
      redemption.api[connections] = median.api;
      redemption.bare[connections] = median.bare;
      rounds.push(...ofConnections);
    }
    // At most one request per connection is in flight when a run (or its warm-up) is stopped by the clock.
    const maxCutOff = CONNECTIONS.reduce((n, c) => n + 2 * c * REDEMPTION_ROUNDS, 0);
    const correctness = {
      api: await checkRedemptions(pool, large.id, apiAccounts, answered.api, maxCutOff),
      bare: await checkRedemptions(pool, large.id, bareAccounts, answered.bare, maxCutOff),
    };
    for (const [target, c] of Object.entries(correctness)) {
      say(`  ${target}: granted ${fmt(c.granted)} − redeemed ${fmt(c.redeemed)} = ${fmt(c.granted - c.redeemed)}; final balance ${fmt(c.finalBalance)} (${c.exact ? 'exact' : 'NOT exact'}; ${fmt(c.answered201)} answered 201, ${c.cutOff} cut off at a run's end)`);
    }

    // ---- 2. counter endpoints ------------------------------------------------------------------------------------
    say('* 2. counter endpoints');
    const [nameRows] = await pool.query<RowDataPacket[]>('SELECT name FROM customer WHERE tenant_id = ? ORDER BY id LIMIT 400', [large.id]);
    // What a technician types: the first letters of a surname.
    const terms = [...new Set(nameRows.map((r) => String(r.name).split(' ').pop()!.slice(0, 4).toLowerCase()).filter((t) => t.length >= 3))];
    const [customerRows] = await pool.query<RowDataPacket[]>('SELECT id FROM customer WHERE tenant_id = ? ORDER BY id LIMIT 500', [large.id]);
    const service = await one(pool, "SELECT id, price_minor FROM service_item WHERE tenant_id = ? AND kind = 'standard' AND active = 1 ORDER BY id LIMIT 1", [large.id]);
    const perRun = LOG_MAX_REQUESTS + LOG_WARMUP_REQUESTS;
    const pairsEach = 3;
    const openTickets = () =>
      openLoadTickets(pool, {
        tenantId: large.id,
        customerIds: customerRows.map((r) => String(r.id)),
        stationIds: large.stationIds,
        serviceId: String(service.id),
        priceMinor: Number(service.price_minor),
        createdBy: technicianId,
        // Enough pairs for both runs and their warm-ups at their request caps, and a few to spare.
        tickets: Math.ceil((perRun * CONNECTIONS.length + 100) / pairsEach),
        pairsEach,
      });
    let loadTickets: Awaited<ReturnType<typeof openTickets>> = { ticketIds: [], pairs: [] };
    let nextPair = 0;
    const logRequest: LoadSpec['request'] = {
      method: 'POST',
      setupRequest: (request) => {
        const i = nextPair++;
        const pair: LoadPair = loadTickets.pairs[Math.min(i, loadTickets.pairs.length - 1)]!;
        const body = {
          pairId: pair.pairId,
          stationId: pair.stationId,
          hollowNm: 12_700_000,
          passes: 3 + (i % 4),
          bladeWidthNm: 2_900_000,
          readings: [
            { blade: 'left', readingNm: ((i * 7_919) % 50_800) - 25_400 },
            { blade: 'right', readingNm: ((i * 104_729) % 50_800) - 25_400 },
          ],
        };
        return { ...request, path: `/api/rinks/${large.slug}/tickets/${pair.ticketId}/sharpenings`, headers: { ...request.headers, 'idempotency-key': `bench-${tag}-log-${i}` }, body: JSON.stringify(body) };
      },
    };
    let searchIndex = 0;
    const endpoints: { key: string; label: string; request: () => LoadSpec['request']; max: number; warmup: number; base: string; headers: Record<string, string>; client?: BrowserCookies }[] = [
      { key: 'ping', label: 'bare Express ping', request: () => ({ method: 'GET', path: '/ping' }), max: MAX_REQUESTS, warmup: MAX_REQUESTS, base: bareBase, headers: {} },
      {
        key: 'search',
        label: 'customer search',
        request: () => ({ method: 'GET', setupRequest: (request) => ({ ...request, path: `/api/rinks/${large.slug}/customers?q=${encodeURIComponent(terms[searchIndex++ % terms.length] ?? 'smit')}` }) }),
        max: MAX_REQUESTS,
        warmup: MAX_REQUESTS,
        base: apiBase,
        headers: { origin: apiBase },
        client: technician,
      },
      { key: 'tickets', label: 'ticket list (open)', request: () => ({ method: 'GET', path: `/api/rinks/${large.slug}/tickets` }), max: MAX_REQUESTS, warmup: MAX_REQUESTS, base: apiBase, headers: { origin: apiBase }, client: technician },
      { key: 'log', label: 'log a sharpening', request: () => logRequest, max: LOG_MAX_REQUESTS, warmup: LOG_WARMUP_REQUESTS, base: apiBase, headers: apiJson, client: technician },
    ];
    const counter: Record<string, Record<number, LoadRun>> = {};
    // Endpoint by endpoint, so the ticket list is measured on the seeded queue, before the run's own tickets exist.
    for (const e of endpoints) {
      if (e.key === 'log') loadTickets = await openTickets();
      for (const connections of CONNECTIONS) {
        const headers = e.client ? { ...e.headers, cookie: await e.client.fresh() } : e.headers;
        const { run } = await measure(spec(`${e.label}, ${connections} connections`, e.base, connections, e.request(), headers, e.max, e.warmup));
        (counter[e.key] ??= {})[connections] = run;
        say(`  ${run.label}: ${fmt(run.okPerSecond)}/s, p50 ${run.latencyMs.p50} ms, p99 ${run.latencyMs.p99} ms, non-2xx ${run.non2xx}, errors ${run.errors}${stolen(run)}`);
      }
    }
    const closed = await closeLoadTickets(pool, { tenantId: large.id, ticketIds: loadTickets.ticketIds, byUserId: technicianId });
    say(`  the run's ${fmt(loadTickets.ticketIds.length)} tickets closed: ${fmt(closed.collected)} collected, ${fmt(closed.voided)} void (pairs left unlogged)`);

    // ---- 3. the cross-station reports ----------------------------------------------------------------------------
    say('* 3. cross-station reports against a naive query over the raw rows');
    const to = record.result.lastDay;
    const from = addDays(to, -(REPORT_DAYS - 1));
    let reports: ReportsMeasurement;
    try {
      reports = await measureReports({
        apiBase,
        slug: large.slug,
        cookie: () => manager.fresh(),
        pool,
        tenantId: large.id,
        timeZone: large.timeZone,
        from,
        to,
        bands: { trueNm: DEFAULT_DESK_SETTINGS.trueNm, fairNm: DEFAULT_DESK_SETTINGS.fairNm },
        runs: REPORT_RUNS,
        budgetMs: REPORT_BUDGET_MS,
      });
    } catch (error) {
      reports = { available: false, note: `failed: ${error instanceof Error ? error.message : String(error)}` };
    }
    if (!reports.available) say(`  not measured: ${reports.note}`);
    else {
      const show = (name: string, t: Timing) => say(`  ${name}: p50 ${t.p50} ms, p95 ${t.p95} ms over ${t.runs} requests`);
      show('throughput report', reports.throughput);
      show('quality report', reports.quality);
      show('naive query', reports.naive);
      say(`  first calls (summaries brought up to date): throughput ${fmt(reports.firstCallMs.throughput)} ms, quality ${fmt(reports.firstCallMs.quality)} ms, then ${fmt(reports.settledMs / 1000)} s for the refresh's look-back to pass; ${fmt(reports.pairsInRange)} pairs in ${from}…${to}; figures ${reports.figuresAgree ? 'agree' : `DISAGREE (${reports.disagreements.length})`}`);
    }

    // ---- 4. the web app's JavaScript -----------------------------------------------------------------------------
    say('* 4. web app JavaScript (gzip)');
    const web = existsSync(path.join(config.webDist, 'index.html')) ? await measureWeb(config.webDist) : null;
    if (web) {
      const route = web.largestRoute;
      const where = path.relative(config.root, web.dist);
      say(`  ${where && !where.startsWith('..') ? where : web.dist} (built ${web.builtAt}): initial ${(web.initial.gzipBytes / 1000).toFixed(1)} kB in ${web.initial.files.length} file(s)`);
      if (route) say(`  largest of ${web.routeChunks} route chunks: ${route.file} ${(route.gzipBytes / 1000).toFixed(1)} kB (${(route.addedGzipBytes / 1000).toFixed(1)} kB with the shared chunks it loads)`);
    } else say(`  not measured: no build in ${config.webDist}`);

    // ---- goals ---------------------------------------------------------------------------------------------------
    const at32 = judged[32]!;
    const at8 = judged[8]!;
    const ratiosOf = (connections: number, key: 'throughputRatio' | 'p99Ratio') =>
      `median of ${REDEMPTION_ROUNDS} alternating rounds: ${rounds
        .filter((r) => r.connections === connections)
        .map((r) => r[key].toFixed(2))
        .join(', ')}`;
    const goals: Goal[] = [
      {
        id: 'redemption-throughput',
        goal: 'redemption throughput ≥ 0.6 × bare at 32 connections',
        measured: `${fmt(at32.api.okPerSecond)}/s vs ${fmt(at32.bare.okPerSecond)}/s = ${at32.throughputRatio.toFixed(2)} × (${ratiosOf(32, 'throughputRatio')})`,
        met: at32.throughputRatio >= 0.6,
      },
      {
        id: 'redemption-p99',
        goal: 'redemption p99 ≤ 2 × bare at 8 connections',
        measured: `${at8.api.latencyMs.p99} ms vs ${at8.bare.latencyMs.p99} ms = ${at8.p99Ratio.toFixed(2)} × (${ratiosOf(8, 'p99Ratio')})`,
        met: at8.p99Ratio <= 2,
      },
      {
        id: 'redemption-exact',
        goal: 'final balances exact (granted − redeemed == balance), API and bare',
        measured: `API ${correctness.api.exact ? 'exact' : 'not exact'}, bare ${correctness.bare.exact ? 'exact' : 'not exact'}`,
        met: correctness.api.exact && correctness.bare.exact,
      },
      ...(['search', 'tickets', 'log'] as const).map((key) => {
        const run = counter[key]![8]!;
        return { id: `counter-${key}-p99`, goal: `${endpoints.find((e) => e.key === key)!.label} p99 ≤ 25 ms at 8 connections`, measured: `${run.latencyMs.p99} ms${run.non2xx + run.errors > 0 ? ` (${run.non2xx} non-2xx, ${run.errors} errors)` : ''}`, met: run.latencyMs.p99 <= 25 && run.non2xx + run.errors === 0 };
      }),
      ...(reports.available
        ? [
            { id: 'report-p95', goal: 'reports p95 ≤ 150 ms (90 days, large rink)', measured: `throughput ${reports.throughput.p95} ms, quality ${reports.quality.p95} ms`, met: reports.throughput.p95 <= 150 && reports.quality.p95 <= 150 },
            {
              id: 'report-speedup',
              goal: 'reports ≥ 20 × faster than the naive query (medians)',
              measured: `throughput ${(reports.naive.p50 / reports.throughput.p50).toFixed(1)} ×, quality ${(reports.naive.p50 / reports.quality.p50).toFixed(1)} ×`,
              met: reports.naive.p50 >= 20 * reports.throughput.p50 && reports.naive.p50 >= 20 * reports.quality.p50,
            },
            { id: 'report-figures', goal: 'reports give the naive query’s per-station figures', measured: reports.figuresAgree ? 'agree' : `${reports.disagreements.length} differences`, met: reports.figuresAgree },
          ]
        : [{ id: 'report-p95', goal: 'reports p95 ≤ 150 ms and ≥ 20 × faster than the naive query', measured: 'not measured (no report routes in this build)', met: null }]),
      web
        ? { id: 'web-initial', goal: 'initial JavaScript ≤ 170 kB gzip', measured: `${(web.initial.gzipBytes / 1000).toFixed(1)} kB`, met: web.initial.gzipBytes <= 170_000 }
        : { id: 'web-initial', goal: 'initial JavaScript ≤ 170 kB gzip', measured: `no build in ${config.webDist}`, met: null },
      web?.largestRoute
        ? { id: 'web-route', goal: 'largest route chunk ≤ 60 kB gzip', measured: `${(web.largestRoute.gzipBytes / 1000).toFixed(1)} kB (${path.basename(web.largestRoute.file)})`, met: web.largestRoute.gzipBytes <= 60_000 }
        : { id: 'web-route', goal: 'largest route chunk ≤ 60 kB gzip', measured: 'no route chunk found', met: null },
    ];

    const results: BenchResults = {
      ranAt: startedAt.toISOString(),
      machine: { ...loadMachine(mariadb), loadAverage: { start: loadAtStart, end: loadAverage() } },
      settings: { secondsPerRun: seconds, warmupSeconds: config.warmupSeconds, maxRequestsPerRun: MAX_REQUESTS, redemptionRounds: REDEMPTION_ROUNDS, dbPoolSize: Number(DB_POOL_SIZE), apiBuiltAt: statSync(config.apiEntry).mtime.toISOString(), nodeFlags: config.nodeFlags },
      dataset: {
        ...record.size,
        reused,
        seededAt: record.seededAt,
        seedSeconds: Math.round(record.seconds * 10) / 10,
        counts: record.result.counts,
        largeRink: { name: large.name, slug: large.slug, timeZone: large.timeZone, stations: large.stationIds.length, customers: large.customers },
        ledger: seededLedger,
      },
      redemption: { api: redemption.api, bare: redemption.bare, rounds, correctness },
      counter,
      reports,
      web,
      goals,
    };
    const written = writeResults(path.join(config.root, 'bench'), results);
    say(`\n${written.markdown}`);
    say(`Results in ${path.relative(config.root, written.jsonFile)} and ${path.relative(config.root, written.markdownFile)}.`);
    return 0;
  } finally {
    await handle.close();
  }
}
