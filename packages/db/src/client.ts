import { drizzle, type MySql2Database } from 'drizzle-orm/mysql2';
import type { PoolConnection as CoreConnection } from 'mysql2';
import mysql from 'mysql2/promise';

// No schema is given to Drizzle: nothing here uses its relational queries (db.query), and with a schema every
// transaction would build a query builder for each of our tables.
export type Database = MySql2Database;
export type Transaction = Parameters<Parameters<Database['transaction']>[0]>[0];
export type Executor = Database | Transaction;

/** One of our built-once statements (`scope.ts`) with the values for its placeholders (`?`), in order. */
export interface Statement {
  text: string;
  values: unknown[];
}

/**
 * Statements a transaction sends ahead of its COMMIT, in the same round trip (`Scope.atCommit`), in order. MariaDB
 * stops at the first that fails, so then nothing commits.
 */
export interface CommitTail {
  statements: Statement[];
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
      const tail: CommitTail = { statements: [] };
      const result = await fn(tx, tail);
      await sendStatements(conn, tail.statements, 'COMMIT');
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

/**
 * Our statements run as MariaDB's server-side prepared statements, one name per text: the first time a connection
 * sends one it sends `PREPARE name FROM 'text'` ahead of the round trip's statements, and from then on `EXECUTE name
 * USING …` with the values (as literals, escaped as mysql2 escapes a query's values). MariaDB then parses each
 * statement once per connection instead of on every call: parsing was a sixth of its CPU on a logged pair, whose
 * statements run to 1 kB of text each. The round trips stay as they were; the results are the statements' own.
 * The server caps the statements prepared at once (`max_prepared_stmt_count`, 16,382 across its connections): when
 * it refuses one, no statement of the round trip has run yet (the PREPAREs come first), so the round trip goes again
 * as plain text and that connection prepares no more. A process names at most `MAX_NAMED` texts.
 */
const statementNames = new Map<string, string>();
const MAX_NAMED = 500;
const preparedOn = new WeakMap<CoreConnection, Set<string> | 'refused'>();
const ER_MAX_PREPARED_STMT_COUNT_REACHED = 1461;

function nameOf(text: string): string | undefined {
  let name = statementNames.get(text);
  if (name === undefined && statementNames.size < MAX_NAMED) statementNames.set(text, (name = `rw_${statementNames.size + 1}`));
  return name;
}

/** A connection of the pool, or one a transaction holds: mysql2's promise wrappers. */
type Client = mysql.Pool | mysql.PoolConnection;

/**
 * Sends the statements in one round trip (one multi-statement query) on the client's connection, then `after` (plain
 * text without values, such as COMMIT), and gives each statement's result in order. Rows come as arrays with dates
 * as text, as Drizzle's own statements read them (`scope.ts` maps them as Drizzle does). Drizzle gets the dates as
 * text through a type cast called for every field, which made mysql2 build an object with three functions for each
 * field of each result: a tenth of what a logged pair allocated.
 */
export async function sendStatements(client: Client, statements: Statement[], after?: string): Promise<unknown[]> {
  if (!('release' in client)) {
    const conn = await client.getConnection();
    try {
      return await sendStatements(conn, statements, after);
    } finally {
      conn.release();
    }
  }
  const core = client.connection as unknown as CoreConnection;
  const known = preparedOn.get(core);
  const prepared = known === 'refused' ? undefined : (known ?? new Set<string>());
  const prepares: string[] = [];
  const added: string[] = [];
  const texts = statements.map(({ text, values }) => {
    const name = prepared ? nameOf(text) : undefined;
    if (prepared === undefined || name === undefined) return core.format(text, values);
    if (!prepared.has(name) && !added.includes(name)) {
      prepares.push(`PREPARE ${name} FROM ${core.escape(text)}`);
      added.push(name);
    }
    return values.length === 0 ? `EXECUTE ${name}` : core.format(`EXECUTE ${name} USING ${values.map(() => '?').join(', ')}`, values);
  });
  const all = [...prepares, ...texts, ...(after === undefined ? [] : [after])];
  let results: unknown[];
  try {
    const [result] = await client.query({ sql: all.join(';\n'), rowsAsArray: true, dateStrings: true });
    // mysql2 nests the results only when there is more than one.
    results = all.length === 1 ? [result] : (result as unknown[]);
  } catch (error) {
    if ((error as { errno?: unknown }).errno !== ER_MAX_PREPARED_STMT_COUNT_REACHED) throw error;
    preparedOn.set(core, 'refused');
    return sendStatements(client, statements, after);
  }
  if (prepared) {
    for (const name of added) prepared.add(name);
    preparedOn.set(core, prepared);
  }
  return results.slice(prepares.length, prepares.length + statements.length);
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
