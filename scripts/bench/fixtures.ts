import { randomUUID } from 'node:crypto';
import type { Pool, RowDataPacket } from 'mysql2/promise';

// Rows one bench run needs beside the seeded history: waiting tickets whose pairs the "log a sharpening" runs
// log, one request per pair, and their closing once the runs are over (so the next run's queue is the seeded one).

/** More than the most connections of a run. */
const TICKETS_PER_BLOCK = 64;

export interface LoadPair {
  ticketId: string;
  pairId: string;
  stationId: string;
}

export async function openLoadTickets(
  pool: Pool,
  input: { tenantId: string; customerIds: string[]; stationIds: string[]; serviceId: string; priceMinor: number; createdBy: string; tickets: number; pairsEach: number },
): Promise<{ ticketIds: string[]; pairs: LoadPair[] }> {
  const [[top]] = await pool.query<RowDataPacket[]>('SELECT COALESCE(MAX(number), 0) AS n FROM ticket WHERE tenant_id = ?', [input.tenantId]);
  let number = Number(top?.n ?? 0);
  const now = new Date();
  const tickets: unknown[][] = [];
  const events: unknown[][] = [];
  const pairRows: unknown[][] = [];
  const pairsOf: LoadPair[][] = [];
  const ticketIds: string[] = [];
  for (let t = 0; t < input.tickets; t++) {
    const id = randomUUID();
    ticketIds.push(id);
    number += 1;
    const customerId = input.customerIds[t % input.customerIds.length]!;
    tickets.push([id, input.tenantId, number, customerId, 'waiting', null, 'counter', now, new Date(now.getTime() + 40 * 60_000), input.createdBy]);
    events.push([randomUUID(), input.tenantId, id, null, 'waiting', null, now, input.createdBy]);
    const stationId = input.stationIds[t % input.stationIds.length]!;
    const pairs: LoadPair[] = [];
    for (let p = 0; p < input.pairsEach; p++) {
      const pairId = randomUUID();
      pairRows.push([pairId, input.tenantId, id, p + 1, `Pair ${p + 1}`, 2_900_000, 12_700_000, input.serviceId, input.priceMinor]);
      pairs.push({ ticketId: id, pairId, stationId });
    }
    pairsOf.push(pairs);
  }
  const conn = await pool.getConnection();
  try {
    await conn.beginTransaction();
    for (let i = 0; i < tickets.length; i += 2_000) {
      await conn.query(
        'INSERT INTO ticket (id, tenant_id, number, customer_id, state, station_id, payment, dropped_at, promised_at, created_by) VALUES ?',
        [tickets.slice(i, i + 2_000)],
      );
      await conn.query('INSERT INTO ticket_event (id, tenant_id, ticket_id, from_state, to_state, station_id, at, by_user_id) VALUES ?', [events.slice(i, i + 2_000)]);
    }
    for (let i = 0; i < pairRows.length; i += 2_000) {
      await conn.query('INSERT INTO ticket_pair (id, tenant_id, ticket_id, position, label, blade_width_nm, hollow_nm, service_id, price_minor) VALUES ?', [pairRows.slice(i, i + 2_000)]);
    }
    await conn.commit();
  } catch (error) {
    await conn.rollback();
    throw error;
  } finally {
    conn.release();
  }
  // In blocks of more tickets than connections, every ticket's first pair, then every second one, and so on:
  // requests running side by side never wait on one ticket's lock, and tickets are finished block by block.
  const order: LoadPair[] = [];
  for (let b = 0; b < pairsOf.length; b += TICKETS_PER_BLOCK) {
    const block = pairsOf.slice(b, b + TICKETS_PER_BLOCK);
    for (let p = 0; p < input.pairsEach; p++) for (const pairs of block) order.push(pairs[p]!);
  }
  return { ticketIds, pairs: order };
}

/**
 * Ends the run's tickets as the counter would: fully logged ones are made ready and collected, the rest void.
 * Each move is an event, like the API writes it.
 */
export async function closeLoadTickets(pool: Pool, input: { tenantId: string; ticketIds: string[]; byUserId: string }): Promise<{ collected: number; voided: number }> {
  if (input.ticketIds.length === 0) return { collected: 0, voided: 0 };
  let collected = 0;
  let voided = 0;
  for (let i = 0; i < input.ticketIds.length; i += 1_000) {
    const ids = input.ticketIds.slice(i, i + 1_000);
    const [rows] = await pool.query<RowDataPacket[]>(
      `SELECT t.id, t.state, t.station_id AS stationId,
              (SELECT COUNT(*) FROM ticket_pair p WHERE p.tenant_id = t.tenant_id AND p.ticket_id = t.id) AS pairs,
              (SELECT COUNT(DISTINCT s.ticket_pair_id) FROM sharpening s WHERE s.tenant_id = t.tenant_id AND s.ticket_id = t.id) AS done
         FROM ticket t WHERE t.tenant_id = ? AND t.id IN (?) AND t.state IN ('waiting', 'on_station')`,
      [input.tenantId, ids],
    );
    const now = Date.now();
    const events: unknown[][] = [];
    const done: string[] = [];
    const open: string[] = [];
    for (const row of rows) {
      const finished = Number(row.pairs) > 0 && Number(row.pairs) === Number(row.done);
      if (finished) {
        done.push(String(row.id));
        events.push([randomUUID(), input.tenantId, row.id, row.state, 'ready', row.stationId, null, new Date(now), input.byUserId]);
        events.push([randomUUID(), input.tenantId, row.id, 'ready', 'collected', row.stationId, null, new Date(now + 1), input.byUserId]);
      } else {
        open.push(String(row.id));
        events.push([randomUUID(), input.tenantId, row.id, row.state, 'void', row.stationId, 'The load run ended before every pair was logged', new Date(now), input.byUserId]);
      }
    }
    if (events.length) await pool.query('INSERT INTO ticket_event (id, tenant_id, ticket_id, from_state, to_state, station_id, reason, at, by_user_id) VALUES ?', [events]);
    if (done.length) await pool.query("UPDATE ticket SET state = 'collected', ready_at = ?, collected_at = ? WHERE tenant_id = ? AND id IN (?)", [new Date(now), new Date(now + 1), input.tenantId, done]);
    if (open.length) await pool.query("UPDATE ticket SET state = 'void', void_reason = 'The load run ended before every pair was logged' WHERE tenant_id = ? AND id IN (?)", [input.tenantId, open]);
    collected += done.length;
    voided += open.length;
  }
  return { collected, voided };
}
