// Layout of the local state folder, and the secrets generated once per checkout.
import { randomBytes } from 'node:crypto';
import { chmodSync, mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';

export const ROOT = dirname(dirname(dirname(fileURLToPath(import.meta.url))));
export const DATA = join(ROOT, '.data');

export const paths = {
  logs: join(DATA, 'logs'),
  mail: join(DATA, 'mail'),
  results: join(DATA, 'test-results'),
  secrets: join(DATA, 'secrets.json'),
  pids: join(DATA, 'pids.json'),
  testPids: join(DATA, 'test-pids.json'),
  mariadbDir: join(DATA, 'mariadb'),
  mariadbSock: join(DATA, 'mariadb.sock'),
  mariadbPid: join(DATA, 'mariadb.pid'),
  mariadbLog: join(DATA, 'logs', 'mariadb.log'),
};

export class BootstrapError extends Error {}

/** Ends the current command with a message meant for a person, not a stack trace. */
export function fail(message) {
  throw new BootstrapError(message);
}

export function ensureDataDirs() {
  mkdirSync(DATA, { recursive: true });
  // The root account on the database socket has no password, so only this user may reach the folder.
  chmodSync(DATA, 0o700);
  for (const dir of [paths.logs, paths.results]) mkdirSync(dir, { recursive: true });
}

const HEX = /^[0-9a-f]+$/;

function readSecretsFile() {
  try {
    return JSON.parse(readFileSync(paths.secrets, 'utf8'));
  } catch (error) {
    if (error.code === 'ENOENT') return {};
    console.warn(`! ${paths.secrets} is unreadable (${error.message}); generating new secrets`);
    return {};
  }
}

/**
 * Returns { dbPassword, authSecret }, creating whichever is missing. The database password is re-applied on every
 * run, so a regenerated one stays in sync with the server.
 */
export function loadSecrets() {
  const stored = readSecretsFile();
  const valid = (value, minLength) => typeof value === 'string' && value.length >= minLength && HEX.test(value);
  const secrets = {
    dbPassword: valid(stored.dbPassword, 32) ? stored.dbPassword : randomBytes(24).toString('hex'),
    authSecret: valid(stored.authSecret, 32) ? stored.authSecret : randomBytes(32).toString('hex'),
  };
  if (secrets.dbPassword !== stored.dbPassword || secrets.authSecret !== stored.authSecret) {
    writeFileSync(paths.secrets, `${JSON.stringify(secrets, null, 2)}\n`, { mode: 0o600 });
  }
  return secrets;
}
