import { randomUUID } from 'node:crypto';
import { count, desc, eq } from 'drizzle-orm';
import { creditEntry, payment as paymentTable } from '@rinkwright/db';
import { currentDb } from '@rinkwright/db/unscoped';
import { beforeAll, describe, expect, it } from 'vitest';
import { sweepRink } from '../../apps/api/src/jobs/worker';
import { webhookSecrets } from '../../apps/api/src/lib/payment-settings';
import { addProduct, balanceOf, connectPayout, eventually, listeningApp, newKey, payOnCheckoutPage, redeemPath } from '../support/billing';
import { createDesk, write, type Desk } from '../support/desk';
import { createCustomerAt, uniqueEmail } from '../support/world';
import type { Client } from '../support/app';

// Selling and redeeming credits against MariaDB with the payment fake running: the purchase → webhook → credits
// path, the redemption contract under concurrency and repetition, webhooks replayed and shuffled, forged and
// stale signatures, refund and expiry arithmetic worked by hand.

const api = await listeningApp();
let desk: Desk;
let manager: Client;
let technician: Client;
let account: string;
let card: { id: string };

beforeAll(async () => {
  desk = await createDesk('Billing Rink');
  account = await connectPayout(api, desk.world);
  manager = await api.signIn(desk.world.staff.manager.email, desk.world.staff.manager.password);
  technician = await api.signIn(desk.world.staff.technician.email, desk.world.staff.technician.password);
  card = await addProduct(manager, desk.world);
}, 30_000);

const entriesOf = async (lotId: string) => (await currentDb().select({ n: count() }).from(creditEntry).where(eq(creditEntry.lotId, lotId)))[0]?.n ?? 0;

async function buyOnline(email: string, productId = card.id) {
  const started = await api.client().post(`/api/public/rinks/${desk.world.slug}/checkout`).send({ productId, email, name: 'Online Skater' });
  expect(started.status).toBe(201);
  const paid = await payOnCheckoutPage(started.body.url);
  expect(paid.status).toBe(303);
  const session = new URL(paid.headers.get('location')!).searchParams.get('session')!;
  return { session };
}

describe('buying credits online', () => {
  it('grants the card’s credits once the payment service’s webhooks arrive', async () => {
    const email = uniqueEmail('online');
    const { session } = await buyOnline(email);
    const status = await eventually(
      async () => (await api.client().get(`/api/public/rinks/${desk.world.slug}/checkout/${session}`)).body,
      (b) => b.state === 'paid',
    );
    expect(status).toMatchObject({ state: 'paid', credits: 10, amountMinor: 5000 });
    const found = await manager.get(`/api/rinks/${desk.world.slug}/customers`).query({ q: email });
    const customerId = found.body.customers[0].id as string;
    const balance = await balanceOf(manager, desk.world, customerId);
    expect(balance.credits).toBe(10);
    expect(balance.valueMinor).toBe(5000);
    const ledger = await manager.get(`/api/rinks/${desk.world.slug}/customers/${customerId}/ledger`);
    // 3 % of 50.00 is the platform's fee (PLATFORM_FEE_BPS default 300).
    expect(ledger.body.payments[0]).toMatchObject({ state: 'paid', amountMinor: 5000, feeMinor: 150, channel: 'online' });
  }, 30_000);

  it('declines a declined card and grants nothing', async () => {
    const started = await api.client().post(`/api/public/rinks/${desk.world.slug}/checkout`).send({ productId: card.id, email: uniqueEmail('declined'), name: 'Declined' });
    const paid = await payOnCheckoutPage(started.body.url, '4000 0000 0000 0002');
    // The hosted page stays open and says so (the fake answers 402, as the card error it shows).
    expect(paid.status).toBe(402);
    expect(await paid.text()).toContain('declined');
  });
});

describe('the redemption contract', () => {
  async function skaterWith(credits: number) {
    const skater = await createCustomerAt(desk.world.id, { name: 'Counter Skater', email: uniqueEmail('counter') });
    if (credits > 0) {
      const made = await write(manager, `/api/rinks/${desk.world.slug}/customers/${skater.id}/adjustments`, { credits, reason: 'Opening balance' });
      expect(made.status).toBe(201);
    }
    return skater.id;
  }

  it('needs an Idempotency-Key, answers 201 with the entry, and replays a repeated key', async () => {
    const id = await skaterWith(2);
    expect((await technician.post(redeemPath(desk.world, id)).send({})).status).toBe(400);
    const key = newKey('redeem');
    const first = await write(technician, redeemPath(desk.world, id), {}, key);
    expect(first.status).toBe(201);
    expect(first.body.entry).toMatchObject({ kind: 'redeem', credits: -1 });
    const again = await write(technician, redeemPath(desk.world, id), {}, key);
    expect(again.status).toBe(201);
    expect(again.body.entry.id).toBe(first.body.entry.id);
    expect((await balanceOf(technician, desk.world, id)).credits).toBe(1);
  });

  it('gives exactly one success to 50 parallel redemptions of a one-credit account', async () => {
    const id = await skaterWith(1);
    const answers = await Promise.all(Array.from({ length: 50 }, () => write(technician, redeemPath(desk.world, id), {})));
    expect(answers.filter((a) => a.status === 201)).toHaveLength(1);
    expect(answers.filter((a) => a.status === 409).every((a) => a.body.error.code === 'insufficient_credits')).toBe(true);
    expect(answers.filter((a) => a.status !== 201 && a.status !== 409)).toEqual([]);
    expect((await balanceOf(technician, desk.world, id)).credits).toBe(0);
  }, 30_000);

  it('writes one entry for the same key sent 20 times', async () => {
    const id = await skaterWith(5);
    const key = newKey('same');
    const answers = await Promise.all(Array.from({ length: 20 }, () => write(technician, redeemPath(desk.world, id), {}, key)));
    // The claim of the key and the redemption are one transaction: a repeat that arrives while the first runs waits
    // for it and gets its answer, so every one of the 20 is the same 201.
    expect(answers.map((a) => a.status)).toEqual(Array.from({ length: 20 }, () => 201));
    expect(new Set(answers.map((a) => a.body.entry.id)).size).toBe(1);
    expect(new Set(answers.map((a) => a.body.balance))).toEqual(new Set([4]));
    const rows = await currentDb().select({ n: count() }).from(creditEntry).where(eq(creditEntry.idemKey, `redeem:${key}`));
    expect(rows[0]?.n).toBe(1);
    expect((await balanceOf(technician, desk.world, id)).credits).toBe(4);
  });

  it('answers 409 insufficient_credits at a zero balance, and a manager can remove credits only down to zero', async () => {
    const id = await skaterWith(0);
    const key = newKey('none');
    const none = await write(technician, redeemPath(desk.world, id), {}, key);
    expect(none.status).toBe(409);
    expect(none.body.error.code).toBe('insufficient_credits');
    expect((await write(technician, redeemPath(desk.world, randomUUID()), {})).status).toBe(404);
    await write(manager, `/api/rinks/${desk.world.slug}/customers/${id}/adjustments`, { credits: 2, reason: 'Goodwill' });
    // The refused redemption left its key unclaimed, so the same key now redeems.
    const retried = await write(technician, redeemPath(desk.world, id), {}, key);
    expect(retried.status).toBe(201);
    expect(retried.body.balance).toBe(1);
    await write(manager, `/api/rinks/${desk.world.slug}/customers/${id}/adjustments`, { credits: 1, reason: 'Goodwill' });
    const tooMany = await write(manager, `/api/rinks/${desk.world.slug}/customers/${id}/adjustments`, { credits: -3, reason: 'Mistake' });
    expect(tooMany.status).toBe(409);
    const fine = await write(manager, `/api/rinks/${desk.world.slug}/customers/${id}/adjustments`, { credits: -2, reason: 'Mistake' });
    expect(fine.status).toBe(201);
    expect(fine.body.balance).toBe(0);
    expect((await write(technician, `/api/rinks/${desk.world.slug}/customers/${id}/adjustments`, { credits: 1, reason: 'Not allowed' })).status).toBe(403);
  });
});

describe('webhooks', () => {
  const stripe = api.payments;

  async function connectEvents(type?: string) {
    const list = await api.payments.events.list({ limit: 100, ...(type ? { type } : {}) }, { stripeAccount: account });
    return list.data;
  }

  async function post(payload: string, header: string) {
    return api.client().post('/api/webhooks/stripe-connect').set('Stripe-Signature', header).set('Content-Type', 'application/json').send(payload);
  }

  it('rejects a forged or a stale signature with 400 and changes nothing', async () => {
    const [event] = await connectEvents('checkout.session.completed');
    const payload = JSON.stringify(event);
    const before = await currentDb().select({ n: count() }).from(creditEntry);
    const forged = stripe.webhooks.generateTestHeaderString({ payload, secret: 'whsec_forged' });
    expect((await post(payload, forged)).status).toBe(400);
    const [secret] = await webhookSecrets('connect');
    // The SDK's default tolerance is 300 s (stripe-node, webhooks.constructEvent): ten minutes old is stale.
    const stale = stripe.webhooks.generateTestHeaderString({ payload, secret: secret!, timestamp: Math.floor(Date.now() / 1000) - 600 });
    expect((await post(payload, stale)).status).toBe(400);
    expect((await post(payload, 'garbage')).status).toBe(400);
    expect(await currentDb().select({ n: count() }).from(creditEntry)).toEqual(before);
  });

  it('marks a checkout failed when it expires or its delayed payment fails, and grants nothing', async () => {
    const [secret] = await webhookSecrets('connect');
    for (const type of ['checkout.session.expired', 'checkout.session.async_payment_failed'] as const) {
      const email = uniqueEmail('unpaid');
      const started = await api.client().post(`/api/public/rinks/${desk.world.slug}/checkout`).send({ productId: card.id, email, name: 'Unpaid Skater' });
      expect(started.status).toBe(201);
      const [pending] = await currentDb().select().from(paymentTable).where(eq(paymentTable.tenantId, desk.world.id)).orderBy(desc(paymentTable.createdAt)).limit(1);
      const sessionId = pending!.checkoutSessionId!;
      const statusOf = async () => (await api.client().get(`/api/public/rinks/${desk.world.slug}/checkout/${sessionId}`)).body.state as string;
      expect(await statusOf()).toBe('pending');
      // The event as the payment service sends it (stripe-node's Event shape), about the session it made.
      const session = await stripe.checkout.sessions.retrieve(sessionId, {}, { stripeAccount: account });
      const payload = JSON.stringify({ id: `evt_${randomUUID().replaceAll('-', '')}`, object: 'event', type, account, created: Math.floor(Date.now() / 1000), data: { object: session }, livemode: false, pending_webhooks: 1, request: { id: null, idempotency_key: null } });
      expect((await post(payload, stripe.webhooks.generateTestHeaderString({ payload, secret: secret! }))).status).toBe(200);
      expect(await statusOf(), type).toBe('failed');
      const found = await manager.get(`/api/rinks/${desk.world.slug}/customers`).query({ q: email });
      for (const c of found.body.customers as { id: string }[]) expect((await balanceOf(manager, desk.world, c.id)).credits).toBe(0);
    }
  });

  it('gives exact balances when each event of two purchases is delivered 10 times, shuffled with its neighbours', async () => {
    const emails = [uniqueEmail('shuffle-a'), uniqueEmail('shuffle-b')];
    for (const email of emails) await buyOnline(email);
    const [secret] = await webhookSecrets('connect');
    const events = (await connectEvents()).filter((e) => JSON.stringify(e.data.object).includes('payment_id')).slice(0, 12);
    const deliveries = events.flatMap((e) => Array.from({ length: 10 }, () => JSON.stringify(e)));
    // A seeded shuffle (mulberry32), so a failure can be replayed.
    let seed = 20261202;
    const random = () => {
      seed = (seed + 0x6d2b79f5) | 0;
      let t = Math.imul(seed ^ (seed >>> 15), 1 | seed);
      t = (t + Math.imul(t ^ (t >>> 7), 61 | t)) ^ t;
      return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
    };
    for (let i = deliveries.length - 1; i > 0; i--) {
      const j = Math.floor(random() * (i + 1));
      [deliveries[i], deliveries[j]] = [deliveries[j]!, deliveries[i]!];
    }
    const answers = await Promise.all(deliveries.map((payload) => post(payload, stripe.webhooks.generateTestHeaderString({ payload, secret: secret! }))));
    expect(answers.every((a) => a.status === 200)).toBe(true);
    for (const email of emails) {
      const found = await manager.get(`/api/rinks/${desk.world.slug}/customers`).query({ q: email });
      const id = found.body.customers[0].id as string;
      const balance = await eventually(() => balanceOf(manager, desk.world, id), (b) => b.credits === 10);
      expect(balance.lots).toHaveLength(1);
      expect(await entriesOf(balance.lots[0]!.id)).toBe(1);
    }
  }, 40_000);
});

describe('counter sales and refunds', () => {
  it('sells for cash, refunds the unused share by cumulative rounding, and removes those credits', async () => {
    // Hand-worked: 3 credits for 49.99. One redeemed is worth round(4999 × 1 / 3) = 1666, so the refund of the
    // other two is 4999 − 1666 = 3333 (cumulative rounding: the parts add up to the price exactly).
    const odd = await addProduct(manager, desk.world, { kind: 'punch_card', name: 'Three sharpenings', credits: 3, priceMinor: 4999, monthsValid: 6, listed: true });
    const skater = await createCustomerAt(desk.world.id, { name: 'Refund Skater', email: uniqueEmail('refund') });
    const sold = await write(technician, `/api/rinks/${desk.world.slug}/customers/${skater.id}/sales`, { productId: odd.id, paymentMethodId: 'cash' });
    expect(sold.status).toBe(201);
    expect(sold.body).toMatchObject({ balance: 3, payment: { state: 'paid', amountMinor: 4999, feeMinor: 0, channel: 'counter' } });
    await write(technician, redeemPath(desk.world, skater.id), {});
    const quote = await manager.get(`/api/rinks/${desk.world.slug}/payments/${sold.body.payment.id}/refund-quote`);
    expect(quote.body).toMatchObject({ credits: 2, refundMinor: 3333 });
    expect(quote.body.rule).toContain('2 of 3');
    expect((await write(technician, `/api/rinks/${desk.world.slug}/payments/${sold.body.payment.id}/refunds`, { reason: 'Moving away' })).status).toBe(403);
    const refunded = await write(manager, `/api/rinks/${desk.world.slug}/payments/${sold.body.payment.id}/refunds`, { reason: 'Moving away' });
    expect(refunded.status).toBe(201);
    expect(refunded.body).toMatchObject({ state: 'partially_refunded', refundedMinor: 3333 });
    expect((await balanceOf(manager, desk.world, skater.id)).credits).toBe(0);
    const again = await write(manager, `/api/rinks/${desk.world.slug}/payments/${sold.body.payment.id}/refunds`, { reason: 'Twice' });
    expect(again.status).toBe(409);
  });

  it('charges a test card through the payment service with the platform’s fee, and refunds it there', async () => {
    const skater = await createCustomerAt(desk.world.id, { name: 'Card Skater', email: uniqueEmail('card') });
    const declined = await write(technician, `/api/rinks/${desk.world.slug}/customers/${skater.id}/sales`, { productId: card.id, paymentMethodId: 'pm_card_chargeDeclined' });
    expect(declined.status).toBe(402);
    expect((await balanceOf(technician, desk.world, skater.id)).credits).toBe(0);
    const sold = await write(technician, `/api/rinks/${desk.world.slug}/customers/${skater.id}/sales`, { productId: card.id, paymentMethodId: 'pm_card_visa' });
    expect(sold.status).toBe(201);
    expect(sold.body.payment).toMatchObject({ feeMinor: 150, state: 'paid' });
    const refunded = await write(manager, `/api/rinks/${desk.world.slug}/payments/${sold.body.payment.id}/refunds`, { reason: 'Changed mind' });
    expect(refunded.body).toMatchObject({ state: 'refunded', refundedMinor: 5000 });
    const refunds = await api.payments.refunds.list({ limit: 10 }, { stripeAccount: account });
    expect(refunds.data.some((r) => r.amount === 5000)).toBe(true);
  });
});

describe('the nightly sweep', () => {
  it('expires lots past their date as breakage at their remaining value, once', async () => {
    const skater = await createCustomerAt(desk.world.id, { name: 'Expiry Skater', email: uniqueEmail('expiry') });
    await write(technician, `/api/rinks/${desk.world.slug}/customers/${skater.id}/sales`, { productId: card.id, paymentMethodId: 'cash' });
    for (let i = 0; i < 4; i++) await write(technician, redeemPath(desk.world, skater.id), {});
    // Hand-worked: 10 credits for 50.00, 4 used; the 6 left are worth 5000 − round(5000 × 4 / 10) = 3000.
    const yearOn = new Date(Date.now() + 400 * 86_400_000);
    const deps = { env: api.env, mailer: api.mailer, logger: api.logger };
    await sweepRink(desk.world.id, deps, yearOn);
    await sweepRink(desk.world.id, deps, yearOn);
    const account = await balanceOf(manager, desk.world, skater.id);
    const lotId = account.lots[0]!.id;
    const expired = await currentDb().select().from(creditEntry).where(eq(creditEntry.lotId, lotId));
    const breakage = expired.filter((e) => e.kind === 'expire');
    expect(breakage).toHaveLength(1);
    expect(breakage[0]).toMatchObject({ credits: -6, valueMinor: -3000 });
  });
});
