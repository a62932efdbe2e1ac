import { z } from 'zod';

// The command-line entry points of this package (migrate, seed) read their settings here and nowhere else.
export const dbEnv = z
  .object({ DATABASE_URL: z.string().startsWith('mysql://', 'DATABASE_URL must be a mysql:// URL') })
  .parse(process.env);
