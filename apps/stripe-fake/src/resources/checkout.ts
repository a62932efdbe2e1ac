import type { Api } from '../app';
import { type AttemptResult, attemptPayment, createPaymentIntent, createSubscription, failAuthentication, outcomeOf } from '../billing';
import {
  type ApiError,
  allowParams,
  decimal,
  int,
  invalid,
  mergeMetadata,
  nested,
  nullableStr,
  obj,
  objList,
  oneOf,
  refused,
  requireInt,
  requireStr,
  str,
} from '../errors';
import type { Fake } from '../fake';
import { newId, paginate, randomToken } from '../store';
import type { CheckoutSession, Customer, LineItem, PaymentIntent, PaymentMethod, Price, Product } from '../types';
import { createPrice } from './catalog';

const DEFAULT_LIFETIME_S = 24 * 60 * 60;
const MIN_LIFETIME_S = 30 * 60;

export function feeNotAllowed(param: string): ApiError {
  return invalid(
    'Can only apply an application_fee_amount when the PaymentIntent is attempting a direct payment (using an OAuth key or Stripe-Account header) or destination payment (using `transfer_data[destination]`).',
    param,
  );
}

/**
 * Sessions expire at `expires_at` (on the customer's test clock, if any); the fake notices when the session is next
 * looked at rather than on a timer.
 */
export function refreshExpiry(fake: Fake, account: string, session: CheckoutSession): CheckoutSession {
  if (session.status === 'open' && fake.timeFor(account, session.customer) >= session.expires_at) expireSession(fake, account, session);
  return session;
}

function expireSession(fake: Fake, account: string, session: CheckoutSession): void {
  session.status = 'expired';
  session.url = null;
  fake.webhooks.emit(account, 'checkout.session.expired', session);
}

function lineItemsOf(fake: Fake, account: string, mode: CheckoutSession['mode'], params: Record<string, unknown>): LineItem[] {
  const entries = objList(params, 'line_items');
  if (!entries || entries.length === 0) throw invalid('Missing required param: line_items.', 'line_items', 'parameter_missing');
  return entries.map((entry, index) => {
    const label = `line_items[${index}]`;
    const priceId = str(entry, 'price', nested(label, 'price'));
    const priceData = obj(entry, 'price_data', nested(label, 'price_data'));
    let price: Price;
    if (priceId) price = fake.store.get<Price>(account, priceId, 'price', 'price', nested(label, 'price'));
    else if (priceData) price = createPrice(fake, account, priceData, nested(label, 'price_data'));
    else throw invalid(`Missing required param: ${nested(label, 'price')}.`, nested(label, 'price'), 'parameter_missing');
    if (!price.active) throw refused(`The price specified is inactive. This field only accepts active prices.`, undefined, nested(label, 'price'));
    if (mode === 'payment' && price.type === 'recurring') {
      throw refused(
        'You specified `payment` mode but passed a recurring price. Either switch to `subscription` mode or use only one-time prices.',
        undefined,
        nested(label, 'price'),
      );
    }
    const quantity = requireInt(entry, 'quantity', nested(label, 'quantity'));
    if (quantity < 1) throw invalid('This value must be greater than or equal to 1.', nested(label, 'quantity'));
    const product = fake.store.maybe<Product>(account, price.product, 'product');
    const amount = price.unit_amount * quantity;
    return {
      id: newId('li'),
      object: 'item',
      amount_discount: 0,
      amount_subtotal: amount,
      amount_tax: 0,
      amount_total: amount,
      currency: price.currency,
      description: product?.name ?? price.nickname ?? price.id,
      price,
      quantity,
    };
  });
}

/** Completes the session once paid: the state and the `checkout.session.completed` event the real service sends last. */
function completeSession(fake: Fake, account: string, session: CheckoutSession, email: string, at: number): void {
  session.status = 'complete';
  session.payment_status = 'paid';
  session.url = null;
  session.customer_details = { email, name: null };
  session.__fake.pendingCard = undefined;
  fake.webhooks.emit(account, 'checkout.session.completed', session, { at });
}

function attemptIntent(fake: Fake, account: string, session: CheckoutSession, at: number): PaymentIntent {
  const existing = session.__fake.attemptIntent ?? session.payment_intent;
  const found = existing ? fake.store.maybe<PaymentIntent>(account, existing, 'payment_intent') : undefined;
  if (found && found.status !== 'succeeded' && found.status !== 'canceled') return found;
  const data = session.mode === 'payment' ? session.__fake.paymentIntentData : { application_fee_amount: null, metadata: {}, description: null };
  const intent = createPaymentIntent(
    fake,
    account,
    {
      amount: session.amount_total,
      currency: session.currency,
      customer: session.customer,
      application_fee_amount: data.application_fee_amount,
      metadata: { ...data.metadata },
      description: data.description,
      receipt_email: null,
    },
    at,
  );
  if (session.mode === 'payment') session.payment_intent = intent.id;
  else session.__fake.attemptIntent = intent.id;
  return intent;
}

/**
 * Pays a session with the card entered on the hosted page. Payment mode charges the session's payment intent;
 * subscription mode creates the customer (if none), the subscription and its paid first invoice.
 */
export function payCheckout(fake: Fake, account: string, session: CheckoutSession, method: PaymentMethod, email: string, authenticated: boolean): AttemptResult {
  const at = fake.timeFor(account, session.customer);
  if (session.mode === 'payment') {
    const intent = attemptIntent(fake, account, session, at);
    const result = attemptPayment(fake, account, intent, method, { at, onSession: true, authenticated });
    if (result === 'succeeded') completeSession(fake, account, session, email, at);
    return result;
  }
  const outcome = outcomeOf(method, true, authenticated);
  if (outcome === 'authenticate') return 'requires_action';
  if (outcome === 'decline') return attemptPayment(fake, account, attemptIntent(fake, account, session, at), method, { at, onSession: true });
  let customer = session.customer ? fake.store.get<Customer>(account, session.customer, 'customer', 'customer') : undefined;
  if (!customer) {
    customer = fake.store.put<Customer>(account, {
      id: newId('cus'),
      object: 'customer',
      created: at,
      livemode: false,
      email,
      name: null,
      description: null,
      phone: null,
      balance: 0,
      currency: session.currency,
      delinquent: false,
      invoice_settings: { default_payment_method: method.id, custom_fields: null, footer: null, rendering_options: null },
      metadata: {},
      test_clock: null,
    });
    fake.webhooks.emit(account, 'customer.created', customer, { at });
  } else {
    // Simplification: the real service saves the card as the subscription's default; the fake makes it the
    // customer's invoice default, so a later invoice retry after a card change uses the customer's new card.
    const previous = { invoice_settings: { ...customer.invoice_settings } };
    customer.invoice_settings.default_payment_method = method.id;
    fake.webhooks.emit(account, 'customer.updated', customer, { at, previous });
  }
  method.customer = customer.id;
  session.customer = customer.id;
  const { subscription, invoice, result } = createSubscription(fake, account, {
    customer,
    items: session.__fake.lineItems.map((item) => ({ price: item.price, quantity: item.quantity })),
    applicationFeePercent: session.__fake.subscriptionData.application_fee_percent,
    metadata: { ...session.__fake.subscriptionData.metadata },
    defaultPaymentMethod: null,
    cancelAtPeriodEnd: false,
    paymentBehavior: 'allow_incomplete',
    onSession: true,
  });
  session.subscription = subscription.id;
  session.invoice = invoice.id;
  if (result === 'succeeded') completeSession(fake, account, session, email, at);
  return result === 'not_attempted' ? 'failed' : result;
}

export function failCheckoutAuthentication(fake: Fake, account: string, session: CheckoutSession): void {
  const pending = session.__fake.pendingCard;
  const at = fake.timeFor(account, session.customer);
  const intent = attemptIntent(fake, account, session, at);
  if (pending) intent.payment_method = pending.paymentMethod;
  session.__fake.pendingCard = undefined;
  failAuthentication(fake, account, intent, at);
}

export function registerCheckout(api: Api): void {
  api.post('/v1/checkout/sessions', ({ fake, account, params }) => {
    allowParams(params, [
      'mode',
      'line_items',
      'success_url',
      'cancel_url',
      'customer',
      'customer_email',
      'client_reference_id',
      'metadata',
      'payment_intent_data',
      'subscription_data',
      'expires_at',
      'payment_method_types',
    ]);
    const mode = oneOf(requireStr(params, 'mode'), ['payment', 'subscription'], 'mode') ?? 'payment';
    const successUrl = requireStr(params, 'success_url');
    const customerId = str(params, 'customer');
    const customerEmail = str(params, 'customer_email');
    if (customerId && customerEmail) throw invalid('You may only specify one of these parameters: customer, customer_email.', 'customer_email');
    const customer = customerId ? fake.store.get<Customer>(account, customerId, 'customer', 'customer', 'customer') : undefined;
    const connected = account !== fake.store.platform;

    const intentData = obj(params, 'payment_intent_data') ?? {};
    const subscriptionData = obj(params, 'subscription_data') ?? {};
    if (mode !== 'payment' && params.payment_intent_data !== undefined) {
      throw invalid('You can not pass `payment_intent_data` in `subscription` mode.', 'payment_intent_data');
    }
    if (mode !== 'subscription' && params.subscription_data !== undefined) {
      throw invalid('You can only pass `subscription_data` in `subscription` mode.', 'subscription_data');
    }
    const fee = int(intentData, 'application_fee_amount', 'payment_intent_data[application_fee_amount]');
    if (fee !== undefined && !connected) throw feeNotAllowed('payment_intent_data[application_fee_amount]');
    const feePercent = decimal(subscriptionData, 'application_fee_percent', 'subscription_data[application_fee_percent]');
    if (feePercent !== undefined && !connected) throw feeNotAllowed('subscription_data[application_fee_percent]');
    if (feePercent !== undefined && (feePercent < 0 || feePercent > 100)) throw invalid('This value must be between 0 and 100.', 'subscription_data[application_fee_percent]');

    const lineItems = lineItemsOf(fake, account, mode, params);
    const currency = lineItems[0]?.currency ?? 'usd';
    if (lineItems.some((item) => item.currency !== currency)) throw refused('All line items must use the same currency.', undefined, 'line_items');
    if (mode === 'subscription' && !lineItems.some((item) => item.price.type === 'recurring')) {
      throw refused('You must provide at least one recurring price in `subscription` mode when using prices.', undefined, 'line_items');
    }
    const created = fake.timeFor(account, customer?.id ?? null);
    const expiresAt = int(params, 'expires_at') ?? created + DEFAULT_LIFETIME_S;
    if (expiresAt < created + MIN_LIFETIME_S || expiresAt > created + DEFAULT_LIFETIME_S) {
      throw invalid('The `expires_at` timestamp must be between 30 minutes and 24 hours from Checkout Session creation.', 'expires_at');
    }
    const total = lineItems.reduce((sum, item) => sum + item.amount_total, 0);
    const id = `cs_test_${randomToken(58)}`;
    const session = fake.store.put<CheckoutSession>(account, {
      id,
      object: 'checkout.session',
      created,
      livemode: false,
      mode,
      status: 'open',
      payment_status: 'unpaid',
      amount_subtotal: total,
      amount_total: total,
      currency,
      cancel_url: nullableStr(params, 'cancel_url') ?? null,
      success_url: successUrl,
      client_reference_id: nullableStr(params, 'client_reference_id') ?? null,
      customer: customer?.id ?? null,
      customer_email: customerEmail ?? null,
      customer_details: null,
      expires_at: expiresAt,
      invoice: null,
      metadata: mergeMetadata({}, params),
      payment_intent: null,
      payment_method_types: ['card'],
      subscription: null,
      url: `${fake.baseUrl}/checkout/${id}`,
      __fake: {
        lineItems,
        paymentIntentData: {
          application_fee_amount: fee ?? null,
          metadata: mergeMetadata({}, intentData),
          description: nullableStr(intentData, 'description', 'payment_intent_data[description]') ?? null,
        },
        subscriptionData: { application_fee_percent: feePercent ?? null, metadata: mergeMetadata({}, subscriptionData) },
      },
    });
    return session;
  });

  api.get('/v1/checkout/sessions/:id', ({ fake, account, path }) =>
    refreshExpiry(fake, account, fake.store.get<CheckoutSession>(account, path.id ?? '', 'checkout.session', 'checkout.session', 'session')),
  );

  api.get('/v1/checkout/sessions', ({ fake, account, params }) => {
    const intent = str(params, 'payment_intent');
    const customer = str(params, 'customer');
    const subscription = str(params, 'subscription');
    const status = str(params, 'status');
    const items = fake.store
      .all<CheckoutSession>(
        account,
        'checkout.session',
        (s) => (!intent || s.payment_intent === intent) && (!customer || s.customer === customer) && (!subscription || s.subscription === subscription),
      )
      .map((session) => refreshExpiry(fake, account, session))
      .filter((session) => !status || session.status === status);
    return paginate(items, params, '/v1/checkout/sessions');
  });

  api.get('/v1/checkout/sessions/:id/line_items', ({ fake, account, params, path }) => {
    const session = fake.store.get<CheckoutSession>(account, path.id ?? '', 'checkout.session', 'checkout.session', 'session');
    return paginate(session.__fake.lineItems, params, `/v1/checkout/sessions/${session.id}/line_items`);
  });

  api.post('/v1/checkout/sessions/:id/expire', ({ fake, account, path }) => {
    const session = refreshExpiry(fake, account, fake.store.get<CheckoutSession>(account, path.id ?? '', 'checkout.session', 'checkout.session', 'session'));
    if (session.status !== 'open') throw refused('Only Checkout Sessions with a status in ["open"] can be expired.');
    expireSession(fake, account, session);
    return session;
  });
}
