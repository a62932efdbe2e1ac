#!/usr/bin/env node
// MariaDB servers in a folder of their own, started by the same code as the checkout's primary:
//
//   node scripts/replica.mjs primary --dir DIR --port PORT
//       a primary with a binary log, an app user and a replication user (for local runs beside a shared server)
//   REPLICATION_SOURCE_URL=mysql://... node scripts/replica.mjs start --dir DIR --port PORT --database NAME...
//       a read-only replica of that primary, applying only the named databases; its server id is its port
//   node scripts/replica.mjs stop --dir DIR [--delete]
//
// Each prints one JSON object on stdout (URLs included); progress goes to stderr. The source URL comes from the
// environment because it carries a password, which would show in `ps` as an argument.
import { existsSync, readdirSync, rmSync } from 'node:fs';
import { resolve } from 'node:path';
import { parseArgs } from 'node:util';
import { BootstrapError, fail } from './lib/data.mjs';
import {
  databaseUrl,
  ensureMariadb,
  ensureServerDir,
  loadPasswords,
  serverIn,
  setupDatabase,
  setupReader,
  setupReplicationUser,
  startReplication,
  stopMariadb,
} from './lib/mariadb.mjs';

console.log = console.error;

const { positionals, values } = parseArgs({
  allowPositionals: true,
  options: {
    dir: { type: 'string' },
    port: { type: 'string' },
    'server-id': { type: 'string' },
    database: { type: 'string', multiple: true, default: [] },
    delete: { type: 'boolean', default: false },
  },
});

function portOption() {
  const port = Number(values.port);
  if (!Number.isInteger(port) || port < 1024 || port > 65535) fail('--port must be a port number from 1024 to 65535');
  return port;
}

function dirOption() {
  if (!values.dir) fail('--dir is required: the folder that holds the server (data, socket, logs, passwords)');
  return resolve(values.dir);
}

async function startPrimary() {
  const dir = dirOption();
  const port = portOption();
  ensureServerDir(dir);
  const server = serverIn(dir);
  const { appPassword } = loadPasswords(server.credentials, ['appPassword']);
  const started = await ensureMariadb({ port, server, role: 'primary', serverId: Number(values['server-id'] ?? 1) });
  setupDatabase(appPassword, server);
  const replicationSourceUrl = setupReplicationUser(started.port, { server, secretsFile: server.credentials });
  return { role: 'primary', dir, port: started.port, sock: server.sock, databaseUrl: databaseUrl(appPassword, started.port), replicationSourceUrl };
}

async function startReplica() {
  const dir = dirOption();
  const port = portOption();
  const sourceUrl = process.env.REPLICATION_SOURCE_URL;
  if (!sourceUrl) fail('REPLICATION_SOURCE_URL must name the primary (the test command sets it; see DEVELOPERS.md)');
  const databases = values.database;
  if (databases.length === 0) fail('--database is required: the databases the replica applies (one flag each)');
  // Unique among the servers on this machine, as a replica's id must be among its primary's replicas.
  const serverId = Number(values['server-id'] ?? port);
  ensureServerDir(dir);
  const server = serverIn(dir);
  const { readerPassword } = loadPasswords(server.credentials, ['readerPassword']);
  const started = await ensureMariadb({ port, server, role: 'replica', serverId, databases });
  await startReplication(server, { sourceUrl, serverId, created: started.created });
  const reportsUrl = setupReader(started.port, databases, { server, password: readerPassword });
  return { role: 'replica', dir, port: started.port, sock: server.sock, serverId, databases, reportsUrl };
}

async function stop() {
  const dir = dirOption();
  const server = serverIn(dir);
  await stopMariadb(server);
  if (values.delete && existsSync(dir)) {
    // Only a folder this script made (or an empty one) is deleted, so a mistyped --dir cannot take anything else.
    if (!existsSync(server.credentials) && readdirSync(dir).length > 0) fail(`${dir} was not made by this script; left as it is`);
    rmSync(dir, { recursive: true, force: true });
  }
  return { stopped: dir, deleted: values.delete };
}

const commands = { primary: startPrimary, start: startReplica, stop };

try {
  const command = commands[positionals[0] ?? ''];
  if (!command) fail(`usage: node scripts/replica.mjs ${Object.keys(commands).join('|')} --dir DIR [...] (see the top of this file)`);
  process.stdout.write(`${JSON.stringify(await command())}\n`);
} catch (error) {
  console.error(error instanceof BootstrapError ? `✗ ${error.message}` : error);
  process.exitCode = 1;
}
