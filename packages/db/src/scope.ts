import * as drizzleOrm from 'drizzle-orm';
import { and, count as countFn, eq, fillPlaceholders, getTableColumns, sql, type Placeholder, type SQL } from 'drizzle-orm';
import { getTableConfig, type AnyMySqlColumn, type MySqlTable } from 'drizzle-orm/mysql-core';
import { currentDb, reportsDb, sendStatements, transaction, type CommitTail, type Executor, type Statement } from './client';
import { rink } from './schema/index';
import { isTenantTable } from './tenancy';

// The one door to tenant data. Every read, update and delete made through a scope carries
// `tenant_id = ?`, and every insert sets tenant_id; callers cannot pass a tenant of their own.

type Row<T extends MySqlTable> = T['$inferSelect'];
type NewRow<T extends MySqlTable> = T['$inferInsert'];
/** What a caller passes to insert: the scope sets the tenant itself. */
type NewTenantRow<T extends MySqlTable> = Omit<NewRow<T>, 'tenantId' | 'organizationId'>;
type Fields = Record<string, AnyMySqlColumn | SQL<unknown> | SQL.Aliased<unknown>>;
type PickedValue<V> = V extends AnyMySqlColumn
  ? V['_']['notNull'] extends true
    ? V['_']['data']
    : V['_']['data'] | null
  : V extends SQL<infer T>
    ? T
    : V extends SQL.Aliased<infer T>
      ? T
      : never;
type Picked<F extends Fields> = { [K in keyof F]: PickedValue<F[K]> };

interface FindOptions {
  where?: SQL | undefined;
  groupBy?: (SQL | AnyMySqlColumn)[];
  orderBy?: SQL | AnyMySqlColumn | (SQL | AnyMySqlColumn)[];
  limit?: number;
  offset?: number;
}

interface Join {
  table: MySqlTable;
  on: SQL;
  /** A left join: the row is kept when nothing matches, and the joined table's fields are null. */
  left?: true;
  /**
   * The one index MariaDB may read this table by (USE INDEX): see `JoinedOptions.index`. Not on an alias: drizzle-orm
   * writes the hint before the alias's name, which MariaDB refuses as a syntax error.
   */
  index?: string;
}

/** The part of Drizzle's select builder this module chains; its generics do not survive a generic table. */
interface Chain extends PromiseLike<unknown[]> {
  where(condition: SQL): Chain;
  innerJoin(table: MySqlTable, on: SQL, hint?: IndexHint): Chain;
  leftJoin(table: MySqlTable, on: SQL, hint?: IndexHint): Chain;
  for(strength: 'update'): Chain;
  prepare(): PreparedStatement;
  orderBy(...order: (SQL | AnyMySqlColumn)[]): Chain;
  groupBy(...columns: (SQL | AnyMySqlColumn)[]): Chain;
  limit(n: number): Chain;
  offset(n: number): Chain;
}

/** A select's field as Drizzle keeps it: where in the row object it goes, and the column or expression it reads. */
type OrderedField = { path: string[]; field: unknown };

/**
 * Drizzle's mapping of one row array to the select's row object (decoding each column as its own queries do). It
 * exports it without a type; `scope.int.test.ts` reads through it, and this check names an upgrade that drops it.
 */
const mapResultRow = (() => {
  const exported = (drizzleOrm as unknown as { mapResultRow?: (fields: OrderedField[], row: unknown[], joinsNotNullableMap: Record<string, boolean> | undefined) => unknown }).mapResultRow;
  if (typeof exported !== 'function') throw new Error('drizzle-orm no longer exports mapResultRow: step.select needs updating');
  return exported;
})();

/**
 * What this module reads off Drizzle's prepared statement (its mysql2 one, which does not type them): the text with a
 * `?` per value, the values (placeholders among them), and for a select the fields its row arrays map to.
 * `scope.int.test.ts` runs every kind, so an upgrade that moves them fails there.
 */
interface PreparedStatement {
  query: { sql: string };
  rawQuery?: { sql: string };
  params: unknown[];
  fields?: OrderedField[];
  joinsNotNullableMap?: Record<string, boolean>;
}

/** A value a prepared statement is run with. */
type Value = string | number | boolean | Date | null;

/** A select built once, run in any scope: see `preparedJoined`. */
export interface PreparedJoined<F extends Fields, N extends string> {
  readonly query: () => PreparedStatement;
  readonly _types?: { fields: F; names: N };
}

type JoinedOptions<F extends Fields> = FindOptions & {
  fields: F;
  joins: Join[];
  lock?: true;
  /**
   * The one index MariaDB may read the table by (USE INDEX), for a hot read whose index is plain. Planning, not
   * running, was most of a small read's time: MariaDB estimates the rows of `tenant_id = ?` in every index that
   * starts with tenant_id (two dives into each) before it picks one, and most of our tables have several.
   */
  index?: string;
};

type IndexHint = { useIndex: string[] };
const hint = (index: string | undefined): IndexHint | undefined => (index ? { useIndex: [index] } : undefined);

/** An insert built once per number of rows, run in any scope: see `preparedInsert`. */
export interface PreparedInsert<T extends MySqlTable, K extends string> {
  readonly query: (rows: number) => { statement: PreparedStatement; defaults: [string, () => unknown][] };
  readonly _types?: { table: T; columns: K };
}

/** A row for a `preparedInsert` of these columns. */
type InsertRow<T extends MySqlTable, K extends string> = { [P in K]: P extends keyof NewRow<T> ? NewRow<T>[P] : never };
/** A row for this `preparedInsert`. */
export type RowOf<P> = P extends PreparedInsert<infer T, infer K> ? InsertRow<T, K> : never;

/** An update built once, run in any scope: see `preparedUpdate`. */
export interface PreparedUpdate<N extends string> {
  readonly query: () => PreparedStatement;
  readonly _types?: { names: N };
}

/**
 * One statement of a round trip (`Scope.together`): built for a tenant into its text and values, and how its result
 * reads. Made by `step.select`, `step.insert`, `step.insertRows` and `step.update`.
 */
export interface Step<R> {
  readonly build: (tenantId: string) => { text: string; values: unknown[]; read: (result: unknown) => R };
}

type Results<S extends readonly Step<unknown>[]> = { -readonly [K in keyof S]: S[K] extends Step<infer R> ? R : never };

export interface Scope {
  readonly tenantId: string;
  /**
   * Sends the steps to MariaDB in one round trip (one multi-statement query), after the `first` ones, and gives each
   * step's result in order; MariaDB runs them one after another and stops at the first that fails. In a transaction
   * they run in it. A round trip is a socket write and a wake-up on both sides, whatever it carries.
   */
  together<const S extends readonly Step<unknown>[]>(steps: S, options?: { first?: readonly Step<unknown>[] }): Promise<Results<S>>;
  /** Inside a transaction: the step goes to MariaDB with the COMMIT, in its round trip (a failure there commits nothing). */
  atCommit(step: Step<unknown>): void;
  filter(table: MySqlTable, where?: SQL): SQL;
  find<T extends MySqlTable>(table: T, options?: FindOptions): Promise<Row<T>[]>;
  findOne<T extends MySqlTable>(table: T, where: SQL): Promise<Row<T> | undefined>;
  /** With `lock`, inside a transaction: the rows read from every table of the join are locked (FOR UPDATE). */
  findJoined<F extends Fields>(table: MySqlTable, options: JoinedOptions<F>): Promise<Picked<F>[]>;
  /** Runs a select of `preparedJoined` in this scope (its transaction, if any) with this scope's tenant. */
  run<F extends Fields, N extends string>(select: PreparedJoined<F, N>, values: Record<N, Value>): Promise<Picked<F>[]>;
  /** Inserts one row with a `preparedInsert`, the tenant set by the scope. */
  insertOne<T extends MySqlTable, K extends string>(insert: PreparedInsert<T, K>, row: InsertRow<T, K>): Promise<void>;
  /** Runs a `preparedUpdate` on this scope's rows; the number of rows it changed. */
  runUpdate<N extends string>(update: PreparedUpdate<N>, values: Record<N, Value>): Promise<number>;
  count(table: MySqlTable, where?: SQL): Promise<number>;
  /** Inside a transaction: reads the matching rows and holds their row locks until it ends (SELECT … FOR UPDATE). */
  lock<T extends MySqlTable>(table: T, where: SQL): Promise<Row<T>[]>;
  insert<T extends MySqlTable>(table: T, values: NewTenantRow<T> | NewTenantRow<T>[]): Promise<void>;
  /** Values may be SQL (`remaining + 1`), so a running total moves in one statement. */
  update<T extends MySqlTable>(table: T, set: { [K in keyof NewRow<T>]?: NewRow<T>[K] | SQL }, where: SQL): Promise<number>;
  remove(table: MySqlTable, where: SQL): Promise<number>;
  rink(): Promise<typeof rink.$inferSelect | undefined>;
  updateRink(set: RinkSettings): Promise<void>;
  transaction<R>(fn: (tx: Scope) => Promise<R>): Promise<R>;
}

export type RinkSettings = Partial<Omit<typeof rink.$inferInsert, 'id' | 'slug' | 'createdAt'>>;

/**
 * A column written with its table's name. For a subquery in the fields of a one-table select, where Drizzle writes
 * bare column names: a bare `tenant_id` inside `(select … from product where …)` is the product's own.
 */
export function qualified(table: MySqlTable, column: AnyMySqlColumn): SQL {
  return sql`${table}.${sql.identifier(column.name)}`;
}

const tenantColumns = new WeakMap<MySqlTable, AnyMySqlColumn>();

/** Drizzle's own key for a table's name before any alias (`alias(user, 'taker')` is still the user table). */
const ORIGINAL_NAME = Symbol.for('drizzle:OriginalName');

/** Whether rows of this table, or of the table it is an alias of, belong to one rink (the alias's name is not asked). */
function holdsTenantRows(table: MySqlTable): boolean {
  const name = (table as unknown as Record<symbol, unknown>)[ORIGINAL_NAME];
  if (typeof name !== 'string') throw new Error('drizzle-orm keeps no original name on this table: holdsTenantRows needs updating');
  return isTenantTable(name);
}

/** The column named tenant_id, whatever its property name (better-auth's tables call it organizationId). */
export function tenantColumnOf(table: MySqlTable): AnyMySqlColumn {
  const cached = tenantColumns.get(table);
  if (cached) return cached;
  const config = getTableConfig(table);
  if (!holdsTenantRows(table)) throw new Error(`${config.name} is not a tenant table`);
  const column = config.columns.find((c) => c.name === 'tenant_id');
  if (!column) throw new Error(`${config.name} has no tenant_id column`);
  tenantColumns.set(table, column);
  return column;
}

function tenantPropertyOf(table: MySqlTable): string {
  const column = tenantColumnOf(table);
  const entry = Object.entries(table).find(([, value]) => value === column);
  if (!entry) throw new Error('tenant column not found on table object');
  return entry[0];
}

function orderList(orderBy: FindOptions['orderBy']): (SQL | AnyMySqlColumn)[] {
  if (orderBy === undefined) return [];
  return Array.isArray(orderBy) ? orderBy : [orderBy];
}

/** The name of the placeholder that stands for the tenant in a prepared select. */
const TENANT = 'scopeTenantId';

/**
 * The mysql2 client (pool, or a transaction's connection) behind a Drizzle database or transaction. Drizzle keeps it
 * on the session it does not type; `scope.int.test.ts` runs steps inside a transaction and out, so an upgrade that
 * moves it fails there.
 */
function clientOf(executor: Executor): unknown {
  const client = (executor as unknown as { session?: { client?: unknown } }).session?.client;
  if (!client) throw new Error('drizzle-orm keeps no session.client on this database: send needs updating');
  return client;
}

/** Refuses a value named like the tenant's placeholder, which the scope fills. */
function refuseTenantName(names: readonly string[]): void {
  if (names.includes(TENANT)) throw new Error(`${TENANT} is the tenant's placeholder`);
}

/** Builds a statement on its first use (the pool exists by then) and keeps it; refuses a value named like the tenant's. */
function builtOnce<R>(names: readonly string[], build: () => R): () => R {
  refuseTenantName(names);
  let built: R | undefined;
  return () => (built ??= build());
}

/**
 * A `findJoined` select whose SQL is built once per process, with a placeholder for each of its named values
 * (`value(name)`) and for the tenant: Drizzle takes 0.1 to 0.2 ms to build a select of many fields or subqueries,
 * on every call otherwise. `scope.run(select, values)` fills the tenant from the scope, so the tenant condition is
 * there by construction, as in every other read of a scope.
 */
export function preparedJoined<F extends Fields, const N extends string>(
  table: MySqlTable,
  names: readonly N[],
  /** `filter` is the scope's own (the tenant condition on a table, and `where`), for a subquery's tables. */
  build: (value: (name: N) => Placeholder, filter: Scope['filter']) => JoinedOptions<F>,
): PreparedJoined<F, N> {
  return {
    query: builtOnce(names, () => {
      const template = queriesOf(sql.placeholder(TENANT), currentDb);
      return template.joined(table, build((name) => sql.placeholder(name), template.filter)).prepare();
    }),
  };
}

/**
 * An insert of the named columns, built once per number of rows (Drizzle takes 20 to 60 µs to build an insert, on
 * every call otherwise): for one row, or the few of one write (a reading per blade). The scope sets the tenant.
 * Columns left out take their defaults; one whose default is made in JS (`$defaultFn`, such as a creation time) gets
 * it made again for each row, not once when the statement is built.
 */
export function preparedInsert<T extends MySqlTable, const K extends keyof NewTenantRow<T> & string>(table: T, columns: readonly K[]): PreparedInsert<T, K> {
  refuseTenantName(columns);
  const built = new Map<number, { statement: PreparedStatement; defaults: [string, () => unknown][] }>();
  const build = (rows: number) => {
    const tenantKey = tenantPropertyOf(table);
    const given = new Set<string>([...columns, tenantKey]);
    const defaults: [string, () => unknown][] = [];
    for (const [key, column] of Object.entries(getTableColumns(table))) {
      const made = column.defaultFn ?? (column.default === undefined ? column.onUpdateFn : undefined);
      if (!given.has(key) && made) defaults.push([key, made]);
    }
    const keys = [...given, ...defaults.map(([key]) => key)];
    const list = Array.from({ length: rows }, (_, row) => Object.fromEntries(keys.map((key) => [key, sql.placeholder(key === tenantKey ? TENANT : rowValue(row, key))])));
    const statement = currentDb().insert(table).values(list as NewRow<T>[]).prepare() as unknown as PreparedStatement;
    return { statement, defaults };
  };
  return {
    query: (rows) => {
      let statement = built.get(rows);
      if (!statement) built.set(rows, (statement = build(rows)));
      return statement;
    },
  };
}

/** The placeholder of a column's value in one row of a `preparedInsert`. */
const rowValue = (row: number, key: string) => `${row}:${key}`;

/**
 * An update built once, with a placeholder for each named value; `scope.runUpdate` adds the tenant condition. A
 * table with a column updated by a JS function (`$onUpdateFn`) is refused: its value would be made only once.
 * `index` names the one index MariaDB may find the rows by, as for a select (`JoinedOptions.index`): a one-row
 * update by id took MariaDB twice as long when it weighed every index that starts with tenant_id first.
 */
export function preparedUpdate<T extends MySqlTable, const N extends string>(
  table: T,
  names: readonly N[],
  build: (value: (name: N) => Placeholder) => { set: { [K in keyof NewRow<T>]?: NewRow<T>[K] | SQL }; where: SQL; index?: string },
): PreparedUpdate<N> {
  return {
    query: builtOnce(names, () => {
      const tableName = getTableConfig(table).name;
      if (Object.values(getTableColumns(table)).some((c) => c.onUpdateFn)) throw new Error(`${tableName} has a column updated in JS`);
      const { set, where, index } = build((name) => sql.placeholder(name));
      if (tenantPropertyOf(table) in set) throw new Error('tenant_id cannot be changed');
      const template = queriesOf(sql.placeholder(TENANT), currentDb);
      const statement = currentDb().update(table).set(set).where(template.filter(table, where)).prepare() as unknown as PreparedStatement;
      if (index) withIndexHint(statement, tableName, index);
      return statement;
    }),
  };
}

/**
 * Drizzle writes no index hint into an update, so it goes into the statement's text, after the table's name (MariaDB
 * takes `UPDATE t USE INDEX (i) SET …`). The text is checked first; `scope.int.test.ts` runs a hinted update.
 */
function withIndexHint(statement: PreparedStatement, tableName: string, index: string): void {
  const head = `update \`${tableName}\` set `;
  for (const text of [statement.rawQuery, statement.query]) {
    if (!text?.sql.startsWith(head)) throw new Error('drizzle-orm writes its updates differently: preparedUpdate needs updating');
    text.sql = `update \`${tableName}\` use index (\`${index.replaceAll('`', '')}\`) set ${text.sql.slice(head.length)}`;
  }
}

/** The statements on the executor's client (the pool, or the transaction's connection): each one's result, in order. */
function send(executor: Executor, statements: Statement[]): Promise<unknown[]> {
  return sendStatements(clientOf(executor) as Parameters<typeof sendStatements>[0], statements);
}

const affected = (result: unknown) => (result as { affectedRows: number }).affectedRows;

/** A prepared select's text and values, and its row arrays read as Drizzle would. */
function selectOf<R>(statement: PreparedStatement, values: Record<string, unknown>) {
  const { fields, joinsNotNullableMap } = statement;
  if (!fields) throw new Error('drizzle-orm keeps no fields on this select: step.select needs updating');
  return {
    text: statement.query.sql,
    values: fillPlaceholders(statement.params, values),
    read: (rows: unknown) => (rows as unknown[][]).map((row) => mapResultRow(fields, row, joinsNotNullableMap)) as R[],
  };
}

/**
 * Runs a select Drizzle prepared (`.prepare()`) on the main pool the way a scope runs its own (`send`), for the few
 * reads that come before any rink is known (`directory`). `scope.int.test.ts` runs one.
 */
export async function runPrepared<R>(prepared: { execute(values?: Record<string, unknown>): Promise<R[]> }, values: Record<string, Value>): Promise<R[]> {
  const { text, values: bound, read } = selectOf<R>(prepared as unknown as PreparedStatement, values);
  const [rows] = await send(currentDb(), [{ text, values: bound }]);
  return read(rows);
}

/** The steps a scope sends (`Scope.together`), each from a statement built once. */
export const step = {
  /** The rows of a `preparedJoined` select. */
  select<F extends Fields, N extends string>(select: PreparedJoined<F, N>, values: Record<N, Value>): Step<Picked<F>[]> {
    return { build: (tenantId) => selectOf<Picked<F>>(select.query(), { ...values, [TENANT]: tenantId }) };
  },

  /** One row by a `preparedInsert`; the tenant is the scope's. Its result is the number of rows written. */
  insert<T extends MySqlTable, K extends string>(insert: PreparedInsert<T, K>, row: InsertRow<T, K>): Step<number> {
    return step.insertRows(insert, [row]);
  },

  /** Rows by a `preparedInsert`, in one statement (at least one row; a statement is kept for each count). */
  insertRows<T extends MySqlTable, K extends string>(insert: PreparedInsert<T, K>, rows: InsertRow<T, K>[]): Step<number> {
    if (rows.length === 0) throw new Error('step.insertRows needs a row');
    return {
      build(tenantId) {
        const { statement, defaults } = insert.query(rows.length);
        const values: Record<string, unknown> = { [TENANT]: tenantId };
        rows.forEach((row, i) => {
          for (const [key, value] of Object.entries(row)) values[rowValue(i, key)] = value;
          for (const [key, made] of defaults) values[rowValue(i, key)] = made();
        });
        return { text: statement.query.sql, values: fillPlaceholders(statement.params, values), read: affected };
      },
    };
  },

  /** A `preparedUpdate` on the scope's rows; its result is the number of rows it changed. */
  update<N extends string>(update: PreparedUpdate<N>, values: Record<N, Value>): Step<number> {
    return {
      build(tenantId) {
        const statement = update.query();
        return { text: statement.query.sql, values: fillPlaceholders(statement.params, { ...values, [TENANT]: tenantId }), read: affected };
      },
    };
  },
};

/** The queries of a scope, unawaited; the tenant is a value or, for a prepared select, a placeholder. */
function queriesOf(tenantId: string | Placeholder, exec: () => Executor) {
  const filter = (table: MySqlTable, where?: SQL) => and(eq(tenantColumnOf(table), tenantId), where) as SQL;
  const joinOn = (join: Join) => (holdsTenantRows(join.table) ? filter(join.table, join.on) : join.on);
  const finish = (query: Chain, options: FindOptions): Chain => {
    if (options.groupBy?.length) query = query.groupBy(...options.groupBy);
    const order = orderList(options.orderBy);
    if (order.length) query = query.orderBy(...order);
    if (options.limit !== undefined) query = query.limit(options.limit);
    if (options.offset !== undefined) query = query.offset(options.offset);
    return query;
  };
  return {
    filter,
    joined<F extends Fields>(table: MySqlTable, options: JoinedOptions<F>): Chain {
      let query = exec().select(options.fields).from(table, hint(options.index)).$dynamic() as unknown as Chain;
      for (const join of options.joins) query = join.left ? query.leftJoin(join.table, joinOn(join), hint(join.index)) : query.innerJoin(join.table, joinOn(join), hint(join.index));
      query = finish(query.where(filter(table, options.where)), options);
      return options.lock ? query.for('update') : query;
    },
    finish,
  };
}

/** `tail`: inside a transaction, what goes with its COMMIT (`atCommit`). */
export function scoped(tenantId: string, executor?: Executor, tail?: CommitTail): Scope {
  const exec = (): Executor => executor ?? currentDb();
  const queries = queriesOf(tenantId, exec);
  const { filter, finish } = queries;

  const scope: Scope = {
    tenantId,
    filter,

    async find(table, options = {}) {
      const query = exec().select().from(table as MySqlTable).$dynamic() as unknown as Chain;
      return (await finish(query.where(filter(table, options.where)), options)) as never;
    },

    async findOne(table, where) {
      const rows = await scope.find(table, { where, limit: 1 });
      return rows[0];
    },

    async findJoined(table, options) {
      return (await queries.joined(table, options)) as never;
    },

    async together(steps, options) {
      const first = options?.first ?? [];
      const built = [...first, ...steps].map((s) => s.build(tenantId));
      if (built.length === 0) return [] as never;
      const results = await send(exec(), built);
      return built.slice(first.length).map((b, i) => b.read(results[first.length + i])) as never;
    },

    atCommit(s) {
      if (!tail) throw new Error('atCommit is for a scope inside a transaction');
      const { text, values } = s.build(tenantId);
      tail.statements.push({ text, values });
    },

    async run(select, values) {
      const [rows] = await scope.together([step.select(select, values)]);
      return rows;
    },

    async insertOne(insert, row) {
      await scope.together([step.insert(insert, row)]);
    },

    async runUpdate(update, values) {
      const [changed] = await scope.together([step.update(update, values)]);
      return changed;
    },

    async lock(table, where) {
      return (await exec().select().from(table as MySqlTable).where(filter(table, where)).for('update')) as never;
    },

    async count(table, where) {
      const rows = await exec().select({ n: countFn() }).from(table).where(filter(table, where));
      return rows[0]?.n ?? 0;
    },

    async insert(table, values) {
      const key = tenantPropertyOf(table);
      const list = (Array.isArray(values) ? values : [values]).map((v) => ({ ...v, [key]: tenantId }));
      if (list.length === 0) return;
      await exec().insert(table).values(list as NewRow<typeof table>[]);
    },

    async update(table, set, where) {
      const key = tenantPropertyOf(table);
      if (key in set) throw new Error('tenant_id cannot be changed');
      const [result] = await exec().update(table).set(set).where(filter(table, where));
      return result.affectedRows;
    },

    async remove(table, where) {
      const [result] = await exec().delete(table).where(filter(table, where));
      return result.affectedRows;
    },

    /** The tenant's own rink row (the rink table is the tenant registry, keyed by the tenant id). */
    async rink() {
      const rows = await exec().select().from(rink).where(eq(rink.id, tenantId)).limit(1);
      return rows[0];
    },

    async updateRink(set) {
      await exec().update(rink).set(set).where(eq(rink.id, tenantId));
    },

    /** Runs fn in one transaction with a scope bound to it (a scope already in one reuses it). */
    async transaction(fn) {
      if (executor) return fn(scope);
      return transaction((tx, commitTail) => fn(scoped(tenantId, tx, commitTail)));
    },
  };
  return scope;
}

/** A read scope on the reports database (a replica when one is set): report queries only, never writes. */
export function reportScope(tenantId: string): Scope {
  return scoped(tenantId, reportsDb());
}
