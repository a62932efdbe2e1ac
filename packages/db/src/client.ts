import { drizzle, type MySql2Database } from 'drizzle-orm/mysql2';
import type { PoolConnection as CoreConnection } from 'mysql2';
import mysql from 'mysql2/promise';

// No schema is given to Drizzle: nothing here uses its relational queries (db.query), and with a schema every
// transaction would build a query builder for each of our tables.
export type Database = MySql2Database;
export type Transaction = Parameters<Parameters<Database['transaction']>[0]>[0];
export type Executor = Database | Transaction;

/**
 * Statements a transaction sends ahead of its COMMIT, in the same round trip (`Scope.atCommit`): texts in order, and
 * the values for their placeholders. MariaDB stops at the first that fails, so then nothing commits.
 */
export interface CommitTail {
  texts: string[];
  values: unknown[];
}

export interface DbHandle {
  db: Database;
  pool: mysql.Pool;
  /** Runs fn in one transaction, on a connection of its own: committed when fn returns, rolled back when it throws. */
  transaction<R>(fn: (tx: Database, tail: CommitTail) => Promise<R>): Promise<R>;
  close: () => Promise<void>;
}

/**
 * Transactions on connections that run with autocommit off (`TRANSACTIONS`), the way JDBC's setAutoCommit(false)
 * does: InnoDB starts a transaction with the first statement, so none is spent on BEGIN (one of the seven a
 * redemption made), and every one ends in COMMIT or ROLLBACK before its connection goes back to the pool. Only this
 * function takes connections from that pool; a connection it cannot roll back is destroyed, never reused.
 */
function transactionsOn(pool: mysql.Pool): DbHandle['transaction'] {
  const bound = new WeakMap<object, Database>();
  return async (fn) => {
    const conn = await pool.getConnection();
    try {
      let tx = bound.get(conn.connection);
      if (!tx) {
        tx = drizzle(conn, { mode: 'default' });
        bound.set(conn.connection, tx);
      }
      const tail: CommitTail = { texts: [], values: [] };
      const result = await fn(tx, tail);
      await conn.query([...tail.texts, 'COMMIT'].join(';\n'), tail.values);
      conn.release();
      return result;
    } catch (error) {
      await conn.query('ROLLBACK').then(
        () => conn.release(),
        () => conn.destroy(),
      );
      throw error;
    }
  };
}

export function createDbHandle(url: string, options: { connectionLimit?: number } = {}): DbHandle {
  const pool = createPool(url, options, SESSION);
  const transactions = createPool(url, options, TRANSACTIONS);
  const db = drizzle(pool, { mode: 'default' });
  return { db, pool, transaction: transactionsOn(transactions), close: async () => void (await Promise.all([pool.end(), transactions.end()])) };
}

/**
 * What every connection sets when it opens. MariaDB caches a correlated subquery's results in a temporary table it
 * builds for each statement; ours are index lookups keyed by the outer row (a ticket's pair count, a lot's product
 * name), so the cache rarely hits and building it is the cost: the open-ticket list spent about 40% of its server
 * time on it.
 */
const SESSION = "optimizer_switch = 'subquery_cache=off'";
/** The transaction pool's connections: the same, with autocommit off (`transactionsOn`). */
const TRANSACTIONS = `${SESSION}, autocommit = 0`;

function createPool(url: string, options: { connectionLimit?: number }, settings: string): mysql.Pool {
  const pool = mysql.createPool({
    uri: url,
    // Times are UTC in the database (stack notes: without this mysql2 converts to the process zone).
    timezone: 'Z',
    connectionLimit: options.connectionLimit ?? 10,
    supportBigNumbers: true,
    dateStrings: false,
    // mysql2 otherwise captures a stack trace for every query, to name the caller if it fails: about 5% of the
    // API's CPU on a counter write. Drizzle's error still carries the query, and Node's async stack the caller.
    trace: false,
    // A scope sends the statements of one step of a write together, in one round trip (`Scope.together`): each
    // round trip is a socket write and a wake-up on both sides, which were a third of the API's CPU on a logged
    // pair. Every statement is built by Drizzle with its values as placeholders, none from text a caller wrote.
    multipleStatements: true,
  });
  // The SET is queued on a new connection before anything else can be sent on it; a connection that refuses it is
  // destroyed, so what was queued behind it fails rather than runs without the settings.
  pool.on('connection', (connection) => {
    // mysql2 hands this event its callback connection, not the promise one its types name.
    const core = connection as unknown as CoreConnection;
    core.query(`SET SESSION ${settings}`, (error) => {
      if (error) core.destroy();
    });
  });
  return pool;
}

let current: DbHandle | undefined;

/** Opens the process-wide pool that scoped() and the repositories use. */
export function connectDb(url: string, options?: { connectionLimit?: number }): DbHandle {
  if (current) return current;
  current = createDbHandle(url, options);
  return current;
}

export async function disconnectDb(): Promise<void> {
  const handle = current;
  current = undefined;
  await handle?.close();
}

let reports: DbHandle | undefined;

/**
 * Opens the pool the reports read through: a replica's URL when the platform runs one, so the heavy reads stay
 * off the primary. Without it reports read from the main pool.
 */
export function connectReportsDb(url: string, options?: { connectionLimit?: number }): DbHandle {
  if (reports) return reports;
  reports = createDbHandle(url, options);
  return reports;
}

export async function disconnectReportsDb(): Promise<void> {
  const handle = reports;
  reports = undefined;
  await handle?.close();
}

/** The database reports read from (the replica when one is connected). */
export function reportsDb(): Database {
  return reports?.db ?? currentDb();
}

export function currentDb(): Database {
  return connected().db;
}

/** Runs fn in one transaction on the process-wide database: see `transactionsOn`. */
export function transaction<R>(fn: (tx: Database, tail: CommitTail) => Promise<R>): Promise<R> {
  return connected().transaction(fn);
}

function connected(): DbHandle {
  if (!current) throw new Error('Database not connected: call connectDb(url) at start-up');
  return current;
}

export async function pingDb(): Promise<boolean> {
  try {
    await current?.pool.query('SELECT 1');
    return current !== undefined;
  } catch {
    return false;
  }
}

/** A unique-key violation from MariaDB, whether mysql2's error or Drizzle's wrapper around it. */
export function isDuplicateKey(error: unknown): boolean {
  const e = error as { code?: unknown; cause?: { code?: unknown } } | null;
  return e?.code === 'ER_DUP_ENTRY' || e?.cause?.code === 'ER_DUP_ENTRY';
}
