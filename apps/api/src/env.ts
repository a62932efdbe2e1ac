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
  WEB_DIST: z.string().optional(),
  LOG_LEVEL: z.enum(['fatal', 'error', 'warn', 'info', 'debug', 'trace', 'silent']).default('info'),
  /** Requests per minute per client address on the auth endpoints and on the rest of the API. */
  AUTH_RATE_LIMIT_MAX: z.coerce.number().int().min(1).default(30),
  API_RATE_LIMIT_MAX: z.coerce.number().int().min(1).default(600),
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
