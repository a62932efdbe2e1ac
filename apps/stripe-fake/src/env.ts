import { z } from 'zod';

// The payment fake's settings. This is the only file of the fake that reads process.env.
const envSchema = z.object({
  STRIPE_FAKE_HOST: z.string().min(1).default('127.0.0.1'),
  STRIPE_FAKE_PORT: z.coerce.number().int().min(1).max(65535).default(12111),
  /** Optional JSON snapshot: loaded at start, saved after changes and on SIGTERM. Unset keeps everything in memory. */
  STRIPE_FAKE_STATE_FILE: z.string().min(1).optional(),
  STRIPE_FAKE_RETRY_BASE_MS: z.coerce.number().int().min(1).default(1000),
  STRIPE_FAKE_MAX_ATTEMPTS: z.coerce.number().int().min(1).max(50).default(8),
});

export type Env = z.infer<typeof envSchema>;

export function loadEnv(source: Record<string, string | undefined> = process.env): Env {
  const parsed = envSchema.safeParse(source);
  if (!parsed.success) {
    throw new Error(`invalid payment fake settings:\n${z.prettifyError(parsed.error)}`);
  }
  return parsed.data;
}
