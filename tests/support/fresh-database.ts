import mysql from 'mysql2/promise';
import { runMigrations } from '@rinkwright/db/testing';

/** The database name of a mysql:// URL, refused unless it ends in the given suffix (the set-up drops it). */
export function disposableDatabaseName(url: string, suffix: '_test' | '_e2e'): string {
  const name = decodeURIComponent(new URL(url).pathname.replace(/^\//, ''));
  if (!new RegExp(`^[A-Za-z0-9_]+${suffix}$`).test(name)) {
    throw new Error(`The URL names the database "${name}"; the test set-up drops it, so it must end in ${suffix}`);
  }
  return name;
}

/** Drops and recreates the database, then applies every migration: each run starts from nothing. */
export async function recreateDatabase(url: string, suffix: '_test' | '_e2e'): Promise<void> {
  const name = disposableDatabaseName(url, suffix);
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
