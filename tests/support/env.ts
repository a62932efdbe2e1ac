import { z } from 'zod';
import { loadEnv, type Env } from '../../apps/api/src/env';

// The one place in tests/ that reads process.env, so a missing setting fails loudly here and not as a
// confusing connection error somewhere inside a test.
const integrationSettings = z.object({
  DATABASE_URL: z.string().startsWith('mysql://', 'DATABASE_URL must be a mysql:// URL'),
  MAIL_API_URL: z.url('MAIL_API_URL must be the capture server web address, e.g. http://127.0.0.1:2080'),
  APP_URL: z.url('APP_URL must be set, e.g. http://127.0.0.1:3100'),
});

export type IntegrationSettings = z.infer<typeof integrationSettings>;

export function integrationEnv(): IntegrationSettings {
  const parsed = integrationSettings.safeParse(process.env);
  if (!parsed.success) {
    const lines = parsed.error.issues.map((i) => `  ${i.path.join('.')}: ${i.message}`).join('\n');
    throw new Error(`The integration tests need these settings:\n${lines}`);
  }
  return parsed.data;
}

/**
 * The API's settings for a test app. TRUST_PROXY_HOPS=1 lets each simulated client carry its own address
 * in X-Forwarded-For: the auth limiter counts per address in the shared database, so without it every test
 * file running in parallel would share (and exhaust) one bucket.
 */
export function testEnv(overrides: Record<string, string> = {}): Env {
  integrationEnv();
  return loadEnv({ ...process.env, LOG_LEVEL: 'silent', TRUST_PROXY_HOPS: '1', ...overrides });
}
