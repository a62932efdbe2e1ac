// Entry point of `pnpm bench` (run by tsx, so it can load the TypeScript seed and API settings). It starts what
// the measurements need the way `npm start` does (a database, migrations, builds that are missing), then hands
// over to bench.ts. Settings, all optional:
//   BENCH_DATABASE_URL   a mysql:// URL whose database name ends in _bench (it is dropped and re-created when
//                        the seeded size changes); default: rinkwright_bench on the bootstrapped MariaDB
//   BENCH_RINKS, BENCH_SHARPENINGS, BENCH_LEDGER_ENTRIES   the data set (200, 1,000,000, 300,000)
//   BENCH_SECONDS, BENCH_WARMUP_SECONDS                    each measured run and its warm-up (10, 5: V8 has optimized the hot paths by then)
//   BENCH_API_PORT, BENCH_BARE_PORT                        (3301, 3302)
//   BENCH_WEB_DIST       the web build to weigh (dist/web)
//   BENCH_RESEED=1       seed again even when the marker matches
import { existsSync } from 'node:fs';
import { join } from 'node:path';
import { BootstrapError, DATA, ROOT, ensureDataDirs, fail, loadSecrets, paths } from '../lib/data.mjs';
import { stopMariadb } from '../lib/mariadb.mjs';
import { answers200, onInterrupt, requireFreePorts, spawnDetached, stopGroup, tail, waitUntil } from '../lib/procs.mjs';
import { API_ENTRY, API_NODE_FLAGS, WEB_DIST, demoPorts, mustRun, prepareSystem, rel } from '../lib/services.mjs';

function whole(name, fallback, { min = 1 } = {}) {
  const raw = process.env[name];
  if (raw === undefined || raw === '') return fallback;
  const value = Number(raw.replaceAll('_', ''));
  if (!Number.isInteger(value) || value < min) fail(`${name} must be a whole number of at least ${min}, not "${raw}"`);
  return value;
}

function withDatabase(url, name) {
  const parsed = new URL(url);
  parsed.pathname = `/${name}`;
  return parsed.toString();
}

/** `state.startedDb` is set when the bench started the local MariaDB itself; it then stops it again, as npm test does. */
async function context(state) {
  ensureDataDirs();
  const given = process.env.BENCH_DATABASE_URL;
  if (given) return { databaseUrl: given, authSecret: process.env.BETTER_AUTH_SECRET || loadSecrets().authSecret };
  // The bench never touches the database a DATABASE_URL in the shell names (often a test database).
  delete process.env.DATABASE_URL;
  const system = await prepareSystem({ ports: demoPorts() }, state);
  return { databaseUrl: withDatabase(system.databaseUrl, 'rinkwright_bench'), authSecret: system.authSecret };
}

async function main(state) {
  // Registered first, so that on Ctrl-C it runs last, after the services that use the database have stopped.
  onInterrupt(async () => {
    if (state.startedDb) await stopMariadb();
  });
  const { databaseUrl, authSecret } = await context(state);
  if (!existsSync(API_ENTRY)) await mustRun('API build', process.execPath, ['scripts/build-api.mjs']);
  const webDist = process.env.BENCH_WEB_DIST || WEB_DIST;
  if (!existsSync(join(webDist, 'index.html'))) await mustRun('web build', 'pnpm', ['exec', 'vite', 'build', '--outDir', webDist, '--emptyOutDir']);

  const started = [];
  const stopAll = async () => {
    for (const service of started.splice(0).reverse()) await stopGroup(service.pid);
  };
  const undo = onInterrupt(stopAll);

  /** Starts a service of the bench in its own process group, with its log under .data/logs, and waits for it. */
  async function startService({ name, args, env, port, health }) {
    const taken = await requireFreePorts([{ label: name, port }]);
    if (taken.length > 0) fail(taken.join('\n'));
    const logFile = join(paths.logs, `bench-${name}.log`);
    const child = spawnDetached(process.execPath, args, { env, logFile });
    if (child.pid === undefined) fail(`${name} could not be started`);
    const service = { pid: child.pid, logFile, stop: () => stopGroup(child.pid) };
    started.push(service);
    if (!(await waitUntil(() => answers200(health), { timeoutMs: 60_000, child }))) {
      fail(`${name} did not answer ${health}; last lines of ${rel(logFile)}:\n${tail(logFile)}`);
    }
    return service;
  }

  const { runBench } = await import('./bench.ts');
  try {
    return await runBench({
      root: ROOT,
      dataDir: DATA,
      databaseUrl,
      authSecret,
      apiEntry: API_ENTRY,
      nodeFlags: API_NODE_FLAGS,
      webDist,
      apiPort: whole('BENCH_API_PORT', 3301),
      barePort: whole('BENCH_BARE_PORT', 3302),
      size: {
        rinks: whole('BENCH_RINKS', 200),
        sharpenings: whole('BENCH_SHARPENINGS', 1_000_000),
        ledgerEntries: whole('BENCH_LEDGER_ENTRIES', 300_000),
      },
      seconds: whole('BENCH_SECONDS', 10),
      warmupSeconds: whole('BENCH_WARMUP_SECONDS', 5),
      reseed: process.env.BENCH_RESEED === '1',
      startService,
    });
  } finally {
    await stopAll();
    undo();
  }
}

const state = { startedDb: false };
let code = 1;
try {
  code = await main(state);
} catch (error) {
  console.error(error instanceof BootstrapError ? `\n✗ ${error.message}` : error);
} finally {
  if (state.startedDb) await stopMariadb();
}
process.exit(code);
