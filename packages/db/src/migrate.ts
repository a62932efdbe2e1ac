import { fileURLToPath } from 'node:url';
import { drizzle } from 'drizzle-orm/mysql2';
import { migrate } from 'drizzle-orm/mysql2/migrator';
import mysql from 'mysql2/promise';

export const migrationsFolder = fileURLToPath(new URL('../../../drizzle', import.meta.url));

/** Applies the generated migrations on a single connection (the migrator needs one session). */
export async function runMigrations(url: string): Promise<void> {
  const connection = await mysql.createConnection({ uri: url, timezone: 'Z', multipleStatements: true });
  try {
    await migrate(drizzle(connection), { migrationsFolder });
  } finally {
    await connection.end();
  }
}

if (process.argv[1] === fileURLToPath(import.meta.url)) {
  const { dbEnv } = await import('./env');
  await runMigrations(dbEnv.DATABASE_URL);
  console.log('migrations applied');
}
