import { execFile } from 'node:child_process';
import { mkdtempSync } from 'node:fs';
import { createServer } from 'node:net';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { promisify } from 'node:util';
import { and, eq } from 'drizzle-orm';
import mysql from 'mysql2/promise';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { QualityReport, ThroughputReport } from '@rinkwright/core';
import { connectReportsDb, reportWorkDay, ROLLUP_KEY } from '@rinkwright/db';
import { createService, createSharpening, createStation, createTicket } from '@rinkwright/db/testing';
import { currentDb } from '@rinkwright/db/unscoped';
import { createApp, type AppBundle } from '../../apps/api/src/app';
import { refreshReports } from '../../apps/api/src/features/reports/refresh';
import { randomClientAddress, type Client } from '../support/app';
import { integrationEnv, testEnv } from '../support/env';
import { recreateDatabase } from '../support/fresh-database';
import { createCustomerAt, createRinkWithStaff, type RinkWorld } from '../support/world';

// Reports from a replica: a second MariaDB on loopback follows the primary through its binary log (started by
// scripts/replica.mjs, the same code that starts the primary), and the app reads its reports from it.
// The replica applies only this file's database, created after replication runs, so its whole history reaches
// the replica through the log; the other test files' databases on the same primary are not its business.

const DATABASE = 'rinkwright_replica_test';
const run = promisify(execFile);
const SCRIPT = fileURLToPath(new URL('../../scripts/replica.mjs', import.meta.url));

interface Replica {
  dir: string;
  port: number;
  sock: string;
  serverId: number;
  reportsUrl: string;
}

/** The replica script, with this process's environment (which carries REPLICATION_SOURCE_URL). */
async function replicaScript(args: string[]): Promise<unknown> {
  try {
    const { stdout } = await run(process.execPath, [SCRIPT, ...args], { timeout: 90_000 });
    return JSON.parse(stdout);
  } catch (error) {
    const failed = error as { stderr?: string; message: string };
    throw new Error(`scripts/replica.mjs ${args[0]} failed: ${failed.stderr?.trim() || failed.message}`, { cause: error });
  }
}

function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const server = createServer();
    server.once('error', reject);
    server.listen({ host: '127.0.0.1', port: 0 }, () => {
      const address = server.address();
      server.close(() => (typeof address === 'object' && address ? resolve(address.port) : reject(new Error('no port'))));
    });
  });
}

function withDatabase(url: string, name: string): string {
  const parsed = new URL(url);
  parsed.pathname = `/${name}`;
  return parsed.toString();
}

const dayBefore = (day: string) => new Date(Date.parse(`${day}T00:00:00Z`) - 86_400_000).toISOString().slice(0, 10);

describe('reports from a MariaDB replica', () => {
  const primaryUrl = withDatabase(integrationEnv().DATABASE_URL, DATABASE);
  const dir = mkdtempSync(join(tmpdir(), 'rinkwright-replica-'));
  let replica: Replica;
  let bundle: AppBundle | undefined;
  let primary: mysql.Connection;
  let replicaRoot: mysql.Connection;
  let manager: Client;
  let rink: RinkWorld;
  let station: { id: string };
  let service: { id: string };
  let customer: { id: string };
  let ticketNumber = 0;
  let range: { from: string; to: string };

  /** Blocks until the replica has applied everything the primary has logged so far. */
  async function caughtUp(): Promise<void> {
    const [[logged]] = await primary.query<mysql.RowDataPacket[]>('SELECT @@gtid_binlog_pos AS pos');
    const [[waited]] = await replicaRoot.query<mysql.RowDataPacket[]>('SELECT MASTER_GTID_WAIT(?, 30) AS result', [logged?.pos]);
    expect(waited?.result, `the replica did not reach ${logged?.pos} within 30 s`).toBe(0);
  }

  /** One ticket at the counter, each pair sharpened on the station with the given first readings. */
  async function sharpenPairs(readings: [number, number][]): Promise<void> {
    ticketNumber += 1;
    const made = await createTicket(currentDb(), rink.id, {
      customerId: customer.id,
      serviceId: service.id,
      createdBy: rink.staff.technician.id,
      number: ticketNumber,
      pairs: readings.length,
      stationId: station.id,
    });
    for (const [i, pairId] of made.pairIds.entries()) {
      await createSharpening(currentDb(), rink.id, { ticketId: made.id, pairId, stationId: station.id, technicianId: rink.staff.technician.id, readingsNm: readings[i] });
    }
  }

  async function throughput() {
    const response = await manager.get(`/api/rinks/${rink.slug}/reports/throughput`).query(range);
    expect(response.status, JSON.stringify(response.body)).toBe(200);
    return response.body as ThroughputReport;
  }

  async function quality() {
    const response = await manager.get(`/api/rinks/${rink.slug}/reports/quality`).query(range);
    expect(response.status, JSON.stringify(response.body)).toBe(200);
    return response.body as QualityReport;
  }

  /** Pairs in the primary's own summary rows (each day's rollup row): what a report reading the primary would count. */
  async function primaryPairs(): Promise<number> {
    const w = reportWorkDay;
    const rows = await currentDb()
      .select({ pairs: w.pairs })
      .from(w)
      .where(and(eq(w.tenantId, rink.id), eq(w.stationId, ROLLUP_KEY), eq(w.technicianId, ROLLUP_KEY)));
    return rows.reduce((sum, row) => sum + row.pairs, 0);
  }

  beforeAll(async () => {
    const port = await freePort();
    replica = (await replicaScript(['start', '--dir', dir, '--port', String(port), '--database', DATABASE])) as Replica;
    replicaRoot = await mysql.createConnection({ socketPath: replica.sock, user: 'root' });
    // Made after replication runs, so the replica sees the database created, migrated and filled.
    await recreateDatabase(primaryUrl, '_test');
    primary = await mysql.createConnection({ uri: primaryUrl });

    const env = testEnv({ DATABASE_URL: primaryUrl, REPORTS_DATABASE_URL: replica.reportsUrl });
    bundle = createApp(env);
    const origin = new URL(env.APP_URL).origin;
    rink = await createRinkWithStaff('Ice Harbor Replica');
    station = await createStation(currentDb(), rink.id, { name: 'Bench 1' });
    service = await createService(currentDb(), rink.id);
    customer = await createCustomerAt(rink.id, { name: 'Replica Skater' });
    manager = request.agent(bundle.app).set('Origin', origin).set('X-Forwarded-For', randomClientAddress());
    const signedIn = await manager.post('/api/auth/sign-in/email').send({ email: rink.staff.manager.email, password: rink.staff.manager.password });
    expect(signedIn.status).toBe(200);
    // The reports look the rink up on the replica too.
    await caughtUp();
    const choices = await manager.get(`/api/rinks/${rink.slug}/reports`);
    expect(choices.status).toBe(200);
    const today = (choices.body as { today: string }).today;
    // The day before too, should the pairs below straddle the rink's midnight.
    range = { from: dayBefore(today), to: today };
  }, 120_000);

  afterAll(async () => {
    await bundle?.close();
    await replicaRoot?.end();
    await primary?.query(`DROP DATABASE IF EXISTS \`${DATABASE}\``);
    await primary?.end();
    await replicaScript(['stop', '--dir', dir, '--delete']);
  }, 60_000);

  it('reads the reports through a pool on the replica', async () => {
    const pool = connectReportsDb(replica.reportsUrl).pool;
    const [[row]] = await pool.query<mysql.RowDataPacket[]>('SELECT @@server_id AS id, @@read_only AS readOnly');
    expect(row).toEqual({ id: replica.serverId, readOnly: 1 });
    const [[own]] = await primary.query<mysql.RowDataPacket[]>('SELECT @@server_id AS id');
    expect(own?.id).not.toBe(replica.serverId);
  });

  it('answers with what the primary wrote, once the replica has it', async () => {
    await sharpenPairs([
      [2_540, -2_540],
      [5_080, 0],
      [-7_620, 2_540],
    ]);
    // The summaries are written on the primary; refreshed before the wait, they are in what the replica applies.
    await refreshReports(rink.id);
    await caughtUp();

    const report = await throughput();
    expect(report.totals.pairs).toBe(3);
    expect(report.tables.byStation).toEqual([expect.objectContaining({ stationId: station.id, pairs: 3 })]);
    const checked = await quality();
    expect(checked.totals.firstReadings).toBe(6);
    // |2540| + |-2540| + |5080| + |0| + |-7620| + |2540| = 20,320 nm over six blades, to the whole nanometre.
    expect(checked.totals.meanAbsReadingNm).toBe(3_387);
  });

  it('stays where the replica is while its SQL thread is stopped, and moves on when it resumes', async () => {
    await replicaRoot.query('STOP SLAVE SQL_THREAD');
    try {
      await sharpenPairs([
        [1_270, -1_270],
        [0, 2_540],
      ]);
      await refreshReports(rink.id);
      expect(await primaryPairs()).toBe(5);
      expect((await throughput()).totals.pairs).toBe(3);
    } finally {
      await replicaRoot.query('START SLAVE SQL_THREAD');
    }
    await caughtUp();
    expect((await throughput()).totals.pairs).toBe(5);
    expect((await quality()).totals.firstReadings).toBe(10);
  });
});
