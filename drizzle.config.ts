import { defineConfig } from 'drizzle-kit';

// Only `generate` is used (stack notes: push/pull misbehave on MariaDB with JSON columns),
// so no credentials are needed here.
export default defineConfig({
  dialect: 'mysql',
  schema: './packages/db/src/schema/index.ts',
  out: './drizzle',
});
