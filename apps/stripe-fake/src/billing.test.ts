import Stripe from 'stripe';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { periodBoundary } from './billing';
import { type Receiver, type RunningFake, startFake, startReceiver, submit, until } from './testing';
import type { Delivery } from './store';

// Subscriptions, invoices, test clocks, and webhook delivery (signatures, retries, chaos).

type WithPeriod = Stripe.Subscription & { current_period_start: number; current_period_end: number };
const at = (iso: string) => Date.parse(iso) / 1000;

describe('payment fake: billing periods', () => {
  it('keeps the anchor day and clamps it to short months', () => {
    // Stripe docs, "Billing cycle": a monthly subscription anchored on the 31st bills on the last day of shorter months.
    const anchor = at('2031-01-31T12:00:00Z');
    expect(periodBoundary(anchor, 'month', 1, 1)).toBe(at('2031-02-28T12:00:00Z'));
    expect(periodBoundary(anchor, 'month', 1, 2)).toBe(at('2031-03-31T12:00:00Z'));
    expect(periodBoundary(anchor, 'month', 1, 13)).toBe(at('2032-02-29T12:00:00Z'));
    expect(periodBoundary(anchor, 'year', 1, 1)).toBe(at('2032-01-31T12:00:00Z'));
    expect(periodBoundary(anchor, 'week', 2, 1)).toBe(anchor + 14 * 86_400);
    expect(periodBoundary(anchor, 'day', 1, 3)).toBe(anchor + 3 * 86_400);
  });
});

describe('payment fake: subscriptions and test clocks', () => {
  let fake: RunningFake;
  let stripe: Stripe;
  let monthly: Stripe.Price;

  beforeAll(async () => {
    fake = await startFake();
    stripe = fake.stripe;
    const product = await stripe.products.create({ name: 'Membership' });
    monthly = await stripe.prices.create({ product: product.id, unit_amount: 1500, currency: 'usd', recurring: { interval: 'month' } });
  });
  afterAll(() => fake.close());

  async function advance(clock: string, to: number, account?: string): Promise<void> {
    const options = account ? { stripeAccount: account } : {};
    const advancing = await stripe.testHelpers.testClocks.advance(clock, { frozen_time: to }, options);
    expect(advancing.status).toBe('advancing');
    await until(() => stripe.testHelpers.testClocks.retrieve(clock, {}, options), (c) => c.status === 'ready');
  }

  it('renews on the clock, one paid invoice per period', async () => {
    const clock = await stripe.testHelpers.testClocks.create({ frozen_time: at('2031-01-31T12:00:00Z'), name: 'Renewals' });
    expect(clock).toMatchObject({ object: 'test_helpers.test_clock', status: 'ready' });
    const customer = await stripe.customers.create({ email: 'lea.marsh@example.test', test_clock: clock.id, invoice_settings: { default_payment_method: 'pm_card_visa' } });
    expect(customer.created).toBe(clock.frozen_time);

    const sub = (await stripe.subscriptions.create({ customer: customer.id, items: [{ price: monthly.id, quantity: 2 }], metadata: { tier: 'family' } })) as unknown as WithPeriod;
    expect(sub).toMatchObject({ status: 'active', metadata: { tier: 'family' }, current_period_start: clock.frozen_time, current_period_end: at('2031-02-28T12:00:00Z') });
    expect(sub.created).toBe(clock.frozen_time);

    await advance(clock.id, at('2031-04-01T00:00:00Z'));
    const renewed = (await stripe.subscriptions.retrieve(sub.id, { expand: ['latest_invoice'] })) as unknown as WithPeriod;
    expect(renewed).toMatchObject({ status: 'active', current_period_start: at('2031-03-31T12:00:00Z'), current_period_end: at('2031-04-30T12:00:00Z') });
    expect(renewed.latest_invoice).toMatchObject({ status: 'paid', billing_reason: 'subscription_cycle', amount_paid: 3000, created: at('2031-03-31T12:00:00Z') });

    const invoices = await stripe.invoices.list({ subscription: sub.id });
    expect(invoices.data.map((invoice) => [invoice.billing_reason, invoice.status])).toEqual([
      ['subscription_cycle', 'paid'],
      ['subscription_cycle', 'paid'],
      ['subscription_create', 'paid'],
    ]);
    const updates = await stripe.events.list({ type: 'customer.subscription.updated', limit: 2 });
    expect(updates.data[0]).toMatchObject({ created: at('2031-03-31T12:00:00Z'), data: { previous_attributes: { current_period_end: at('2031-03-31T12:00:00Z') } } });
    expect((await stripe.events.list({ type: 'test_helpers.test_clock.ready', limit: 1 })).data[0]?.data.object).toMatchObject({ id: clock.id, status: 'ready' });
    expect((await stripe.events.list({ type: 'invoice.*', limit: 100 })).data.every((event) => event.type.startsWith('invoice.'))).toBe(true);
  });

  it('fails a renewal when the card fails later, goes past_due and recovers through invoice pay', async () => {
    const clock = await stripe.testHelpers.testClocks.create({ frozen_time: at('2031-05-10T09:00:00Z') });
    const customer = await stripe.customers.create({ email: 'otto.lind@example.test', test_clock: clock.id });
    const session = await stripe.checkout.sessions.create({
      mode: 'subscription',
      customer: customer.id,
      line_items: [{ price: monthly.id, quantity: 1 }],
      success_url: 'http://127.0.0.1:3000/ok',
    });
    const paid = await submit(session.url ?? '', { email: 'otto.lind@example.test', card_number: '4000 0000 0000 0341', expiry: '12/34', cvc: '123' });
    expect(paid.status).toBe(303);
    const subId = (await stripe.checkout.sessions.retrieve(session.id)).subscription as string;
    expect((await stripe.subscriptions.retrieve(subId)).status).toBe('active');

    await advance(clock.id, at('2031-06-11T00:00:00Z'));
    const sub = await stripe.subscriptions.retrieve(subId, { expand: ['latest_invoice'] });
    expect(sub.status).toBe('past_due');
    const invoice = sub.latest_invoice as Stripe.Invoice;
    expect(invoice).toMatchObject({ status: 'open', billing_reason: 'subscription_cycle', attempt_count: 1, amount_paid: 0 });
    const failedEvent = (await stripe.events.list({ type: 'invoice.payment_failed', limit: 1 })).data[0];
    expect(failedEvent?.data.object).toMatchObject({ id: invoice.id });
    expect((await stripe.invoices.list({ customer: customer.id, status: 'open' })).data.map((i) => i.id)).toEqual([invoice.id]);

    await expect(stripe.invoices.pay(invoice.id)).rejects.toBeInstanceOf(Stripe.errors.StripeCardError);
    await stripe.customers.update(customer.id, { invoice_settings: { default_payment_method: 'pm_card_visa' } });
    const retried = await stripe.invoices.pay(invoice.id, { expand: ['payment_intent'] } as Stripe.InvoicePayParams);
    expect(retried).toMatchObject({ status: 'paid', amount_paid: 1500, attempt_count: 3 });
    expect((retried as unknown as { payment_intent: Stripe.PaymentIntent }).payment_intent.status).toBe('succeeded');
    expect((await stripe.subscriptions.retrieve(subId)).status).toBe('active');
  });

  it('ends a cancel-at-period-end subscription at the period end, and cancels at once on delete', async () => {
    const clock = await stripe.testHelpers.testClocks.create({ frozen_time: at('2031-03-01T00:00:00Z') });
    const customer = await stripe.customers.create({ email: 'ida.berg@example.test', test_clock: clock.id, invoice_settings: { default_payment_method: 'pm_card_visa' } });
    const sub = await stripe.subscriptions.create({ customer: customer.id, items: [{ price: monthly.id }] });
    const marked = await stripe.subscriptions.update(sub.id, { cancel_at_period_end: true, items: [{ quantity: 4 }] } as Stripe.SubscriptionUpdateParams);
    expect(marked).toMatchObject({ cancel_at_period_end: true, cancel_at: at('2031-04-01T00:00:00Z'), status: 'active' });
    expect(marked.items.data[0]?.quantity).toBe(4);

    await advance(clock.id, at('2031-04-15T00:00:00Z'));
    expect(await stripe.subscriptions.retrieve(sub.id)).toMatchObject({ status: 'canceled', ended_at: at('2031-04-01T00:00:00Z') });
    expect((await stripe.events.list({ type: 'customer.subscription.deleted', limit: 1 })).data[0]?.data.object).toMatchObject({ id: sub.id });
    expect((await stripe.invoices.list({ subscription: sub.id })).data).toHaveLength(1);
    expect((await stripe.subscriptions.list({ customer: customer.id })).data).toEqual([]);
    expect((await stripe.subscriptions.list({ customer: customer.id, status: 'canceled' })).data).toHaveLength(1);

    const other = await stripe.subscriptions.create({ customer: customer.id, items: [{ price: monthly.id }] });
    expect(await stripe.subscriptions.cancel(other.id)).toMatchObject({ status: 'canceled' });

    const bare = await stripe.customers.create({ email: 'no-card@example.test' });
    await expect(stripe.subscriptions.create({ customer: bare.id, items: [{ price: monthly.id }] })).rejects.toBeInstanceOf(Stripe.errors.StripeInvalidRequestError);
    const declined = await stripe.subscriptions.create({ customer: bare.id, items: [{ price: monthly.id }], default_payment_method: 'pm_card_chargeDeclined' });
    expect(declined.status).toBe('incomplete');
  });

  it('takes the platform fee from subscription invoices of a connected account on its own clock', async () => {
    const rink = (await stripe.accounts.create({ type: 'standard', business_profile: { name: 'North Pond Arena' } })).id;
    const on = { stripeAccount: rink };
    const product = await stripe.products.create({ name: 'Skate club' }, on);
    const price = await stripe.prices.create({ product: product.id, unit_amount: 2999, currency: 'usd', recurring: { interval: 'month' } }, on);
    const clock = await stripe.testHelpers.testClocks.create({ frozen_time: at('2031-01-15T00:00:00Z') }, on);
    const customer = await stripe.customers.create({ email: 'member@north-pond.example.test', test_clock: clock.id, invoice_settings: { default_payment_method: 'pm_card_visa' } }, on);
    const sub = await stripe.subscriptions.create({ customer: customer.id, items: [{ price: price.id }], application_fee_percent: 7.5 }, on);
    expect(sub.application_fee_percent).toBe(7.5);
    await advance(clock.id, at('2031-02-16T00:00:00Z'), rink);

    const fees = (await stripe.applicationFees.list({ limit: 100 })).data.filter((fee) => fee.account === rink);
    // round(2999 × 7.5 / 100) = round(224.925) = 225, twice (first invoice and one renewal).
    expect(fees.map((fee) => fee.amount)).toEqual([225, 225]);
    await expect(stripe.subscriptions.retrieve(sub.id)).rejects.toMatchObject({ statusCode: 404 });
    await expect(stripe.subscriptions.create({ customer: customer.id, items: [{ price: price.id }], application_fee_percent: 5 })).rejects.toMatchObject({ statusCode: 404 });
  });
});

describe('payment fake: webhooks', () => {
  let fake: RunningFake;
  let stripe: Stripe;
  let receiver: Receiver;

  beforeAll(async () => {
    fake = await startFake({ retryBaseMs: 25, maxAttempts: 3, shuffleWindowMs: 100 });
    stripe = fake.stripe;
  });
  afterAll(() => fake.close());

  async function withReceiver<T>(run: (r: Receiver) => Promise<T>): Promise<T> {
    receiver = await startReceiver();
    try {
      return await run(receiver);
    } finally {
      await receiver.close();
    }
  }

  async function deliveries(endpoint: string): Promise<Delivery[]> {
    return ((await (await fetch(`${fake.url}/_fake/deliveries?endpoint=${endpoint}`)).json()) as { data: Delivery[] }).data;
  }

  it('signs deliveries so constructEvent verifies them and a tampered body fails', () =>
    withReceiver(async (r) => {
      const endpoint = await stripe.webhookEndpoints.create({ url: r.url, enabled_events: ['customer.created'], description: 'API' });
      expect(endpoint.secret).toMatch(/^whsec_/);
      expect((await stripe.webhookEndpoints.retrieve(endpoint.id)).secret).toBeUndefined();

      await stripe.products.create({ name: 'Not subscribed to' });
      const customer = await stripe.customers.create({ email: 'signed@example.test' }, { idempotencyKey: 'signed-1' });
      const [sent] = await r.waitFor(1);
      expect(sent?.headers['content-type']).toBe('application/json; charset=utf-8');
      expect(sent?.headers['user-agent']).toBe('Stripe/1.0 (+https://stripe.com/docs/webhooks)');
      const event = stripe.webhooks.constructEvent(sent?.body ?? '', sent?.signature ?? '', endpoint.secret ?? '');
      expect(event).toMatchObject({ type: 'customer.created', object: 'event', livemode: false, request: { idempotency_key: 'signed-1' }, data: { object: { id: customer.id } } });
      expect(event.id).toMatch(/^evt_/);
      expect(() => stripe.webhooks.constructEvent((sent?.body ?? '').replace('signed@', 'forged@'), sent?.signature ?? '', endpoint.secret ?? '')).toThrow(
        Stripe.errors.StripeSignatureVerificationError,
      );

      const updated = await stripe.webhookEndpoints.update(endpoint.id, { enabled_events: ['customer.created', 'customer.updated'], metadata: { app: 'api' } });
      expect(updated).toMatchObject({ enabled_events: ['customer.created', 'customer.updated'], metadata: { app: 'api' } });
      expect((await stripe.webhookEndpoints.list()).data.map((e) => e.id)).toContain(endpoint.id);
      expect(await stripe.webhookEndpoints.del(endpoint.id)).toMatchObject({ deleted: true });
      await expect(stripe.webhookEndpoints.retrieve(endpoint.id)).rejects.toMatchObject({ statusCode: 404 });
    }));

  it('retries a failing endpoint with doubling delays and records every attempt', () =>
    withReceiver(async (r) => {
      const endpoint = await stripe.webhookEndpoints.create({ url: r.url, enabled_events: ['*'] });
      r.failNext(500, 503);
      await stripe.customers.create({ email: 'retry@example.test' });
      const got = await r.waitFor(3);
      const [a, b, c] = got.map((item) => item.at);
      expect((b ?? 0) - (a ?? 0)).toBeGreaterThanOrEqual(20);
      expect((c ?? 0) - (b ?? 0)).toBeGreaterThanOrEqual(45);
      const [delivery] = await until(() => deliveries(endpoint.id), (list) => list[0]?.status === 'succeeded');
      expect(delivery?.attempts.map((attempt) => attempt.status)).toEqual([500, 503, 200]);

      r.failNext(500, 500, 500);
      await stripe.customers.create({ email: 'gives-up@example.test' });
      const failed = await until(() => deliveries(endpoint.id), (list) => list.some((d) => d.status === 'failed'));
      expect(failed.find((d) => d.status === 'failed')?.attempts).toHaveLength(3);
      await stripe.webhookEndpoints.del(endpoint.id);
    }));

  it('duplicates and shuffles deliveries through the chaos switch, and resends on request', () =>
    withReceiver(async (r) => {
      const endpoint = await stripe.webhookEndpoints.create({ url: r.url, enabled_events: ['product.created'] });
      await fetch(`${fake.url}/_fake/webhook_endpoints/${endpoint.id}/chaos`, { method: 'POST', headers: { 'Content-Type': 'application/json' }, body: JSON.stringify({ duplicates: 2 }) });
      const product = await stripe.products.create({ name: 'Triple' });
      const copies = await r.waitFor(3);
      expect(copies.map((copy) => (JSON.parse(copy.body) as { data: { object: { id: string } } }).data.object.id)).toEqual([product.id, product.id, product.id]);

      await submit(`${fake.url}/_fake/webhook_endpoints/${endpoint.id}/chaos`, { duplicates: '0', shuffle: 'true' });
      r.received.length = 0;
      const started = Date.now();
      const names = ['A', 'B', 'C', 'D', 'E', 'F'];
      for (const name of names) await stripe.products.create({ name });
      const shuffled = await r.waitFor(names.length);
      expect(shuffled[0]?.at ?? 0).toBeGreaterThanOrEqual(started + 90);
      const got = shuffled.map((item) => (JSON.parse(item.body) as { data: { object: { name: string } } }).data.object.name);
      expect([...got].sort()).toEqual(names);

      await submit(`${fake.url}/_fake/webhook_endpoints/${endpoint.id}/chaos`, { shuffle: 'false' });
      r.received.length = 0;
      const event = (await stripe.events.list({ type: 'product.created', limit: 1 })).data[0];
      await fetch(`${fake.url}/_fake/events/${event?.id}/resend`, { method: 'POST' });
      const [again] = await r.waitFor(1);
      expect((JSON.parse(again?.body ?? '{}') as { id: string }).id).toBe(event?.id);
      await stripe.webhookEndpoints.del(endpoint.id);
    }));

  it('sends connected-account events only to connect endpoints', () =>
    withReceiver(async (r) => {
      const platform = await startReceiver();
      try {
        const connect = await stripe.webhookEndpoints.create({ url: r.url, enabled_events: ['customer.created'], connect: true });
        await stripe.webhookEndpoints.create({ url: platform.url, enabled_events: ['customer.created'] });
        const rink = (await stripe.accounts.create({ type: 'standard' })).id;
        await stripe.customers.create({ email: 'member@ice-harbor.example.test' }, { stripeAccount: rink });
        await stripe.customers.create({ email: 'platform-customer@example.test' });
        const [connected] = await r.waitFor(1);
        const [own] = await platform.waitFor(1);
        const event = stripe.webhooks.constructEvent(connected?.body ?? '', connected?.signature ?? '', connect.secret ?? '');
        expect(event.account).toBe(rink);
        expect((JSON.parse(own?.body ?? '{}') as { account?: string }).account).toBeUndefined();
        expect(r.received).toHaveLength(1);
        expect(platform.received).toHaveLength(1);
      } finally {
        await platform.close();
      }
    }));
});
