import Stripe from 'stripe';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { type RunningFake, startFake, submit } from './testing';

// Hosted checkout (payment and subscription mode), payment intents, refunds and application fees.
// Test cards and PaymentMethod tokens: Stripe docs, "Testing".

const CARD = { expiry: '12 / 34', cvc: '123' };

describe('payment fake: checkout, payments and refunds', () => {
  let fake: RunningFake;
  let stripe: Stripe;
  let rink: string;

  beforeAll(async () => {
    fake = await startFake();
    stripe = fake.stripe;
    rink = (await stripe.accounts.create({ type: 'standard', business_profile: { name: 'Ice Harbor' } })).id;
    await fetch(`${fake.url}/_fake/accounts/${rink}/complete_onboarding`, { method: 'POST' });
  });
  afterAll(() => fake.close());

  async function eventTypes(account?: string): Promise<string[]> {
    const events = await stripe.events.list({ limit: 100 }, account ? { stripeAccount: account } : {});
    return events.data.map((event) => event.type).reverse();
  }

  it('takes a card payment on the hosted page of a connected account, with decline and application fee', async () => {
    const on = { stripeAccount: rink };
    const product = await stripe.products.create({ name: 'Sharpening, 5 pairs' }, on);
    const price = await stripe.prices.create({ product: product.id, unit_amount: 2500, currency: 'usd' }, on);
    const session = await stripe.checkout.sessions.create(
      {
        mode: 'payment',
        line_items: [{ price: price.id, quantity: 2 }],
        success_url: 'http://127.0.0.1:3000/paid?session={CHECKOUT_SESSION_ID}',
        cancel_url: 'http://127.0.0.1:3000/cart',
        customer_email: 'jonas.pike@example.test',
        client_reference_id: 'order-17',
        metadata: { order: '17' },
        payment_intent_data: { application_fee_amount: 150, metadata: { order: '17' } },
      },
      on,
    );
    expect(session).toMatchObject({ object: 'checkout.session', status: 'open', payment_status: 'unpaid', amount_total: 5000, currency: 'usd', payment_intent: null });
    expect(session.id).toMatch(/^cs_test_/);
    expect(session.url).toBe(`${fake.url}/checkout/${session.id}`);

    const page = await (await fetch(session.url ?? '')).text();
    expect(page).toContain('test payment page');
    expect(page).toMatch(/<label for="card_number">Card number<\/label>/);
    expect(page).toContain('value="jonas.pike@example.test"');
    expect(page).toContain('Pay $50.00');
    expect(page).toContain('href="http://127.0.0.1:3000/cart"');
    expect(page).toContain('4242 4242 4242 4242');

    const declined = await submit(session.url ?? '', { email: 'jonas.pike@example.test', card_number: '4000 0000 0000 0002', ...CARD });
    expect(declined.status).toBe(402);
    expect(declined.text).toContain('Your card was declined.');
    const afterDecline = await stripe.checkout.sessions.retrieve(session.id, { expand: ['payment_intent'] }, on);
    expect(afterDecline.status).toBe('open');
    expect(afterDecline.payment_intent).toMatchObject({ status: 'requires_payment_method', last_payment_error: { code: 'card_declined' } });

    const paid = await submit(session.url ?? '', { email: 'jonas.pike@example.test', card_number: '4242 4242 4242 4242', ...CARD });
    expect(paid.status).toBe(303);
    expect(paid.location).toBe(`http://127.0.0.1:3000/paid?session=${session.id}`);

    const done = await stripe.checkout.sessions.retrieve(session.id, { expand: ['payment_intent.latest_charge', 'line_items'] }, on);
    expect(done).toMatchObject({ status: 'complete', payment_status: 'paid', url: null, customer_details: { email: 'jonas.pike@example.test' } });
    const intent = done.payment_intent as Stripe.PaymentIntent;
    expect(intent).toMatchObject({ status: 'succeeded', amount: 5000, amount_received: 5000, application_fee_amount: 150, metadata: { order: '17' } });
    expect(intent.latest_charge).toMatchObject({ object: 'charge', status: 'succeeded', amount: 5000, paid: true });
    expect(done.line_items?.data).toMatchObject([{ quantity: 2, amount_total: 5000, price: { id: price.id } }]);
    expect((await stripe.checkout.sessions.listLineItems(session.id, {}, on)).data).toHaveLength(1);
    expect((await stripe.checkout.sessions.list({ payment_intent: intent.id }, on)).data.map((s) => s.id)).toEqual([session.id]);

    const types = await eventTypes(rink);
    expect(types.filter((type) => type.startsWith('payment_intent.') || type.startsWith('charge.') || type.startsWith('checkout.'))).toEqual([
      'payment_intent.created',
      'charge.failed',
      'payment_intent.payment_failed',
      'payment_intent.succeeded',
      'charge.succeeded',
      'checkout.session.completed',
    ]);

    // Stripe docs, "Collect application fees": the fee lands on the platform, pointing at the connected account's charge.
    const fees = await stripe.applicationFees.list();
    const charge = intent.latest_charge as Stripe.Charge;
    expect(fees.data.find((fee) => fee.charge === charge.id)).toMatchObject({ object: 'application_fee', account: rink, amount: 150 });

    const closed = await fetch(session.url ?? `${fake.url}/checkout/${session.id}`);
    expect(closed.status).toBe(410);
  });

  it('refuses an application fee without a connected account, and takes inline price_data', async () => {
    const fee = stripe.checkout.sessions.create({
      mode: 'payment',
      line_items: [{ price_data: { currency: 'usd', unit_amount: 1200, product_data: { name: 'Edge check' } }, quantity: 1 }],
      success_url: 'http://127.0.0.1:3000/ok',
      payment_intent_data: { application_fee_amount: 100 },
    });
    await expect(fee).rejects.toMatchObject({ param: 'payment_intent_data[application_fee_amount]' });

    const session = await stripe.checkout.sessions.create({
      mode: 'payment',
      line_items: [{ price_data: { currency: 'usd', unit_amount: 1200, product_data: { name: 'Edge check' } }, quantity: 3 }],
      success_url: 'http://127.0.0.1:3000/ok',
    });
    expect(session.amount_total).toBe(3600);
    const items = await stripe.checkout.sessions.listLineItems(session.id, { expand: ['data.price.product'] });
    expect((items.data[0]?.price?.product as Stripe.Product).name).toBe('Edge check');

    const expired = await stripe.checkout.sessions.expire(session.id);
    expect(expired).toMatchObject({ status: 'expired', url: null });
    await expect(stripe.checkout.sessions.expire(session.id)).rejects.toBeInstanceOf(Stripe.errors.StripeInvalidRequestError);
  });

  it('asks for a second step with the 3155 card and completes or fails it', async () => {
    const product = await stripe.products.create({ name: 'Profiling' });
    const price = await stripe.prices.create({ product: product.id, unit_amount: 3000, currency: 'usd' });
    const session = await stripe.checkout.sessions.create({ mode: 'payment', line_items: [{ price: price.id, quantity: 1 }], success_url: 'http://127.0.0.1:3000/ok' });
    const url = session.url ?? '';

    const step = await submit(url, { email: 'ana.frost@example.test', card_number: '4000002500003155', ...CARD });
    expect(step.status).toBe(303);
    expect(step.location).toBe(`/checkout/${session.id}/authenticate`);
    const confirmPage = await (await fetch(`${fake.url}${step.location}`)).text();
    expect(confirmPage).toContain('Confirm this payment');
    expect(confirmPage).toContain('Complete authentication');

    const failed = await submit(`${fake.url}${step.location}`, { outcome: 'fail' });
    expect(failed.status).toBe(402);
    expect(failed.text).toContain('unable to authenticate');
    const intent = await stripe.paymentIntents.retrieve((await stripe.checkout.sessions.retrieve(session.id)).payment_intent as string);
    expect(intent.last_payment_error?.code).toBe('payment_intent_authentication_failure');

    await submit(url, { email: 'ana.frost@example.test', card_number: '4000 0025 0000 3155', ...CARD });
    const completed = await submit(`${fake.url}/checkout/${session.id}/authenticate`, { outcome: 'complete' });
    expect(completed.status).toBe(303);
    expect(completed.location).toBe('http://127.0.0.1:3000/ok');
    expect(await stripe.checkout.sessions.retrieve(session.id)).toMatchObject({ status: 'complete', payment_status: 'paid' });

    const bad = await stripe.checkout.sessions.create({ mode: 'payment', line_items: [{ price: price.id, quantity: 1 }], success_url: 'http://127.0.0.1:3000/ok' });
    const wrongNumber = await submit(bad.url ?? '', { email: 'ana.frost@example.test', card_number: '1234', ...CARD });
    expect(wrongNumber.status).toBe(400);
    expect(wrongNumber.text).toContain('Your card number is incorrect.');
  });

  it('subscribes a new customer on the hosted page with the first invoice paid', async () => {
    const product = await stripe.products.create({ name: 'Counter plan' });
    const price = await stripe.prices.create({ product: product.id, unit_amount: 1900, currency: 'usd', recurring: { interval: 'month' } });
    const before = (await stripe.events.list({ limit: 1 })).data[0]?.id;
    const session = await stripe.checkout.sessions.create({
      mode: 'subscription',
      line_items: [{ price: price.id, quantity: 3 }],
      success_url: 'http://127.0.0.1:3000/welcome?s={CHECKOUT_SESSION_ID}',
      customer_email: 'owner@ice-harbor.example.test',
      subscription_data: { metadata: { plan: 'counter' } },
    });
    const page = await (await fetch(session.url ?? '')).text();
    expect(page).toContain('Pay $57.00');

    const paid = await submit(session.url ?? '', { email: 'owner@ice-harbor.example.test', card_number: '4242424242424242', ...CARD });
    expect(paid.location).toBe(`http://127.0.0.1:3000/welcome?s=${session.id}`);
    const done = await stripe.checkout.sessions.retrieve(session.id, { expand: ['subscription.latest_invoice', 'customer'] });
    expect(done).toMatchObject({ status: 'complete', payment_status: 'paid', mode: 'subscription' });
    expect((done.customer as Stripe.Customer).email).toBe('owner@ice-harbor.example.test');
    const sub = done.subscription as Stripe.Subscription & { current_period_end: number; current_period_start: number };
    expect(sub).toMatchObject({ status: 'active', metadata: { plan: 'counter' } });
    expect(sub.items.data[0]).toMatchObject({ quantity: 3, price: { id: price.id } });
    expect(sub.items.data[0]?.current_period_end).toBe(sub.current_period_end);
    const invoice = sub.latest_invoice as Stripe.Invoice;
    expect(invoice).toMatchObject({ status: 'paid', billing_reason: 'subscription_create', amount_due: 5700, amount_paid: 5700, customer: sub.customer });
    expect(invoice.lines.data[0]?.period).toEqual({ start: sub.current_period_start, end: sub.current_period_end });
    const invoices = await stripe.invoices.list({ subscription: sub.id, status: 'paid' });
    expect(invoices.data.map((i) => i.id)).toEqual([invoice.id]);

    const events = await stripe.events.list({ limit: 100, ending_before: before });
    const types = events.data.map((event) => event.type).reverse();
    const order = ['customer.created', 'customer.subscription.created', 'invoice.created', 'invoice.paid', 'invoice.payment_succeeded', 'checkout.session.completed'];
    expect(types.filter((type) => order.includes(type))).toEqual(order);
  });

  it('prefills the e-mail of the session’s customer and keeps it, whatever the form sends', async () => {
    // Stripe API reference, checkout session `customer`: a customer's valid e-mail is prefilled and not editable.
    const product = await stripe.products.create({ name: 'Club' }, { stripeAccount: rink });
    const price = await stripe.prices.create({ product: product.id, unit_amount: 2500, currency: 'usd', recurring: { interval: 'month' } }, { stripeAccount: rink });
    const customer = await stripe.customers.create({ email: 'mira.holt@example.test', name: 'Mira Holt' }, { stripeAccount: rink });
    const session = await stripe.checkout.sessions.create(
      { mode: 'subscription', customer: customer.id, line_items: [{ price: price.id, quantity: 1 }], success_url: 'http://127.0.0.1:3000/thanks' },
      { stripeAccount: rink },
    );
    const page = await (await fetch(session.url ?? '')).text();
    expect(page).toMatch(/name="email"[^>]*value="mira\.holt@example\.test" readonly/);
    const paid = await submit(session.url ?? '', { email: 'someone.else@example.test', card_number: '4242 4242 4242 4242', ...CARD });
    expect(paid.status).toBe(303);
    const done = await stripe.checkout.sessions.retrieve(session.id, {}, { stripeAccount: rink });
    expect(done.customer_details?.email).toBe('mira.holt@example.test');
    expect(done.customer).toBe(customer.id);
  });

  it('runs counter payment intents: success, decline, second step, cancel', async () => {
    const customer = await stripe.customers.create({ email: 'walk-in@example.test' });
    const paid = await stripe.paymentIntents.create({
      amount: 1800,
      currency: 'usd',
      customer: customer.id,
      payment_method: 'pm_card_visa',
      payment_method_types: ['card'],
      confirm: true,
      description: 'Sharpening, 2 pairs',
      metadata: { ticket: 'T-204' },
    });
    expect(paid).toMatchObject({ object: 'payment_intent', status: 'succeeded', amount_received: 1800, metadata: { ticket: 'T-204' } });
    const withCharge = await stripe.paymentIntents.retrieve(paid.id, { expand: ['latest_charge'] });
    expect(withCharge.latest_charge).toMatchObject({ object: 'charge', amount: 1800, status: 'succeeded' });

    const declined = await stripe.paymentIntents
      .create({ amount: 1800, currency: 'usd', payment_method: 'pm_card_chargeDeclined', confirm: true })
      .catch((error: unknown) => error);
    // Stripe API reference, "Errors": a decline is a 402 card_error with code card_declined and the payment intent.
    expect(declined).toBeInstanceOf(Stripe.errors.StripeCardError);
    expect(declined).toMatchObject({ statusCode: 402, code: 'card_declined', decline_code: 'generic_decline' });
    const failedIntent = (declined as Stripe.errors.StripeCardError).payment_intent;
    expect(failedIntent?.status).toBe('requires_payment_method');
    expect((await stripe.paymentIntents.retrieve(failedIntent?.id ?? '')).status).toBe('requires_payment_method');
    expect((await stripe.events.list({ type: 'payment_intent.payment_failed', limit: 1 })).data[0]?.data.object).toMatchObject({ id: failedIntent?.id });

    const later = await stripe.paymentIntents.create({ amount: 900, currency: 'usd', payment_method: 'pm_card_chargeCustomerFail', confirm: true }).catch((error: unknown) => error);
    expect(later).toBeInstanceOf(Stripe.errors.StripeCardError);

    const strong = await stripe.paymentIntents.create({ amount: 2200, currency: 'usd' });
    expect(strong.status).toBe('requires_payment_method');
    const action = await stripe.paymentIntents.confirm(strong.id, { payment_method: 'pm_card_authenticationRequired' });
    expect(action.status).toBe('requires_action');
    expect(action.next_action?.redirect_to_url?.url).toBe(`${fake.url}/authenticate/${strong.id}`);
    expect(await (await fetch(action.next_action?.redirect_to_url?.url ?? '')).text()).toContain('Confirm this payment');
    expect((await stripe.paymentIntents.confirm(strong.id)).status).toBe('succeeded');

    const viaPage = await stripe.paymentIntents.create({ amount: 2200, currency: 'usd', payment_method: 'pm_card_authenticationRequired', confirm: true, return_url: 'http://127.0.0.1:3000/back' });
    const completed = await submit(`${fake.url}/authenticate/${viaPage.id}`, { outcome: 'complete' });
    expect(completed.location).toBe(`http://127.0.0.1:3000/back?payment_intent=${viaPage.id}`);
    expect((await stripe.paymentIntents.retrieve(viaPage.id)).status).toBe('succeeded');

    const open = await stripe.paymentIntents.update((await stripe.paymentIntents.create({ amount: 500, currency: 'usd' })).id, { amount: 700, metadata: { note: 'laces' } });
    expect(open).toMatchObject({ amount: 700, metadata: { note: 'laces' } });
    expect(await stripe.paymentIntents.cancel(open.id)).toMatchObject({ status: 'canceled' });
    await expect(stripe.paymentIntents.cancel(paid.id)).rejects.toMatchObject({ code: 'payment_intent_unexpected_state' });
    await expect(stripe.paymentIntents.update(paid.id, { amount: 1 })).rejects.toBeInstanceOf(Stripe.errors.StripeInvalidRequestError);
    await expect(stripe.paymentIntents.create({ amount: 500, currency: 'usd', application_fee_amount: 10 })).rejects.toMatchObject({ param: 'application_fee_amount' });
    expect((await stripe.paymentIntents.list({ customer: customer.id })).data.map((i) => i.id)).toEqual([paid.id]);
  });

  it('refunds partly and fully and refuses more than the remainder', async () => {
    const intent = await stripe.paymentIntents.create({ amount: 1000, currency: 'usd', payment_method: 'pm_card_visa', confirm: true });
    const first = await stripe.refunds.create({ payment_intent: intent.id, amount: 300, reason: 'requested_by_customer', metadata: { why: 'one pair' } });
    expect(first).toMatchObject({ object: 'refund', amount: 300, status: 'succeeded', payment_intent: intent.id, reason: 'requested_by_customer' });

    // Stripe API reference, "Create a refund": partial refunds add up to at most the charge amount.
    const tooMuch = await stripe.refunds.create({ payment_intent: intent.id, amount: 701 }).catch((error: unknown) => error);
    expect(tooMuch).toBeInstanceOf(Stripe.errors.StripeInvalidRequestError);
    expect(tooMuch).toMatchObject({ param: 'amount', message: 'Refund amount ($7.01) is greater than unrefunded amount on charge ($7.00)' });

    const rest = await stripe.refunds.create({ charge: intent.latest_charge as string });
    expect(rest.amount).toBe(700);
    expect(await stripe.charges.retrieve(intent.latest_charge as string)).toMatchObject({ amount_refunded: 1000, refunded: true });
    await expect(stripe.refunds.create({ payment_intent: intent.id })).rejects.toMatchObject({ code: 'charge_already_refunded' });

    const listed = await stripe.refunds.list({ payment_intent: intent.id });
    expect(listed.data.map((r) => r.id)).toEqual([rest.id, first.id]);
    expect((await stripe.refunds.retrieve(first.id)).metadata).toEqual({ why: 'one pair' });
    const refundedEvent = (await stripe.events.list({ type: 'charge.refunded', limit: 1 })).data[0];
    expect(refundedEvent?.data).toMatchObject({ object: { amount_refunded: 1000 }, previous_attributes: { amount_refunded: 300, refunded: false } });
  });
});
