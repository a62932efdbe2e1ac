import type { Api, Ctx } from '../app';
import { cardError, createSubscription, endSubscription, payInvoice, resolvePaymentMethod, runClock } from '../billing';
import { allowParams, bool, decimal, int, invalid, mergeMetadata, nested, nullableStr, objList, oneOf, refused, requireInt, requireStr, str } from '../errors';
import { newId, paginate } from '../store';
import type { Customer, Invoice, PaymentIntent, Price, Subscription, TestClock } from '../types';
import { change, changeMetadata } from './catalog';
import { feeNotAllowed } from './checkout';

// Subscriptions, invoices and test clocks.

/** Stripe docs, "Test clocks": a clock and its objects are deleted 30 days after creation. */
const CLOCK_LIFETIME_S = 30 * 24 * 60 * 60;

function subscriptionOf({ fake, account, path }: Ctx): Subscription {
  return fake.store.get<Subscription>(account, path.id ?? '', 'subscription', 'subscription', 'id');
}

function clockOf({ fake, account, path }: Ctx): TestClock {
  return fake.store.get<TestClock>(account, path.id ?? '', 'test_helpers.test_clock', 'test clock', 'test_clock');
}

export function registerBilling(api: Api): void {
  api.post('/v1/subscriptions', ({ fake, account, params }) => {
    allowParams(params, ['customer', 'items', 'application_fee_percent', 'metadata', 'default_payment_method', 'cancel_at_period_end', 'payment_behavior']);
    const customer = fake.store.get<Customer>(account, requireStr(params, 'customer'), 'customer', 'customer', 'customer');
    const entries = objList(params, 'items');
    if (!entries || entries.length === 0) throw invalid('Missing required param: items.', 'items', 'parameter_missing');
    const items = entries.map((entry, index) => ({
      price: fake.store.get<Price>(account, requireStr(entry, 'price', `items[${index}][price]`), 'price', 'price', `items[${index}][price]`),
      quantity: int(entry, 'quantity', `items[${index}][quantity]`) ?? 1,
    }));
    const feePercent = decimal(params, 'application_fee_percent');
    if (feePercent !== undefined && account === fake.store.platform) throw feeNotAllowed('application_fee_percent');
    const methodRef = str(params, 'default_payment_method');
    const method = methodRef ? resolvePaymentMethod(fake, account, methodRef, customer.id, 'default_payment_method') : undefined;
    // `error_if_incomplete` is not modelled: the fake creates incomplete subscriptions as `allow_incomplete` does.
    const behaviour = oneOf(str(params, 'payment_behavior'), ['allow_incomplete', 'default_incomplete'], 'payment_behavior') ?? 'allow_incomplete';
    const { subscription } = createSubscription(fake, account, {
      customer,
      items,
      applicationFeePercent: feePercent ?? null,
      metadata: mergeMetadata({}, params),
      defaultPaymentMethod: method?.id ?? null,
      cancelAtPeriodEnd: bool(params, 'cancel_at_period_end') ?? false,
      paymentBehavior: behaviour,
      onSession: false,
    });
    return subscription;
  });

  api.get('/v1/subscriptions/:id', (ctx) => subscriptionOf(ctx));

  /** Quantity changes bill from the next renewal: the fake does not prorate. */
  api.post('/v1/subscriptions/:id', (ctx) => {
    const { fake, account, params } = ctx;
    allowParams(params, ['cancel_at_period_end', 'metadata', 'items', 'default_payment_method', 'application_fee_percent', 'proration_behavior']);
    const sub = subscriptionOf(ctx);
    if (sub.status === 'canceled') throw refused('A canceled subscription can only update its cancellation_details and metadata.', undefined, 'id');
    const previous: Record<string, unknown> = {};
    const at = fake.timeFor(account, sub.customer);
    const cancelAtEnd = bool(params, 'cancel_at_period_end');
    if (cancelAtEnd !== undefined && cancelAtEnd !== sub.cancel_at_period_end) {
      previous.cancel_at_period_end = sub.cancel_at_period_end;
      previous.cancel_at = sub.cancel_at;
      previous.canceled_at = sub.canceled_at;
      sub.cancel_at_period_end = cancelAtEnd;
      sub.cancel_at = cancelAtEnd ? sub.current_period_end : null;
      sub.canceled_at = cancelAtEnd ? at : null;
    }
    const entries = objList(params, 'items') ?? [];
    if (entries.length > 0) previous.items = structuredClone(sub.items);
    for (const [index, entry] of entries.entries()) {
      const label = `items[${index}]`;
      const itemId = str(entry, 'id', nested(label, 'id'));
      // With a single item, an entry without `id` means that item (the fake's shortcut; the real API adds a new item).
      const item = itemId ? sub.items.data.find((candidate) => candidate.id === itemId) : sub.items.data.length === 1 ? sub.items.data[0] : undefined;
      if (!item) throw invalid(itemId ? `No such subscription item: '${itemId}'` : `Missing required param: ${nested(label, 'id')}.`, nested(label, 'id'));
      const quantity = requireInt(entry, 'quantity', nested(label, 'quantity'));
      if (quantity < 0) throw invalid('This value must be greater than or equal to 0.', nested(label, 'quantity'));
      item.quantity = quantity;
    }
    const methodRef = nullableStr(params, 'default_payment_method');
    change(sub, 'default_payment_method', methodRef ? resolvePaymentMethod(fake, account, methodRef, sub.customer, 'default_payment_method').id : methodRef, previous);
    const feePercent = decimal(params, 'application_fee_percent');
    if (feePercent !== undefined && account === fake.store.platform) throw feeNotAllowed('application_fee_percent');
    change(sub, 'application_fee_percent', feePercent, previous);
    changeMetadata(sub, params, previous);
    fake.webhooks.emit(account, 'customer.subscription.updated', sub, { at, previous });
    return sub;
  });

  api.delete('/v1/subscriptions/:id', (ctx) => {
    const sub = subscriptionOf(ctx);
    if (sub.status === 'canceled') throw refused(`The subscription ${sub.id} is already canceled.`);
    endSubscription(ctx.fake, ctx.account, sub, ctx.fake.timeFor(ctx.account, sub.customer));
    return sub;
  });

  api.get('/v1/subscriptions', ({ fake, account, params }) => {
    const customer = str(params, 'customer');
    const price = str(params, 'price');
    const status = str(params, 'status');
    // Without a status filter the real list leaves out canceled subscriptions (Stripe API reference, "List subscriptions").
    const items = fake.store.all<Subscription>(
      account,
      'subscription',
      (sub) =>
        (!customer || sub.customer === customer) &&
        (!price || sub.items.data.some((item) => item.price.id === price)) &&
        (status === 'all' || (status ? sub.status === status : sub.status !== 'canceled')),
    );
    return paginate(items, params, '/v1/subscriptions');
  });

  api.get('/v1/invoices/:id', ({ fake, account, path }) => fake.store.get<Invoice>(account, path.id ?? '', 'invoice', 'invoice', 'invoice'));

  api.get('/v1/invoices', ({ fake, account, params }) => {
    const customer = str(params, 'customer');
    const subscription = str(params, 'subscription');
    const status = str(params, 'status');
    const items = fake.store.all<Invoice>(
      account,
      'invoice',
      (invoice) => (!customer || invoice.customer === customer) && (!subscription || invoice.subscription === subscription) && (!status || invoice.status === status),
    );
    return paginate(items, params, '/v1/invoices');
  });

  api.post('/v1/invoices/:id/pay', ({ fake, account, params, path }) => {
    allowParams(params, ['payment_method', 'off_session']);
    const invoice = fake.store.get<Invoice>(account, path.id ?? '', 'invoice', 'invoice', 'invoice');
    const result = payInvoice(fake, account, invoice, str(params, 'payment_method'));
    if (result !== 'succeeded' && invoice.payment_intent) {
      throw cardError(fake, account, fake.store.get<PaymentIntent>(account, invoice.payment_intent, 'payment_intent', 'payment_intent'));
    }
    return invoice;
  });

  api.post('/v1/test_helpers/test_clocks', ({ fake, account, params }) => {
    allowParams(params, ['frozen_time', 'name']);
    const created = fake.nowSec();
    const clock = fake.store.put<TestClock>(account, {
      id: newId('clock'),
      object: 'test_helpers.test_clock',
      created,
      livemode: false,
      deletes_after: created + CLOCK_LIFETIME_S,
      frozen_time: requireInt(params, 'frozen_time'),
      name: nullableStr(params, 'name') ?? null,
      status: 'ready',
      status_details: {},
    });
    fake.webhooks.emit(account, 'test_helpers.test_clock.created', clock, { at: clock.frozen_time });
    return clock;
  });

  api.get('/v1/test_helpers/test_clocks/:id', (ctx) => clockOf(ctx));

  api.get('/v1/test_helpers/test_clocks', ({ fake, account, params }) =>
    paginate(fake.store.all<TestClock>(account, 'test_helpers.test_clock'), params, '/v1/test_helpers/test_clocks'),
  );

  /** Simplification: deleting a clock leaves its customers and subscriptions in place (the real service deletes them). */
  api.delete('/v1/test_helpers/test_clocks/:id', (ctx) => {
    const clock = clockOf(ctx);
    ctx.fake.webhooks.emit(ctx.account, 'test_helpers.test_clock.deleted', clock, { at: clock.frozen_time });
    return ctx.fake.store.put(ctx.account, { id: clock.id, object: clock.object, created: clock.created, livemode: false as const, deleted: true as const });
  });

  /**
   * Answers `advancing` at once and walks the clock's subscriptions right after, ending with `ready` and
   * `test_helpers.test_clock.ready`, as the real service does asynchronously. The real limit of two billing
   * intervals per advance is not enforced.
   */
  api.post('/v1/test_helpers/test_clocks/:id/advance', (ctx) => {
    const { fake, account, params } = ctx;
    allowParams(params, ['frozen_time']);
    const clock = clockOf(ctx);
    const target = requireInt(params, 'frozen_time');
    if (clock.status !== 'ready') throw refused('The test clock is already advancing; wait until it is ready.');
    if (target <= clock.frozen_time) throw invalid('The frozen time must be after the current frozen time of the test clock.', 'frozen_time');
    clock.status = 'advancing';
    fake.webhooks.emit(account, 'test_helpers.test_clock.advancing', clock, { at: clock.frozen_time });
    fake.later(0, () => {
      runClock(fake, account, clock, target);
      fake.changed();
    });
    return clock;
  });
}
