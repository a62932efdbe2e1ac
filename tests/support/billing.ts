import type { Server } from 'node:http';
import { createServer } from 'node:net';
import { afterAll } from 'vitest';
import { ensureWebhookEndpoints } from '../../apps/api/src/lib/payment-settings';
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

/** Pays a hosted checkout the way a browser would: the page's form posted with a test card. */
export async function payOnCheckoutPage(url: string, card = '4242 4242 4242 4242'): Promise<Response> {
  const page = await fetch(url);
  if (!page.ok) throw new Error(`checkout page: ${page.status}`);
  const html = await page.text();
  const action = /<form method="post" action="([^"]+)"/.exec(html)?.[1];
  if (!action) throw new Error('no form on the checkout page');
  const email = /name="email"[^>]*value="([^"]*)"/.exec(html)?.[1] ?? 'skater@example.test';
  return fetch(new URL(action, url), {
    method: 'POST',
    redirect: 'manual',
    headers: { 'content-type': 'application/x-www-form-urlencoded' },
    body: new URLSearchParams({ email, card_number: card, expiry: '12 / 34', cvc: '123' }),
  });
}

/** Waits for a condition that webhooks will make true (deliveries are asynchronous). */
export async function eventually<T>(read: () => Promise<T>, ok: (value: T) => boolean, timeoutMs = 15_000): Promise<T> {
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
