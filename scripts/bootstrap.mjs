#!/usr/bin/env node
// Entry point of npm start / test / run stop / run dev. Plain Node on purpose: it runs before any dependency exists.
import { existsSync, mkdirSync, readFileSync } from 'node:fs';
import { BootstrapError, fail, paths } from './lib/data.mjs';
import { stopMariadb } from './lib/mariadb.mjs';
import { isInterrupted, onInterrupt, recordPid, requireFreePorts, spawnDetached, stopRecorded } from './lib/procs.mjs';
import {
  API_ENTRY,
  apiEnv,
  apiService,
  demoPorts,
  fakeServices,
  installTools,
  migrateAndSeed,
  mustRun,
  prepareSystem,
  rel,
  startServices,
} from './lib/services.mjs';
import { test } from './lib/test-command.mjs';

// The same list the seed's users come from.
const demo = JSON.parse(readFileSync(new URL('../packages/db/src/demo-sign-ins.json', import.meta.url), 'utf8'));
const VITE_PORT = 5173;

async function start() {
  const ports = demoPorts();
  await installTools();
  const context = await prepareSystem({ ports });
  await migrateAndSeed(context);
  await mustRun('build', 'pnpm', ['build']);
  if (!existsSync(API_ENTRY)) fail(`the build did not produce ${rel(API_ENTRY)}`);

  // A previous start (or dev) holds the same ports.
  await stopRecorded(paths.pids);
  mkdirSync(paths.mail, { recursive: true });
  const owned = [];
  const undo = onInterrupt(() => stopRecorded(paths.pids, owned));
  await startServices([...fakeServices(ports, paths.mail), apiService(context, ports)], paths.pids, owned);
  undo();

  const width = Math.max(...demo.signIns.map(({ email }) => email.length));
  console.log(
    [
      '',
      'Rinkwright is running.',
      `  App:    http://127.0.0.1:${ports.api}`,
      `  Inbox:  http://127.0.0.1:${ports.mailWeb}   (every e-mail the app sends lands here)`,
      '',
      `Demo sign-ins, all with the password ${demo.password}:`,
      ...demo.signIns.map(({ email, who }) => `  ${email.padEnd(width)}  ${who}`),
      '',
      `Logs are in ${rel(paths.logs)}/. Stop everything with: npm run stop`,
    ].join('\n'),
  );
}

async function stop() {
  await stopRecorded(paths.pids);
  await stopMariadb();
  console.log('Rinkwright is stopped.');
}

/** Waits for the first of the named children to end; resolves with its name and exit code. */
function firstExit(children) {
  return new Promise((resolve) => {
    for (const [name, child] of Object.entries(children)) {
      child.once('exit', (code, signal) => resolve({ name, code: code ?? 1, how: signal ?? `exit ${code}` }));
      child.once('error', () => resolve({ name, code: 1, how: 'could not start' }));
    }
  });
}

async function dev() {
  const ports = demoPorts();
  await installTools();
  const context = await prepareSystem({ ports });
  await migrateAndSeed(context);

  await stopRecorded(paths.pids);
  const taken = await requireFreePorts([
    { label: 'API', port: ports.api, envVar: ports.vars.api },
    { label: 'Vite dev server', port: VITE_PORT },
  ]);
  if (taken.length > 0) fail(taken.join('\n'));
  mkdirSync(paths.mail, { recursive: true });
  // Only what this dev session started: a later `npm start` may already have replaced it.
  const owned = [];
  onInterrupt(() => stopRecorded(paths.pids, owned));
  await startServices(fakeServices(ports, paths.mail), paths.pids, owned);

  // The SPA comes from Vite here, so the API must not serve a stale build of it.
  const env = { ...apiEnv(context, ports), NODE_ENV: 'development', APP_URL: `http://127.0.0.1:${VITE_PORT}` };
  delete env.WEB_DIST;
  // Own process groups, so that Ctrl-C reaches only this script, which then stops everything in order.
  const stdio = ['ignore', 'inherit', 'inherit'];
  const api = spawnDetached('pnpm', ['exec', 'tsx', 'watch', 'apps/api/src/server.ts'], { env, stdio });
  // --strictPort: the API trusts the origin on 5173 only, so Vite must not drift to another port.
  const viteArgs = ['exec', 'vite', '--host', '127.0.0.1', '--port', String(VITE_PORT), '--strictPort'];
  const web = spawnDetached('pnpm', viteArgs, { stdio });
  const servers = { 'api-dev': api, 'web-dev': web };
  for (const [name, child] of Object.entries(servers)) {
    child.ref();
    if (child.pid !== undefined) {
      recordPid(paths.pids, name, child.pid);
      owned.push(child.pid);
    }
  }
  console.log(
    `\nDev servers: web http://127.0.0.1:${VITE_PORT} (API on ${ports.api}), ` +
      `inbox http://127.0.0.1:${ports.mailWeb}. Ctrl-C stops them all.\n`,
  );
  const ended = await firstExit(servers);
  // Ctrl-C ends the dev servers too; the signal handler is already stopping everything and will exit.
  if (isInterrupted()) return new Promise(() => {});
  console.log(`\n${ended.name} ended (${ended.how}); stopping the rest`);
  await stopRecorded(paths.pids, owned);
  return ended.code;
}

const commands = { start, stop, dev, test };
const name = process.argv[2] ?? '';
const command = commands[name];
if (!command) {
  console.error(`usage: node scripts/bootstrap.mjs ${Object.keys(commands).join('|')}`);
  process.exit(2);
}
try {
  const code = await command();
  process.exit(typeof code === 'number' ? code : 0);
} catch (error) {
  console.error(error instanceof BootstrapError ? `\n✗ ${error.message}` : error);
  process.exit(1);
}
