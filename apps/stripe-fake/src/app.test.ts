import { mkdtempSync, existsSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import request from 'supertest';
import Stripe from 'stripe';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createApp } from './app';
import { type RunningFake, startFake, submit } from './testing';

// Wire format, errors, idempotency, pagination, connected accounts, the catalog and the snapshot.
// The SDK (stripe-node 22) is the client: it decodes answers and picks error classes as it does against the real service.

describe('payment fake: wire format and catalog', () => {
  let fake: RunningFake;
  let stripe: Stripe;

  beforeAll(async () => {
    fake = await startFake();
    stripe = fake.stripe;
  });
  afterAll(() => fake.close());

  it('answers its health check', async () => {
    const app = createApp();
    const response = await request(app).get('/health');
    app.fake.close();

    expect(response.status).toBe(200);
    expect(response.body).toEqual({ status: 'ok' });
  });

  it('creates, retrieves, updates, lists and deletes customers', async () => {
    const customer = await stripe.customers.create({ email: 'mira.holt@example.test', name: 'Mira Holt', metadata: { rink: 'ice-harbor', lane: '2' } });
    expect(customer.id).toMatch(/^cus_\w{24}$/);
    expect(customer).toMatchObject({ object: 'customer', livemode: false, metadata: { rink: 'ice-harbor', lane: '2' } });
    expect(Math.abs(customer.created - Date.now() / 1000)).toBeLessThan(5);

    // Stripe API reference, "Metadata": keys merge, an empty string unsets one.
    const updated = await stripe.customers.update(customer.id, { name: 'Mira H. Holt', metadata: { lane: '', coach: 'yes' } });
    expect(updated.name).toBe('Mira H. Holt');
    expect(updated.metadata).toEqual({ rink: 'ice-harbor', coach: 'yes' });
    expect((await stripe.customers.retrieve(customer.id)) as Stripe.Customer).toMatchObject({ name: 'Mira H. Holt' });

    expect((await stripe.customers.list({ email: 'mira.holt@example.test' })).data.map((c) => c.id)).toEqual([customer.id]);

    expect(await stripe.customers.del(customer.id)).toMatchObject({ id: customer.id, deleted: true });
    // Stripe API reference, "Retrieve a customer": a deleted customer answers with deleted: true.
    expect(await stripe.customers.retrieve(customer.id)).toMatchObject({ deleted: true });
    expect((await stripe.customers.list({ email: 'mira.holt@example.test' })).data).toEqual([]);
  });

  it('paginates newest first with has_more, starting_after, ending_before and auto-paging', async () => {
    const ids: string[] = [];
    for (let i = 0; i < 12; i++) ids.push((await stripe.customers.create({ email: 'pages@example.test', name: `Skater ${i}` })).id);
    const newestFirst = [...ids].reverse();

    const first = await stripe.customers.list({ email: 'pages@example.test', limit: 5 });
    expect(first).toMatchObject({ object: 'list', has_more: true, url: '/v1/customers' });
    expect(first.data.map((c) => c.id)).toEqual(newestFirst.slice(0, 5));

    const second = await stripe.customers.list({ email: 'pages@example.test', limit: 5, starting_after: newestFirst[4] });
    expect(second.data.map((c) => c.id)).toEqual(newestFirst.slice(5, 10));
    const last = await stripe.customers.list({ email: 'pages@example.test', limit: 5, starting_after: newestFirst[9] });
    expect(last.has_more).toBe(false);
    expect(last.data).toHaveLength(2);

    const back = await stripe.customers.list({ email: 'pages@example.test', limit: 3, ending_before: newestFirst[5] });
    expect(back.data.map((c) => c.id)).toEqual(newestFirst.slice(2, 5));
    expect(back.has_more).toBe(true);

    // Default limit 10 (Stripe API reference, "Pagination").
    expect((await stripe.customers.list({ email: 'pages@example.test' })).data).toHaveLength(10);
    const all = await stripe.customers.list({ email: 'pages@example.test', limit: 4 }).autoPagingToArray({ limit: 100 });
    expect(all.map((c) => c.id)).toEqual(newestFirst);

    await expect(stripe.customers.list({ limit: 101 })).rejects.toBeInstanceOf(Stripe.errors.StripeInvalidRequestError);
  });

  it('raises the SDK error classes for the real statuses and types', async () => {
    const missing = await stripe.customers.retrieve('cus_doesnotexist').catch((error: unknown) => error);
    expect(missing).toBeInstanceOf(Stripe.errors.StripeInvalidRequestError);
    expect(missing).toMatchObject({ statusCode: 404, code: 'resource_missing', message: "No such customer: 'cus_doesnotexist'" });

    const unknown = await stripe.customers.create({ colour: 'blue' } as Stripe.CustomerCreateParams).catch((error: unknown) => error);
    expect(unknown).toMatchObject({ statusCode: 400, param: 'colour', message: 'Received unknown parameter: colour' });

    const port = Number(new URL(fake.url).port);
    const liveKey = new Stripe('sk_live_nothere', { host: '127.0.0.1', port, protocol: 'http', maxNetworkRetries: 0 });
    await expect(liveKey.customers.list()).rejects.toBeInstanceOf(Stripe.errors.StripeAuthenticationError);

    const raw = await fetch(`${fake.url}/v1/customers`);
    expect(raw.status).toBe(401);
    expect(((await raw.json()) as { error: { type: string } }).error.type).toBe('invalid_request_error');

    const route = await fetch(`${fake.url}/v1/skates`, { headers: { Authorization: 'Bearer sk_test_x' } });
    expect(route.status).toBe(404);
  });

  it('replays an idempotent request, refuses the key with other parameters, and answers 409 while the first runs', async () => {
    const key = 'order-ice-harbor-1';
    const first = await stripe.customers.create({ email: 'twice@example.test', metadata: { a: '1', b: '2' } }, { idempotencyKey: key });
    const again = await stripe.customers.create({ email: 'twice@example.test', metadata: { a: '1', b: '2' } }, { idempotencyKey: key });
    expect(again.id).toBe(first.id);
    expect(again.lastResponse.headers['idempotent-replayed']).toBe('true');
    expect((await stripe.customers.list({ email: 'twice@example.test' })).data).toHaveLength(1);

    // Stripe API reference, "Idempotent requests": the same key with different parameters is an idempotency_error.
    const mismatch = await stripe.customers.create({ email: 'other@example.test' }, { idempotencyKey: key }).catch((error: unknown) => error);
    expect(mismatch).toBeInstanceOf(Stripe.errors.StripeIdempotencyError);
    expect(mismatch).toMatchObject({ statusCode: 400 });

    // Parameter order does not matter.
    const headers = { Authorization: 'Bearer sk_test_x', 'Idempotency-Key': 'order-swap', 'Content-Type': 'application/x-www-form-urlencoded' };
    const a = await fetch(`${fake.url}/v1/products`, { method: 'POST', headers, body: 'name=Sharpening&metadata[x]=1&description=Flat' });
    const b = await fetch(`${fake.url}/v1/products`, { method: 'POST', headers, body: 'description=Flat&metadata[x]=1&name=Sharpening' });
    expect(b.headers.get('idempotent-replayed')).toBe('true');
    expect(b.status).toBe(a.status);
    expect(await b.text()).toBe(await a.text());

    // Keys are per account: the same key on a connected account is a new request.
    const account = await stripe.accounts.create({ type: 'standard', email: 'owner@example.test' });
    const elsewhere = await stripe.customers.create({ email: 'twice@example.test', metadata: { a: '1', b: '2' } }, { idempotencyKey: key, stripeAccount: account.id });
    expect(elsewhere.id).not.toBe(first.id);

    fake.app.fake.store.idempotency.set(`${fake.app.fake.store.platform} in-flight`, { state: 'running', fingerprint: 'x', at: Date.now() });
    const busy = await stripe.customers.create({ email: 'busy@example.test' }, { idempotencyKey: 'in-flight' }).catch((error: unknown) => error);
    expect(busy).toMatchObject({ statusCode: 409, code: 'idempotency_key_in_use' });

    // DELETE requests take a key too.
    const doomed = await stripe.customers.create({ email: 'doomed@example.test' });
    await stripe.customers.del(doomed.id, {}, { idempotencyKey: 'delete-once' });
    const deletedAgain = await stripe.customers.del(doomed.id, {}, { idempotencyKey: 'delete-once' });
    expect(deletedAgain.lastResponse.headers['idempotent-replayed']).toBe('true');
  });

  it('keeps products and prices, with immutable amounts and list filters', async () => {
    const product = await stripe.products.create({ name: 'Sharpening, 10 pairs', description: 'Punch card', metadata: { kind: 'card' } });
    expect(product).toMatchObject({ object: 'product', active: true, default_price: null });
    const monthly = await stripe.prices.create({ product: product.id, unit_amount: 4500, currency: 'usd', recurring: { interval: 'month', interval_count: 1 }, nickname: 'Monthly' });
    expect(monthly).toMatchObject({ object: 'price', type: 'recurring', unit_amount: 4500, recurring: { interval: 'month', interval_count: 1 } });
    const once = await stripe.prices.create({ product: product.id, unit_amount: 9000, currency: 'usd' });
    expect(once.type).toBe('one_time');

    await stripe.prices.update(once.id, { active: false, metadata: { retired: 'yes' } });
    // Stripe API reference, "Update a price": unit_amount cannot be changed.
    await expect(stripe.prices.update(once.id, { unit_amount: 100 } as Stripe.PriceUpdateParams)).rejects.toMatchObject({ param: 'unit_amount' });

    expect((await stripe.prices.list({ product: product.id, active: true })).data.map((p) => p.id)).toEqual([monthly.id]);
    expect((await stripe.prices.list({ product: product.id })).data.map((p) => p.id)).toEqual([once.id, monthly.id]);

    const updated = await stripe.products.update(product.id, { default_price: monthly.id, name: 'Sharpening card' });
    expect(updated).toMatchObject({ default_price: monthly.id, name: 'Sharpening card' });
    const expanded = await stripe.products.retrieve(product.id, { expand: ['default_price'] });
    expect((expanded.default_price as Stripe.Price).unit_amount).toBe(4500);
    await expect(stripe.products.retrieve(product.id, { expand: ['nothing_here'] })).rejects.toBeInstanceOf(Stripe.errors.StripeInvalidRequestError);
  });

  it('isolates connected accounts and onboards them through the hosted page', async () => {
    const account = await stripe.accounts.create({ type: 'standard', country: 'US', email: 'owner@north-pond.example.test', business_profile: { name: 'North Pond Arena' } });
    expect(account).toMatchObject({ object: 'account', charges_enabled: false, details_submitted: false, payouts_enabled: false, business_profile: { name: 'North Pond Arena' } });
    expect((await stripe.accounts.list({ limit: 100 })).data.map((a) => a.id)).toContain(account.id);

    const theirs = await stripe.customers.create({ email: 'skater@north-pond.example.test' }, { stripeAccount: account.id });
    await expect(stripe.customers.retrieve(theirs.id)).rejects.toMatchObject({ statusCode: 404 });
    expect((await stripe.customers.retrieve(theirs.id, {}, { stripeAccount: account.id })).id).toBe(theirs.id);
    expect((await stripe.customers.list({ email: 'skater@north-pond.example.test' })).data).toEqual([]);
    await expect(stripe.customers.list({}, { stripeAccount: 'acct_nobodyhere' })).rejects.toBeInstanceOf(Stripe.errors.StripePermissionError);

    const link = await stripe.accountLinks.create({
      account: account.id,
      refresh_url: 'http://127.0.0.1:3000/refresh',
      return_url: 'http://127.0.0.1:3000/settings/payments?done=1',
      type: 'account_onboarding',
    });
    expect(link.object).toBe('account_link');
    const page = await fetch(link.url);
    const html = await page.text();
    expect(html).toContain('<title>Payment service test onboarding</title>');
    expect(html).toContain('North Pond Arena');

    const done = await submit(`${fake.url}/onboarding/${account.id}`, { return_url: 'http://127.0.0.1:3000/settings/payments?done=1' });
    expect(done.status).toBe(303);
    expect(done.location).toBe('http://127.0.0.1:3000/settings/payments?done=1');
    expect(await stripe.accounts.retrieve(account.id)).toMatchObject({ charges_enabled: true, details_submitted: true, payouts_enabled: true });
    const events = await stripe.events.list({ type: 'account.updated' }, { stripeAccount: account.id });
    expect(events.data[0]).toMatchObject({ account: account.id, data: { object: { id: account.id, charges_enabled: true }, previous_attributes: { charges_enabled: false } } });

    const other = await stripe.accounts.create({ type: 'express' });
    const viaSwitch = await fetch(`${fake.url}/_fake/accounts/${other.id}/complete_onboarding`, { method: 'POST' });
    expect(((await viaSwitch.json()) as { charges_enabled: boolean }).charges_enabled).toBe(true);
  });

  it('shows a developer page with objects and events', async () => {
    const customer = await stripe.customers.create({ email: 'page-visitor@example.test' });
    const html = await (await fetch(`${fake.url}/`)).text();
    expect(html).toContain('Payment service fake');
    expect(html).toContain(`/_fake/objects/${customer.id}`);
    expect(html).toContain('customer.created');
    const json = (await (await fetch(`${fake.url}/_fake/objects/${customer.id}`)).json()) as { object: { email: string } };
    expect(json.object.email).toBe('page-visitor@example.test');
  });
});

describe('payment fake: snapshot', () => {
  it('saves its state to the snapshot file and loads it again', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'stripe-fake-'));
    const stateFile = join(dir, 'state.json');
    try {
      const first = await startFake({ stateFile });
      const customer = await first.stripe.customers.create({ email: 'kept@example.test' });
      const account = await first.stripe.accounts.create({ type: 'standard' });
      const theirs = await first.stripe.products.create({ name: 'Skate sharpening' }, { stripeAccount: account.id });
      await first.stripe.customers.create({ email: 'replayed@example.test' }, { idempotencyKey: 'kept-key' });
      await new Promise((resolve) => setTimeout(resolve, 350));
      expect(existsSync(stateFile)).toBe(true);
      await first.close();

      const second = await startFake({ stateFile });
      expect(second.app.fake.store.platform).toBe(first.app.fake.store.platform);
      expect(((await second.stripe.customers.retrieve(customer.id)) as Stripe.Customer).email).toBe('kept@example.test');
      expect((await second.stripe.products.retrieve(theirs.id, {}, { stripeAccount: account.id })).name).toBe('Skate sharpening');
      const replay = await second.stripe.customers.create({ email: 'replayed@example.test' }, { idempotencyKey: 'kept-key' });
      expect(replay.lastResponse.headers['idempotent-replayed']).toBe('true');
      await second.close();
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  });
});
