import { z } from 'zod';

// The API's settings. This is the only file of the API that reads process.env.
const list = z
  .string()
  .transform((s) => s.split(',').map((v) => v.trim()).filter(Boolean));

export const envSchema = z.object({
  NODE_ENV: z.enum(['development', 'production', 'test']).default('development'),
  HOST: z.string().default('127.0.0.1'),
  PORT: z.coerce.number().int().min(1).max(65535).default(3000),
  APP_URL: z.url().default('http://127.0.0.1:3000'),
  /** Extra origins allowed to call the API with cookies (the Vite dev server). */
  EXTRA_ORIGINS: list.default(['http://127.0.0.1:5173', 'http://localhost:5173']),
  DATABASE_URL: z.string().startsWith('mysql://', 'DATABASE_URL must be a mysql:// URL'),
  DB_POOL_SIZE: z.coerce.number().int().min(1).max(200).default(10),
  /** A replica of the database for the reports to read from; unset, they read from DATABASE_URL. */
  REPORTS_DATABASE_URL: z.string().startsWith('mysql://', 'REPORTS_DATABASE_URL must be a mysql:// URL').optional(),
  BETTER_AUTH_SECRET: z.string().min(32, 'BETTER_AUTH_SECRET must be at least 32 characters'),
  SMTP_HOST: z.string().default('127.0.0.1'),
  SMTP_PORT: z.coerce.number().int().default(1025),
  SMTP_SECURE: z.stringbool().default(false),
  SMTP_USER: z.string().optional(),
  SMTP_PASSWORD: z.string().optional(),
  MAIL_FROM: z.string().default('Rinkwright <no-reply@rinkwright.test>'),
  /** The capture server's web inbox, linked from the app when set (local demo only). */
  MAIL_INBOX_URL: z.url().optional(),
  STRIPE_API_BASE: z.url().default('http://127.0.0.1:12111'),
  /** The platform's secret key on the payment service (the local fake accepts any sk_test_ key). */
  STRIPE_SECRET_KEY: z.string().startsWith('sk_', 'STRIPE_SECRET_KEY must be a secret key (sk_...)').default('sk_test_rinkwright_local_platform'),
  /** Test mode: test clocks may be advanced from the billing page, and the counter offers test cards. */
  PAYMENT_TEST_MODE: z.stringbool().default(true),
  /** The platform's fee on every sale a rink makes, in basis points (300 = 3 %). */
  PLATFORM_FEE_BPS: z.coerce.number().int().min(0).max(5000).default(300),
  /** The rink's plan: this much per active station per month, in PLAN_CURRENCY's minor units. */
  PLAN_STATION_PRICE_MINOR: z.coerce.number().int().min(0).default(2900),
  PLAN_CURRENCY: z.string().length(3).toLowerCase().default('usd'),
  /** Days a rink keeps working after its plan's payment fails, before it becomes read-only. */
  PLAN_GRACE_DAYS: z.coerce.number().int().min(0).max(60).default(7),
  /** Credits at or below which a skater gets the low-balance reminder. */
  LOW_BALANCE_CREDITS: z.coerce.number().int().min(0).default(1),
  /** The background worker (mail retries, nightly expiry and reminders); tests run its steps directly. */
  WORKER_ENABLED: z.stringbool().default(true),
  WORKER_INTERVAL_MS: z.coerce.number().int().min(1000).default(30_000),
  WEB_DIST: z.string().optional(),
  LOG_LEVEL: z.enum(['fatal', 'error', 'warn', 'info', 'debug', 'trace', 'silent']).default('info'),
  /** Requests per minute per client address on the auth endpoints and on the rest of the API. */
  AUTH_RATE_LIMIT_MAX: z.coerce.number().int().min(1).default(30),
  API_RATE_LIMIT_MAX: z.coerce.number().int().min(1).default(600),
  /**
   * How long a browser's session is taken from its signed cache cookie before it is read from the database again
   * (0: on every request). A session ended elsewhere (sign-out on another device, a password reset) still works
   * on a device holding a fresh copy for up to this long.
   */
  SESSION_CACHE_SECONDS: z.coerce.number().int().min(0).max(300).default(60),
  /** Number of reverse proxies in front of the API whose X-Forwarded-For may be trusted. */
  TRUST_PROXY_HOPS: z.coerce.number().int().min(0).default(0),
});

export type Env = z.infer<typeof envSchema>;

export function loadEnv(source: Record<string, string | undefined> = process.env): Env {
  const parsed = envSchema.safeParse(source);
  if (!parsed.success) {
    const lines = parsed.error.issues.map((i) => `  ${i.path.join('.')}: ${i.message}`).join('\n');
    throw new Error(`Invalid environment:\n${lines}`);
  }
  return parsed.data;
}
