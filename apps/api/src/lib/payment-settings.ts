import { eq, like } from 'drizzle-orm';
import { isDuplicateKey, paymentEvent, paymentSetting } from '@rinkwright/db';
import { currentDb } from '@rinkwright/db/unscoped';
import type { Logger } from 'pino';
import type { Env } from '../env';
import type { Payments } from './payments';

// What the platform keeps about its own objects on the payment service: the webhook endpoints (with the signing
// secrets the service shows only once) and the plan's price. Platform-wide, so outside any rink's scope.

export async function readSetting(key: string) {
  const [row] = await currentDb().select().from(paymentSetting).where(eq(paymentSetting.key, key));
  return row;
}

/** Stores a setting unless another process stored it first; returns the one that won. */
export async function writeSetting(key: string, value: string, secret: string | null) {
  await currentDb().insert(paymentSetting).values({ key, value, secret, updatedAt: new Date() }).onDuplicateKeyUpdate({ set: { key } });
  return (await readSetting(key))!;
}

export type EndpointKind = 'platform' | 'connect';
export const WEBHOOK_PATHS: Record<EndpointKind, string> = { platform: '/api/webhooks/stripe', connect: '/api/webhooks/stripe-connect' };

/** The signing secrets of every endpoint of this kind the platform registered (a rotation may leave two). */
export async function webhookSecrets(kind: EndpointKind): Promise<string[]> {
  const rows = await currentDb().select().from(paymentSetting).where(like(paymentSetting.key, `webhook:${kind}:%`));
  return rows.flatMap((r) => (r.secret ? [r.secret] : []));
}

/**
 * Registers the platform's two webhook endpoints at APP_URL once (several API processes may race; the settings
 * table keeps one). An endpoint whose secret we never stored is replaced, since its secret cannot be read back.
 */
export async function ensureWebhookEndpoints(env: Env, payments: Payments, logger: Logger): Promise<void> {
  const base = env.APP_URL.replace(/\/$/, '');
  for (const kind of ['platform', 'connect'] as const) {
    const url = `${base}${WEBHOOK_PATHS[kind]}`;
    const key = `webhook:${kind}:${url}`;
    if (await readSetting(key)) continue;
    const made = await payments.webhookEndpoints.create({ url, enabled_events: ['*'], connect: kind === 'connect', description: `Rinkwright ${kind} events` }, { idempotencyKey: key });
    const stored = await writeSetting(key, made.id, made.secret ?? null);
    if (stored.value !== made.id) await payments.webhookEndpoints.del(made.id).catch(() => undefined);
    logger.info({ url, kind }, 'payment webhook endpoint registered');
  }
}

/** Events already handled, by id: the service delivers at least once, so a repeat is acknowledged and skipped. */
export async function eventSeen(id: string): Promise<boolean> {
  const [row] = await currentDb().select({ id: paymentEvent.id }).from(paymentEvent).where(eq(paymentEvent.id, id));
  return row !== undefined;
}

export async function rememberEvent(event: { id: string; type: string; account?: string | null | undefined }): Promise<void> {
  try {
    await currentDb().insert(paymentEvent).values({ id: event.id, type: event.type, account: event.account ?? null });
  } catch (error) {
    if (!isDuplicateKey(error)) throw error;
  }
}
