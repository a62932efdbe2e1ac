// Child processes: foreground commands, detached services, their pid files, and waiting for them to answer.
import { spawn, spawnSync } from 'node:child_process';
import {
  closeSync,
  existsSync,
  openSync,
  readFileSync,
  readlinkSync,
  realpathSync,
  rmSync,
  writeFileSync,
} from 'node:fs';
import { createServer } from 'node:net';
import { constants } from 'node:os';
import { ROOT } from './data.mjs';

export const sleep = (ms) => new Promise((resolve) => setTimeout(resolve, ms));

// Ctrl-C in a terminal reaches these by itself, but a plain `kill` of this script (CI timeouts) does not.
const foreground = new Set();

/** Runs a command in the foreground with the terminal's output; resolves with its exit code. Never reads stdin. */
export function run(cmd, args, { env = {}, cwd = ROOT } = {}) {
  return new Promise((resolve) => {
    const child = spawn(cmd, args, { cwd, env: { ...process.env, ...env }, stdio: ['ignore', 'inherit', 'inherit'] });
    foreground.add(child);
    let settled = false;
    const settle = (code) => {
      foreground.delete(child);
      if (!settled) resolve(code);
      settled = true;
    };
    child.on('error', (error) => {
      console.error(`! could not run ${cmd}: ${error.message}`);
      settle(127);
    });
    child.on('exit', (code, signal) => settle(code ?? 128 + (constants.signals[signal] ?? 0)));
  });
}

export function commandExists(cmd) {
  return spawnSync('sh', ['-c', `command -v ${cmd}`], { stdio: 'ignore' }).status === 0;
}

/** Last lines of a log, for the moment a service fails to come up. */
export function tail(file, lines = 40) {
  if (!existsSync(file)) return `(no log at ${file})`;
  return readFileSync(file, 'utf8').trimEnd().split('\n').slice(-lines).join('\n');
}

/**
 * Starts a service in its own process group with its output in a log file, so that it outlives this script and
 * killing the group also ends what it spawned (pnpm and tsx run the real server as a grandchild).
 */
export function spawnDetached(cmd, args, { env = {}, logFile, stdio }) {
  const fd = logFile ? openSync(logFile, 'w') : undefined;
  try {
    const child = spawn(cmd, args, {
      cwd: ROOT,
      env: { ...process.env, ...env },
      detached: true,
      stdio: stdio ?? ['ignore', fd, fd],
    });
    child.on('error', (error) => console.error(`! could not start ${cmd}: ${error.message}`));
    child.unref();
    return child;
  } finally {
    if (fd !== undefined) closeSync(fd);
  }
}

export function groupAlive(pgid) {
  try {
    process.kill(-pgid, 0);
    return true;
  } catch (error) {
    return error.code === 'EPERM';
  }
}

function signalGroup(pgid, signal) {
  try {
    process.kill(-pgid, signal);
  } catch {
    // Already gone.
  }
}

/** SIGTERM to the whole group, SIGKILL for whatever is left after the grace period. */
export async function stopGroup(pgid, graceMs = 5000) {
  if (!groupAlive(pgid)) return;
  signalGroup(pgid, 'SIGTERM');
  const deadline = Date.now() + graceMs;
  while (Date.now() < deadline) {
    if (!groupAlive(pgid)) return;
    await sleep(100);
  }
  signalGroup(pgid, 'SIGKILL');
  while (groupAlive(pgid) && Date.now() < deadline + 2000) await sleep(50);
}

// Pid files outlive reboots; after one, their numbers belong to other programs.
function bootId() {
  try {
    return readFileSync('/proc/sys/kernel/random/boot_id', 'utf8').trim();
  } catch {
    return 'unknown';
  }
}

export function readPids(file) {
  try {
    const stored = JSON.parse(readFileSync(file, 'utf8'));
    return stored.bootId === bootId() ? (stored.procs ?? {}) : {};
  } catch {
    return {};
  }
}

function writePids(file, procs) {
  if (Object.keys(procs).length === 0) rmSync(file, { force: true });
  else writeFileSync(file, `${JSON.stringify({ bootId: bootId(), procs }, null, 2)}\n`);
}

export function recordPid(file, name, pid) {
  writePids(file, { ...readPids(file), [name]: pid });
}

// Every service here is started from the repository root, which tells our leftovers from a recycled pid.
const realRoot = realpathSync(ROOT);
function startedHere(pid) {
  try {
    return readlinkSync(`/proc/${pid}/cwd`) === realRoot;
  } catch (error) {
    // The group leader may be gone while its children still run; they are still ours to stop.
    return error.code === 'ENOENT';
  }
}

/**
 * Stops the groups recorded in a pid file and forgets them: all of them, or only those whose pid is in `only`
 * (what one command started itself, so that it never stops what a later command started).
 */
export async function stopRecorded(file, only) {
  const chosen = Object.entries(readPids(file)).filter(([, pid]) => !only || only.includes(pid));
  await Promise.all(
    chosen.map(async ([name, pid]) => {
      if (groupAlive(pid) && startedHere(pid)) {
        console.log(`- stopping ${name} (pid ${pid})`);
        await stopGroup(pid);
      }
    }),
  );
  const remaining = readPids(file);
  for (const [name, pid] of chosen) if (remaining[name] === pid) delete remaining[name];
  writePids(file, remaining);
}

export function portFree(port) {
  return new Promise((resolve) => {
    const server = createServer();
    server.once('error', () => resolve(false));
    server.listen({ host: '127.0.0.1', port, exclusive: true }, () => server.close(() => resolve(true)));
  });
}

/** Best effort "node (pid 1234)" for the process holding a port, for a useful error message. */
function portOwner(port) {
  const result = spawnSync('ss', ['-Hltnp', `sport = :${port}`], { encoding: 'utf8' });
  const match = /users:\(\("([^"]+)",pid=(\d+)/.exec(result.stdout ?? '');
  return match ? `${match[1]} (pid ${match[2]})` : 'another process';
}

/** Fails with the name of each service whose port is taken, before anything is started. */
export async function requireFreePorts(services) {
  const taken = [];
  for (const { label, port, envVar } of services) {
    if (!(await portFree(port))) {
      const hint = envVar ? `; stop it or choose another port with ${envVar}=...` : '; stop it first';
      taken.push(`port ${port} (${label}) is already in use by ${portOwner(port)}${hint}`);
    }
  }
  return taken;
}

/** Resolves true once `check` does, false on timeout or when the watched child exits first. */
export async function waitUntil(check, { timeoutMs, child, intervalMs = 200 }) {
  const exited = () => child !== undefined && (child.exitCode !== null || child.signalCode !== null);
  const deadline = Date.now() + timeoutMs;
  while (Date.now() < deadline) {
    if (await check()) return true;
    if (exited()) return false;
    await sleep(intervalMs);
  }
  return check();
}

export async function answers200(url) {
  try {
    const response = await fetch(url, { signal: AbortSignal.timeout(2000) });
    await response.body?.cancel();
    return response.status === 200;
  } catch {
    return false;
  }
}

const cleanups = new Set();

/** Work to undo if the user interrupts us (Ctrl-C) or the terminal goes away. */
export function onInterrupt(fn) {
  cleanups.add(fn);
  return () => cleanups.delete(fn);
}

let interrupted = false;
/** True once a signal handler has taken over; the interrupted work should then leave the stopping to it. */
export const isInterrupted = () => interrupted;
for (const signal of ['SIGINT', 'SIGTERM', 'SIGHUP']) {
  process.on(signal, async () => {
    // A second Ctrl-C means "stop cleaning up too".
    if (interrupted) process.exit(130);
    interrupted = true;
    console.log(`\n${signal}: cleaning up`);
    for (const child of foreground) child.kill('SIGTERM');
    for (const fn of [...cleanups].reverse()) {
      try {
        await fn();
      } catch (error) {
        console.error(`! cleanup failed: ${error.message}`);
      }
    }
    process.exit(128 + (constants.signals[signal] ?? 0));
  });
}
