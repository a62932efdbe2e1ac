import mysql from 'mysql2';
import { describe, expect, it } from 'vitest';

// The patch in patches/mysql2@3.24.6.patch (DEVELOPERS.md, "mysql2's options"): a query's options are copied with
// Object.assign instead of object spread. These tests hold it to mysql2's own behaviour and check it is installed.

type Options = Record<string, unknown>;
type Built = { sql: unknown; values: unknown; onResult: unknown; _queryOptions: Options };
type CreateQuery = (sql: unknown, values: unknown, cb: unknown, config: Options) => Built;
const createQuery = (mysql.Connection as unknown as { createQuery: CreateQuery }).createQuery;

/** mysql2 3.24.6's createQuery as published, before the patch: the reference the patched one must agree with. */
function published(sql: unknown, values: unknown, cb: unknown, config: Options) {
  let options: Options = { rowsAsArray: config.rowsAsArray, infileStreamFactory: config.infileStreamFactory };
  if (typeof sql === 'object') {
    const given = sql as Options;
    options = { ...options, ...given, sql: given.sql, values: given.values };
    if (typeof values === 'function') cb = values;
    else if (values !== undefined) options.values = values;
  } else if (typeof values === 'function') {
    cb = values;
    options.sql = sql;
    options.values = undefined;
  } else {
    options.sql = sql;
    options.values = values;
  }
  return { options, cb };
}

const typeCast = () => null;
const callback = () => undefined;
const config = { rowsAsArray: false, infileStreamFactory: undefined };
// Every form a query takes: Drizzle's (an options object and the values), and the others mysql2 accepts.
const calls: [string, unknown, unknown, unknown][] = [
  ['options with values beside them, as Drizzle calls it', { sql: 'SELECT ?', rowsAsArray: true, typeCast }, [7], undefined],
  ['options holding their values', { sql: 'SELECT ?', values: [8], nestTables: '_' }, undefined, callback],
  ['options whose values the second argument replaces', { sql: 'SELECT ?', values: [1], timeout: 500 }, [9], callback],
  ['options overriding the connection’s rowsAsArray', { sql: 'SELECT 1', rowsAsArray: true, namedPlaceholders: true }, undefined, undefined],
  ['a string and values', 'SELECT ?', [10], callback],
  ['a string and a callback', 'SELECT 1', callback, undefined],
];

describe('mysql2 with our patch', () => {
  it.each(calls)('builds the same query as published mysql2 from %s', (_name, sql, values, cb) => {
    const built = createQuery(sql, values, cb, config);
    const expected = published(sql, values, cb, config);
    expect(built._queryOptions).toEqual(expected.options);
    expect(Object.keys(built._queryOptions).sort()).toEqual(Object.keys(expected.options).sort());
    expect(built.sql).toBe(expected.options.sql);
    expect(built.values).toBe(expected.options.values);
    expect(built.onResult).toBe(expected.cb);
  });

  it('leaves the caller’s options object as it was (Drizzle reuses one per prepared query)', () => {
    const given = { sql: 'SELECT ?', rowsAsArray: true, typeCast };
    createQuery(given, [1], undefined, config);
    expect(given).toEqual({ sql: 'SELECT ?', rowsAsArray: true, typeCast });
  });

  it('is the installed mysql2: its query options are copied with Object.assign, not spread', () => {
    const source = createQuery.toString();
    expect(source).toContain('Object.assign(options, sql)');
    expect(source).not.toContain('...sql');
  });
});
