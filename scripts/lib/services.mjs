// What start, dev and test share: the common bootstrap, the ports, and the services they run.
import { dirname, join, relative } from 'node:path';
import { ROOT, ensureDataDirs, fail, loadSecrets, paths } from './data.mjs';
import { CHROMIUM, MARIADB, ensurePnpm, ensureSystemPackages, installDependencies } from './install.mjs';
import { databaseUrl, ensureMariadb, setupDatabase, setupReplicationUser } from './mariadb.mjs';
import {
  answers200,
  recordPid,
  requireFreePorts,
  run,
  spawnDetached,
  stopRecorded,
  tail,
  waitUntil,
} from './procs.mjs';

export const WEB_DIST = join(ROOT, 'dist', 'web');
export const API_ENTRY = join(ROOT, 'apps', 'api', 'dist', 'server.js');
/**
 * Node's flags for the API (and, in the bench, the bare endpoint):
 * - a young generation of 64 MB a half (V8's default is 16 MB) means fewer scavenges under load: 3-5% less CPU per
 *   request in the bench's side-by-side runs, for up to about 100 MB more memory;
 * - no allocation-site pretenuring: V8 otherwise starts allocating objects of a hot allocation site straight in the
 *   old generation once many of them survived a scavenge. Request objects that die there keep the young objects they
 *   point to alive through every scavenge until the next full collection, which made scavenges of 10-15 ms. Without
 *   it, and with Express's prototype switch gone (apps/api/src/http/server.ts), they take 2-4 ms (DEVELOPERS.md).
 */
export const API_NODE_FLAGS = ['--max-semi-space-size=64', '--no-allocation-site-pretenuring'];

function envPort(name, fallback) {
  const raw = process.env[name];
  if (raw === undefined || raw === '') return fallback;
  const port = Number(raw);
  if (!Number.isInteger(port) || port < 1 || port > 65535) fail(`${name} must be a port number, not "${raw}"`);
  return port;
}

function portsFrom(vars, defaults) {
  const ports = Object.fromEntries(Object.entries(defaults).map(([key, port]) => [key, envPort(vars[key], port)]));
  return { ...ports, vars };
}

/** The demo's ports (npm start, npm run dev), each overridable by the variable the app itself reads. */
export const demoPorts = () =>
  portsFrom(
    { db: 'DB_PORT', smtp: 'SMTP_PORT', mailWeb: 'MAIL_WEB_PORT', stripe: 'STRIPE_FAKE_PORT', api: 'PORT' },
    { db: 3407, smtp: 1025, mailWeb: 1080, stripe: 12111, api: 3000 },
  );

/** The test run's own ports, so that a running demo is left alone; the database server is shared. */
export const testPorts = () =>
  portsFrom(
    {
      db: 'DB_PORT',
      smtp: 'TEST_SMTP_PORT',
      mailWeb: 'TEST_MAIL_WEB_PORT',
      stripe: 'TEST_STRIPE_FAKE_PORT',
      api: 'E2E_PORT',
    },
    { db: 3407, smtp: 2025, mailWeb: 2080, stripe: 12112, api: 3100 },
  );

export const rel = (file) => relative(ROOT, file);

/** Runs a required step; a failure ends the command. */
export async function mustRun(label, cmd, args, env) {
  console.log(`* ${label}: ${cmd} ${args.join(' ')}`);
  const code = await run(cmd, args, { env });
  if (code !== 0) fail(`${label} failed (exit ${code}, see above)`);
}

export async function installTools() {
  ensureDataDirs();
  await ensurePnpm();
  await installDependencies();
}

/**
 * Everything the app needs from the machine: system packages, secrets and a database. `state.startedDb` is set as
 * soon as a server is started, so that a caller can stop it even when a later step fails.
 */
export async function prepareSystem({ ports, browser = false }, state = {}) {
  const external = process.env.DATABASE_URL;
  await ensureSystemPackages([...(external ? [] : [MARIADB]), ...(browser ? [CHROMIUM] : [])]);
  const secrets = loadSecrets();
  const authSecret = process.env.BETTER_AUTH_SECRET || secrets.authSecret;
  if (external) {
    console.log('- using DATABASE_URL from the environment; no local MariaDB');
    return { databaseUrl: external, authSecret };
  }
  const { startedHere, port } = await ensureMariadb({ port: ports.db });
  state.startedDb = startedHere;
  setupDatabase(secrets.dbPassword);
  const replicationSourceUrl = setupReplicationUser(port);
  return { databaseUrl: databaseUrl(secrets.dbPassword, port), authSecret, replicationSourceUrl };
}

export async function migrateAndSeed({ databaseUrl: url, authSecret }) {
  const env = { DATABASE_URL: url, BETTER_AUTH_SECRET: authSecret };
  await mustRun('migrations', 'pnpm', ['exec', 'tsx', 'packages/db/src/migrate.ts'], env);
  await mustRun('demo data', 'pnpm', ['exec', 'tsx', 'packages/db/src/seed.ts'], env);
}

export function apiEnv({ databaseUrl: url, authSecret }, ports) {
  return {
    NODE_ENV: 'production',
    HOST: '127.0.0.1',
    PORT: String(ports.api),
    APP_URL: `http://127.0.0.1:${ports.api}`,
    DATABASE_URL: url,
    BETTER_AUTH_SECRET: authSecret,
    SMTP_HOST: '127.0.0.1',
    SMTP_PORT: String(ports.smtp),
    MAIL_INBOX_URL: `http://127.0.0.1:${ports.mailWeb}`,
    STRIPE_API_BASE: `http://127.0.0.1:${ports.stripe}`,
    WEB_DIST,
  };
}

/** The mail and payment fakes; `logPrefix` keeps a test run's logs apart from the demo's. */
export function fakeServices(ports, mailDir, logPrefix = '') {
  return [
    {
      name: 'maildev',
      label: 'mail fake',
      log: `${logPrefix}maildev`,
      ports: [
        { label: 'mail fake SMTP', port: ports.smtp, envVar: ports.vars.smtp },
        { label: 'mail fake inbox', port: ports.mailWeb, envVar: ports.vars.mailWeb },
      ],
      cmd: join(ROOT, 'node_modules', '.bin', 'maildev'),
      // Both listeners default to all interfaces; the inbox shows every message, so keep it on loopback.
      args: [
        ...['--smtp', String(ports.smtp), '--ip', '127.0.0.1'],
        ...['--web', String(ports.mailWeb), '--web-ip', '127.0.0.1'],
        ...['--mail-directory', mailDir],
      ],
      health: `http://127.0.0.1:${ports.mailWeb}/api/healthz`,
    },
    {
      name: 'stripe-fake',
      label: 'payment fake',
      log: `${logPrefix}stripe-fake`,
      ports: [{ label: 'payment fake', port: ports.stripe, envVar: ports.vars.stripe }],
      // Loading tsx as a hook keeps the server in one process, so the recorded pid is the server itself.
      cmd: process.execPath,
      args: ['--import', 'tsx', 'apps/stripe-fake/src/server.ts'],
      // The demo's payment objects outlive a restart (its database does too); the tests' start empty each run.
      env: { STRIPE_FAKE_HOST: '127.0.0.1', STRIPE_FAKE_PORT: String(ports.stripe), ...(logPrefix ? { STRIPE_FAKE_RETRY_BASE_MS: '250' } : { STRIPE_FAKE_STATE_FILE: join(dirname(mailDir), 'stripe-fake.json') }) },
      health: `http://127.0.0.1:${ports.stripe}/health`,
    },
  ];
}

export function apiService(context, ports) {
  return {
    name: 'api',
    label: 'API',
    log: 'api',
    ports: [{ label: 'API', port: ports.api, envVar: ports.vars.api }],
    cmd: process.execPath,
    args: [...API_NODE_FLAGS, API_ENTRY],
    env: apiEnv(context, ports),
    health: `http://127.0.0.1:${ports.api}/api/health`,
    timeoutMs: 60_000,
  };
}

/**
 * Starts services detached, records their pids (in the file, and in `owned` for the caller) as soon as they exist,
 * and waits until each answers its health URL. On any failure the ones just started are stopped again and the error
 * carries the tail of each failed log.
 */
export async function startServices(services, pidFile, owned = []) {
  const taken = await requireFreePorts(services.flatMap((service) => service.ports));
  if (taken.length > 0) fail(taken.join('\n'));

  const started = services.map((service) => {
    const logFile = join(paths.logs, `${service.log}.log`);
    const child = spawnDetached(service.cmd, service.args, { env: service.env, logFile });
    if (child.pid !== undefined) {
      recordPid(pidFile, service.name, child.pid);
      owned.push(child.pid);
    }
    return { ...service, child, logFile };
  });
  const results = await Promise.all(
    started.map(async (service) => {
      const timeoutMs = service.timeoutMs ?? 30_000;
      const ok = await waitUntil(() => answers200(service.health), { timeoutMs, child: service.child });
      return { service, ok, timeoutMs };
    }),
  );
  const failed = results.filter((result) => !result.ok);
  if (failed.length === 0) return;
  await stopRecorded(
    pidFile,
    started.map((service) => service.child.pid),
  );
  fail(failed.map(({ service, timeoutMs }) => describeFailure(service, timeoutMs)).join('\n\n'));
}

function describeFailure({ label, child, health, logFile }, timeoutMs) {
  const what =
    child.pid === undefined
      ? 'could not be started'
      : child.exitCode !== null || child.signalCode !== null
        ? `ended (${child.signalCode ?? `exit ${child.exitCode}`}) before answering ${health}`
        : `did not answer ${health} within ${timeoutMs / 1000} s`;
  return `${label} ${what}; last lines of ${rel(logFile)}:\n${tail(logFile)}`;
}
