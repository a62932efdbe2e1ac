import type { Server } from 'node:http';
import { createServer } from 'node:net';
import { and, asc, eq } from 'drizzle-orm';
import { creditAccount, creditEntry, creditLot } from '@rinkwright/db';
import { currentDb } from '@rinkwright/db/unscoped';
import { afterAll } from 'vitest';
import type { WorkerDeps } from '../../apps/api/src/jobs/worker';
import { ensureWebhookEndpoints, readSetting, WEBHOOK_PATHS, type EndpointKind } from '../../apps/api/src/lib/payment-settings';
import { buildTestApp, type Client, type TestApp } from './app';
import { newKey } from './desk';
import type { RinkWorld } from './world';

// Billing tests need the payment fake (STRIPE_API_BASE) to reach the API with its webhooks, so the test app
// listens on a free loopback port and registers its endpoints there, as the API does at start.

async function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const probe = createServer();
    probe.once('error', reject);
    probe.listen(0, '127.0.0.1', () => {
      const address = probe.address();
      probe.close(() => (typeof address === 'object' && address ? resolve(address.port) : reject(new Error('no port'))));
    });
  });
}

export interface ListeningApp extends TestApp {
  base: string;
}

/** Builds the test app with APP_URL on a port chosen before the app exists (the webhooks are registered there). */
export async function listeningApp(): Promise<ListeningApp> {
  const port = await freePort();
  const base = `http://127.0.0.1:${port}`;
  const built = buildTestApp({ APP_URL: base });
  let server: Server | undefined;
  await new Promise<void>((resolve) => {
    server = built.app.listen(port, '127.0.0.1', () => resolve());
  });
  afterAll(() => new Promise<void>((resolve) => server!.close(() => resolve())));
  await ensureWebhookEndpoints(built.env, built.payments, built.logger);
  const endpoints = await Promise.all((['platform', 'connect'] as const).map(async (kind) => (await readSetting(`webhook:${kind}:${base}${WEBHOOK_PATHS[kind]}`))?.value));
  // The payment fake is shared and outlives the app: an endpoint left behind would take every later event, and
  // its retries, at a port nobody listens on.
  afterAll(async () => {
    for (const id of endpoints) if (id) await built.payments.webhookEndpoints.del(id).catch(() => undefined);
  });
  return { ...built, base };
}

/** The owner connects the rink's payout account and completes the fake's onboarding. */
export async function connectPayout(api: TestApp, world: RinkWorld): Promise<string> {
  const owner = await api.signIn(world.staff.owner.email, world.staff.owner.password);
  const started = await owner.post(`/api/rinks/${world.slug}/billing/payout-account`).send({});
  if (started.status !== 201) throw new Error(`payout account: ${started.status} ${JSON.stringify(started.body)}`);
  const status = await owner.get(`/api/rinks/${world.slug}/billing`);
  const account = status.body.payout.accountId as string;
  const done = await fetch(`${api.env.STRIPE_API_BASE}/_fake/accounts/${account}/complete_onboarding`, { method: 'POST' });
  if (!done.ok) throw new Error(`fake onboarding: ${done.status}`);
  const refreshed = await owner.post(`/api/rinks/${world.slug}/billing/payout-account/refresh`).send({});
  if (!refreshed.body.payout?.chargesEnabled) throw new Error(`payout not enabled: ${JSON.stringify(refreshed.body)}`);
  return account;
}

export const punchCard = { kind: 'punch_card', name: 'Ten sharpenings', credits: 10, priceMinor: 5000, monthsValid: 12, listed: true };

export async function addProduct(manager: Client, world: RinkWorld, body: object = punchCard): Promise<{ id: string; synced: boolean; price: { id: string; amountMinor: number } }> {
  const made = await manager.post(`/api/rinks/${world.slug}/products`).send(body);
  if (made.status !== 201) throw new Error(`product: ${made.status} ${JSON.stringify(made.body)}`);
  return made.body;
}

/** Pays a hosted checkout the way a browser would: the page's form posted with a test card, the e-mail typed if it is empty. */
export async function payOnCheckoutPage(url: string, card = '4242 4242 4242 4242', typedEmail = 'skater@example.test'): Promise<Response> {
  const page = await fetch(url);
  if (!page.ok) throw new Error(`checkout page: ${page.status}`);
  const html = await page.text();
  const action = /<form method="post" action="([^"]+)"/.exec(html)?.[1];
  if (!action) throw new Error('no form on the checkout page');
  const email = /name="email"[^>]*value="([^"]*)"/.exec(html)?.[1] || typedEmail;
  return fetch(new URL(action, url), {
    method: 'POST',
    redirect: 'manual',
    headers: { 'content-type': 'application/x-www-form-urlencoded' },
    body: new URLSearchParams({ email, card_number: card, expiry: '12 / 34', cvc: '123' }),
  });
}

/**
 * Waits for a condition that webhooks will make true (deliveries are asynchronous). The wait is long because the
 * fake is shared: while other runs keep it busy, a delivery can take many seconds.
 */
export async function eventually<T>(read: () => Promise<T>, ok: (value: T) => boolean, timeoutMs = 60_000): Promise<T> {
  const until = Date.now() + timeoutMs;
  let last = await read();
  while (!ok(last)) {
    if (Date.now() > until) throw new Error(`gave up waiting; last value ${JSON.stringify(last)}`);
    await new Promise((r) => setTimeout(r, 150));
    last = await read();
  }
  return last;
}

export const redeemPath = (world: RinkWorld, customerId: string) => `/api/rinks/${world.slug}/customers/${customerId}/redemptions`;
export const balanceOf = async (agent: Client, world: RinkWorld, customerId: string) => (await agent.get(`/api/rinks/${world.slug}/customers/${customerId}/balance`)).body as { credits: number; valueMinor: number; lots: { id: string; remaining: number }[] };
export { newKey };

/** The sweep's dependencies from the test app, the payment service's client included. */
export const workerDeps = (api: TestApp): WorkerDeps => ({ env: api.env, mailer: api.mailer, logger: api.logger, payments: api.payments });

/** The test app's own webhook endpoint of this kind at the fake (the fake also holds other runs' endpoints). */
export async function ownEndpoint(api: ListeningApp, kind: EndpointKind): Promise<string> {
  const setting = await readSetting(`webhook:${kind}:${api.base}${WEBHOOK_PATHS[kind]}`);
  if (!setting) throw new Error(`no ${kind} webhook endpoint registered for ${api.base}`);
  return setting.value;
}

/** The fake's chaos switch on one endpoint: each event delivered 1 + duplicates times, shuffled in a short window. */
export async function setChaos(api: ListeningApp, kind: EndpointKind, chaos: { duplicates: number; shuffle: boolean }): Promise<void> {
  const endpoint = await ownEndpoint(api, kind);
  const answer = await fetch(`${api.env.STRIPE_API_BASE}/_fake/webhook_endpoints/${endpoint}/chaos`, {
    method: 'POST',
    headers: { 'content-type': 'application/json' },
    body: JSON.stringify(chaos),
  });
  if (!answer.ok) throw new Error(`chaos switch: ${answer.status}`);
}

/** Waits until the fake has no delivery to this endpoint still pending (duplicates and retries included). */
export async function deliveriesSettled(api: ListeningApp, kind: EndpointKind, timeoutMs = 60_000): Promise<void> {
  const endpoint = await ownEndpoint(api, kind);
  await eventually(
    async () => {
      const answer = await fetch(`${api.env.STRIPE_API_BASE}/_fake/deliveries?endpoint=${endpoint}`);
      const body = (await answer.json()) as { data: { status: string }[] };
      return body.data.filter((d) => d.status === 'pending').length;
    },
    (pending) => pending === 0,
    timeoutMs,
  );
}

/** The owner moves the rink's payment test clocks on (memberships on the payout account, the plan on the platform). */
export async function advanceClock(owner: Client, world: RinkWorld, days: number) {
  const moved = await owner.post(`/api/rinks/${world.slug}/billing/test-clock`).send({ days });
  if (moved.status !== 201) throw new Error(`test clock: ${moved.status} ${JSON.stringify(moved.body)}`);
  return moved.body as { plan: { state: string; stations: number; graceUntil: string | null } };
}

/** Starts hosted checkout on the rink's public page for this e-mail and pays it with a test card. */
export async function buyOnPublicPage(api: TestApp, world: RinkWorld, productId: string, email: string, card = '4242 4242 4242 4242') {
  const started = await api.client().post(`/api/public/rinks/${world.slug}/checkout`).send({ productId, email, name: 'Online Skater' });
  if (started.status !== 201) throw new Error(`checkout: ${started.status} ${JSON.stringify(started.body)}`);
  const paid = await payOnCheckoutPage(started.body.url as string, card, email);
  if (paid.status !== 303) throw new Error(`checkout page: ${paid.status} ${await paid.text()}`);
  return new URL(paid.headers.get('location')!).searchParams.get('session')!;
}

export async function customerIdByEmail(agent: Client, world: RinkWorld, email: string): Promise<string> {
  const found = await agent.get(`/api/rinks/${world.slug}/customers`).query({ q: email });
  const id = found.body.customers?.[0]?.id as string | undefined;
  if (!id) throw new Error(`no customer ${email} at ${world.slug}`);
  return id;
}

export interface TracedLot {
  lot: typeof creditLot.$inferSelect;
  entries: (typeof creditEntry.$inferSelect)[];
  /** Σ of the lot's entries' credits, to compare with its remaining. */
  entryCredits: number;
  /** Σ of the lot's entries' values. */
  entryValueMinor: number;
}

/**
 * Every lot of a skater's account, oldest first, with its entries: the ledger as the database holds it. Rows written
 * within one millisecond (a renewal's lots, its expiry and carry entries) keep their order by kind, as written.
 */
export async function traceLots(rinkId: string, customerId: string): Promise<TracedLot[]> {
  const db = currentDb();
  const [account] = await db.select().from(creditAccount).where(and(eq(creditAccount.tenantId, rinkId), eq(creditAccount.customerId, customerId)));
  if (!account) return [];
  const lots = await db.select().from(creditLot).where(and(eq(creditLot.tenantId, rinkId), eq(creditLot.accountId, account.id))).orderBy(asc(creditLot.createdAt), asc(creditLot.origin), asc(creditLot.id));
  const entries = await db.select().from(creditEntry).where(and(eq(creditEntry.tenantId, rinkId), eq(creditEntry.accountId, account.id))).orderBy(asc(creditEntry.createdAt), asc(creditEntry.kind), asc(creditEntry.id));
  return lots.map((lot) => {
    const own = entries.filter((e) => e.lotId === lot.id);
    return { lot, entries: own, entryCredits: own.reduce((n, e) => n + e.credits, 0), entryValueMinor: own.reduce((n, e) => n + e.valueMinor, 0) };
  });
}
