import { randomBytes } from 'node:crypto';
import type { RowDataPacket } from 'mysql2/promise';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { lotValueMinor } from '@rinkwright/core';
import { createDbHandle } from '@rinkwright/db/unscoped';
import { refreshReports } from '../../apps/api/src/features/reports/refresh';
import { checkLedger, grantLoadAccounts, seedBench, type BenchSeedResult } from '../../packages/db/src/bench-seed';
import { buildTestApp } from '../support/app';
import { integrationEnv } from '../support/env';

// The data-size path of `pnpm bench`, at a few thousand rows: the same seeding code, into this database under
// namespaces of its own, checked for its counts, its ledger invariant and its sign-ins, and run through the report
// refresh. The bench itself (millions of rows, load runs) is not part of the test suite.

const app = buildTestApp();
const handle = createDbHandle(integrationEnv().DATABASE_URL, { connectionLimit: 4 });
afterAll(() => handle.close());

const SIZE = { rinks: 3, sharpenings: 3_000, ledgerEntries: 1_200 };
const NOW = new Date('2026-11-20T15:00:00.000Z');
const PASSWORD = 'bench-seed-test-password';
const namespace = () => randomBytes(4).toString('hex');

async function rows(sql: string, values: unknown[]): Promise<RowDataPacket[]> {
  const [result] = await handle.pool.query<RowDataPacket[]>(sql, values);
  return result;
}
const count = async (sql: string, values: unknown[]) => Number((await rows(sql, values))[0]?.n ?? 0);

describe('the bench data set, small', () => {
  let seeded: BenchSeedResult;
  const first = namespace();

  beforeAll(async () => {
    seeded = await seedBench(handle.pool, { ...SIZE, namespace: first, seed: 7, now: NOW, historyDays: 120, password: PASSWORD });
  }, 120_000);

  it('has the sizes asked for', async () => {
    expect(seeded.rinkIds).toHaveLength(3);
    expect(seeded.counts.sharpening).toBe(3_000);
    expect(seeded.counts.credit_entry).toBe(1_200);
    const ids = seeded.rinkIds;
    expect(await count('SELECT COUNT(*) AS n FROM rink WHERE id IN (?)', [ids])).toBe(3);
    expect(await count('SELECT COUNT(*) AS n FROM sharpening WHERE tenant_id IN (?)', [ids])).toBe(3_000);
    expect(await count('SELECT COUNT(*) AS n FROM credit_entry WHERE tenant_id IN (?)', [ids])).toBe(1_200);
    // The large rink holds its fifth of both.
    expect(await count('SELECT COUNT(*) AS n FROM sharpening WHERE tenant_id = ?', [seeded.large.id])).toBe(600);
    expect(await count('SELECT COUNT(*) AS n FROM credit_entry WHERE tenant_id = ?', [seeded.large.id])).toBe(240);
  });

  it('gives every sharpening a first reading per blade, and some blades a re-run', async () => {
    const ids = seeded.rinkIds;
    const withoutPair = await count(
      `SELECT COUNT(*) AS n FROM sharpening s
        WHERE s.tenant_id IN (?)
          AND (SELECT COUNT(DISTINCT r.blade) FROM level_reading r
                WHERE r.tenant_id = s.tenant_id AND r.sharpening_id = s.id AND r.attempt = 1) <> 2`,
      [ids],
    );
    expect(withoutPair).toBe(0);
    expect(await count("SELECT COUNT(*) AS n FROM level_reading WHERE tenant_id IN (?) AND attempt = 1 AND kind = 'sharpening'", [ids])).toBe(6_000);
    expect(await count('SELECT COUNT(*) AS n FROM level_reading WHERE tenant_id IN (?) AND attempt = 2', [ids])).toBeGreaterThan(0);
  });

  it('keeps tickets, pairs and times in order', async () => {
    const ids = seeded.rinkIds;
    // Every pair of a finished ticket is logged once, and no sharpening is done before its drop-off or after now.
    const unlogged = await count(
      `SELECT COUNT(*) AS n FROM ticket_pair p JOIN ticket t ON t.tenant_id = p.tenant_id AND t.id = p.ticket_id
        WHERE p.tenant_id IN (?) AND t.state IN ('ready', 'collected')
          AND NOT EXISTS (SELECT 1 FROM sharpening s WHERE s.tenant_id = p.tenant_id AND s.ticket_pair_id = p.id)`,
      [ids],
    );
    expect(unlogged).toBe(0);
    expect(await count('SELECT COUNT(*) AS n FROM (SELECT ticket_pair_id FROM sharpening WHERE tenant_id IN (?) GROUP BY ticket_pair_id HAVING COUNT(*) > 1) x', [ids])).toBe(0);
    const outOfOrder = await count(
      `SELECT COUNT(*) AS n FROM sharpening s JOIN ticket t ON t.tenant_id = s.tenant_id AND t.id = s.ticket_id
        WHERE s.tenant_id IN (?) AND (s.done_at < t.dropped_at OR s.done_at > ? OR t.ready_at < s.done_at)`,
      [ids, NOW],
    );
    expect(outOfOrder).toBe(0);
    expect(await count("SELECT COUNT(*) AS n FROM ticket WHERE tenant_id = ? AND state IN ('waiting', 'on_station', 'ready')", [seeded.large.id])).toBeGreaterThan(0);
  });

  it('keeps each lot’s remaining at the sum of its entries, and their values at what the credits are worth', async () => {
    const lots = await rows('SELECT id, credits, remaining, price_minor FROM credit_lot WHERE tenant_id IN (?)', [seeded.rinkIds]);
    const entries = await rows('SELECT lot_id, credits, value_minor FROM credit_entry WHERE tenant_id IN (?)', [seeded.rinkIds]);
    const sums = new Map<string, { credits: number; value: number }>();
    for (const e of entries) {
      const sum = sums.get(String(e.lot_id)) ?? { credits: 0, value: 0 };
      sums.set(String(e.lot_id), { credits: sum.credits + Number(e.credits), value: sum.value + Number(e.value_minor) });
    }
    expect(lots.length).toBeGreaterThan(0);
    for (const lot of lots) {
      const sum = sums.get(String(lot.id));
      expect(sum?.credits).toBe(Number(lot.remaining));
      expect(Number(lot.remaining)).toBeGreaterThanOrEqual(0);
      expect(sum?.value).toBe(lotValueMinor({ credits: Number(lot.credits), remaining: Number(lot.remaining), priceMinor: Number(lot.price_minor) }));
    }
    expect(await checkLedger(handle.pool, { tenantIds: seeded.rinkIds })).toEqual({ lots: lots.length, mismatched: 0, negative: 0, valueMismatched: 0 });
  });

  it('has a ledger check that finds a lot out of step with its entries', async () => {
    const [lot] = await rows('SELECT id, tenant_id FROM credit_lot WHERE tenant_id = ? ORDER BY id LIMIT 1', [seeded.rinkIds[1]]);
    await handle.pool.query('UPDATE credit_lot SET remaining = remaining + 1 WHERE tenant_id = ? AND id = ?', [lot?.tenant_id, lot?.id]);
    try {
      expect((await checkLedger(handle.pool, { tenantIds: [String(lot?.tenant_id)] })).mismatched).toBe(1);
    } finally {
      await handle.pool.query('UPDATE credit_lot SET remaining = remaining - 1 WHERE tenant_id = ? AND id = ?', [lot?.tenant_id, lot?.id]);
    }
  });

  it('signs its technician in, and the API redeems from the load accounts it grants', async () => {
    const agent = await app.signIn(seeded.large.technicianEmail, PASSWORD);
    const me = (await agent.get('/api/me').expect(200)).body as { rinks: { slug: string; role: string }[] };
    expect(me.rinks).toEqual([expect.objectContaining({ slug: seeded.large.slug, role: 'technician' })]);

    const load = await grantLoadAccounts(handle.pool, { tenantId: seeded.large.id, count: 2, credits: 3, label: 'Load skater', actorUserId: null });
    for (let i = 0; i < 4; i++) {
      const answer = await agent.post(`/api/rinks/${seeded.large.slug}/customers/${load.customerIds[0]}/redemptions`).set('Idempotency-Key', `bench-seed-test-${i}-${load.customerIds[0]}`).send({});
      expect(answer.status).toBe(i < 3 ? 201 : 409);
    }
    const [balance] = await rows('SELECT SUM(remaining) AS n FROM credit_lot WHERE tenant_id = ? AND account_id IN (?)', [seeded.large.id, load.accountIds]);
    // Granted 6, three redeemed.
    expect(Number(balance?.n)).toBe(load.granted - 3);
    expect(await checkLedger(handle.pool, { tenantIds: [seeded.large.id], accountIds: load.accountIds })).toMatchObject({ lots: 2, mismatched: 0 });
  });

  it('is summed by the report refresh to the same pairs, first readings and re-runs', async () => {
    await refreshReports(seeded.large.id, { full: true });
    const reruns = await count('SELECT COUNT(*) AS n FROM level_reading WHERE tenant_id = ? AND attempt = 2', [seeded.large.id]);
    // The rows themselves, and each of their three rollups ('*': every station, every technician), sum the same.
    for (const grain of ["station_id <> '*' AND technician_id <> '*'", "station_id <> '*' AND technician_id = '*'", "station_id = '*' AND technician_id <> '*'", "station_id = '*' AND technician_id = '*'"]) {
      const [summary] = await rows(`SELECT SUM(pairs) AS pairs, SUM(first_readings) AS first, SUM(reruns) AS reruns FROM report_work_day WHERE tenant_id = ? AND ${grain}`, [seeded.large.id]);
      expect({ grain, pairs: Number(summary?.pairs), first: Number(summary?.first), reruns: Number(summary?.reruns) }).toEqual({ grain, pairs: 600, first: 1_200, reruns });
    }
    const ready = await count('SELECT COUNT(*) AS n FROM ticket WHERE tenant_id = ? AND ready_at IS NOT NULL', [seeded.large.id]);
    expect(await count('SELECT COALESCE(SUM(tickets), 0) AS n FROM report_turnaround WHERE tenant_id = ?', [seeded.large.id])).toBe(ready);
  }, 60_000);

  it('writes the same rows again from the same seed', async () => {
    const second = namespace();
    const again = await seedBench(handle.pool, { ...SIZE, namespace: second, seed: 7, now: NOW, historyDays: 120, password: PASSWORD });
    // Only the seeded rows (their ids carry the namespace), not what the other tests added to these rinks.
    const shape = async (ns: string) =>
      (
        await rows(
          `SELECT (SELECT SUM(passes) FROM sharpening WHERE id LIKE ?) AS passes,
                  (SELECT SUM(reading_nm) FROM level_reading WHERE id LIKE ?) AS readings,
                  (SELECT SUM(value_minor) FROM credit_entry WHERE id LIKE ?) AS value,
                  (SELECT GROUP_CONCAT(name ORDER BY id) FROM customer WHERE id LIKE ?) AS names`,
          Array.from({ length: 4 }, () => `${ns}-%`),
        )
      )[0];
    expect(again.counts).toEqual(seeded.counts);
    expect(await shape(second)).toEqual(await shape(first));
  }, 120_000);
});
