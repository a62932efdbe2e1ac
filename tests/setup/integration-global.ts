import mysql from 'mysql2/promise';
import { runMigrations } from '@rinkwright/db/testing';
import { integrationEnv } from '../support/env';

/** The database name of a mysql:// URL, refused unless it ends in _test (this set-up drops it). */
export function testDatabaseName(url: string): string {
  const name = decodeURIComponent(new URL(url).pathname.replace(/^\//, ''));
  if (!/^[A-Za-z0-9_]+_test$/.test(name)) {
    throw new Error(`DATABASE_URL names the database "${name}"; the integration set-up drops it, so it must end in _test`);
  }
  return name;
}

/** Once per integration run: a fresh database with every migration applied. */
export default async function setup(): Promise<void> {
  const url = integrationEnv().DATABASE_URL;
  const name = testDatabaseName(url);
  const server = new URL(url);
  server.pathname = '/';
  const connection = await mysql.createConnection({ uri: server.toString() });
  try {
    await connection.query(`DROP DATABASE IF EXISTS \`${name}\``);
    await connection.query(`CREATE DATABASE \`${name}\` CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci`);
  } finally {
    await connection.end();
  }
  await runMigrations(url);
}
