import { ApiError, refused } from './errors';
import type { Fake } from './fake';
import { newId, present, randomToken } from './store';
import type {
  ApplicationFee,
  CardBehaviour,
  Charge,
  Customer,
  Interval,
  Invoice,
  Metadata,
  PaymentIntent,
  Period,
  PaymentMethod,
  Price,
  Subscription,
  TestClock,
} from './types';

// Charging, subscriptions, invoices and test clocks: the parts several endpoints and the hosted pages share.

interface TestCard {
  number: string;
  brand: string;
  behaviour: CardBehaviour;
  label: string;
}

/** Stripe docs, "Testing": the card numbers and PaymentMethod tokens the fake knows. */
export const TEST_CARDS: Record<string, TestCard> = {
  pm_card_visa: { number: '4242424242424242', brand: 'visa', behaviour: 'succeed', label: 'succeeds' },
  pm_card_chargeDeclined: { number: '4000000000000002', brand: 'visa', behaviour: 'decline', label: 'is declined' },
  pm_card_authenticationRequired: {
    number: '4000002500003155',
    brand: 'visa',
    behaviour: 'authenticate',
    label: 'asks for a second confirmation step',
  },
  pm_card_chargeCustomerFail: {
    number: '4000000000000341',
    brand: 'visa',
    behaviour: 'charge_customer_fail',
    label: 'succeeds now; every later charge of the customer fails',
  },
};

export function cardForNumber(number: string): TestCard | undefined {
  const digits = number.replace(/\s+/g, '');
  return Object.values(TEST_CARDS).find((card) => card.number === digits);
}

export function createPaymentMethod(fake: Fake, account: string, card: TestCard, customer: string | null, at: number, expiry?: { month: number; year: number }): PaymentMethod {
  const nextYear = new Date(at * 1000).getUTCFullYear() + 1;
  return fake.store.put<PaymentMethod>(account, {
    id: newId('pm'),
    object: 'payment_method',
    created: at,
    livemode: false,
    type: 'card',
    card: { brand: card.brand, last4: card.number.slice(-4), exp_month: expiry?.month ?? 12, exp_year: expiry?.year ?? nextYear, funding: 'credit' },
    customer,
    metadata: {},
    __fake: { behaviour: card.behaviour },
  });
}

/**
 * A `pm_card_*` token makes a new PaymentMethod each use, as the real test tokens do; an id is looked up.
 * Attaching to the customer on use is the fake's shortcut for the real attach call.
 */
export function resolvePaymentMethod(fake: Fake, account: string, ref: string, customer: string | null, param: string): PaymentMethod {
  const token = TEST_CARDS[ref];
  if (token) return createPaymentMethod(fake, account, token, customer, fake.timeFor(account, customer));
  const method = fake.store.get<PaymentMethod>(account, ref, 'payment_method', 'PaymentMethod', param);
  if (customer && !method.customer) method.customer = customer;
  return method;
}

/**
 * 0341 ("charge_customer_fail") is simplified: it pays while the customer is at the hosted page and fails every
 * charge made later (renewals, retries, counter charges), which is how the fake models failed renewals.
 */
export function outcomeOf(method: PaymentMethod, onSession: boolean, authenticated: boolean): 'succeed' | 'decline' | 'authenticate' {
  switch (method.__fake.behaviour) {
    case 'succeed':
      return 'succeed';
    case 'decline':
      return 'decline';
    case 'authenticate':
      return authenticated ? 'succeed' : 'authenticate';
    case 'charge_customer_fail':
      return onSession ? 'succeed' : 'decline';
  }
}

export function createPaymentIntent(
  fake: Fake,
  account: string,
  fields: Pick<PaymentIntent, 'amount' | 'currency' | 'customer' | 'application_fee_amount' | 'metadata' | 'description' | 'receipt_email'> & {
    payment_method_types?: string[];
  },
  at: number,
): PaymentIntent {
  const id = newId('pi');
  const intent = fake.store.put<PaymentIntent>(account, {
    id,
    object: 'payment_intent',
    created: at,
    livemode: false,
    amount: fields.amount,
    amount_capturable: 0,
    amount_received: 0,
    application_fee_amount: fields.application_fee_amount,
    canceled_at: null,
    cancellation_reason: null,
    capture_method: 'automatic',
    client_secret: `${id}_secret_${randomToken(24)}`,
    confirmation_method: 'automatic',
    currency: fields.currency,
    customer: fields.customer,
    description: fields.description,
    last_payment_error: null,
    latest_charge: null,
    metadata: fields.metadata,
    next_action: null,
    payment_method: null,
    payment_method_types: fields.payment_method_types ?? ['card'],
    receipt_email: fields.receipt_email,
    status: 'requires_payment_method',
  });
  fake.webhooks.emit(account, 'payment_intent.created', intent, { at });
  return intent;
}

export type AttemptResult = 'succeeded' | 'failed' | 'requires_action';

/** One charge attempt of a payment intent with a payment method: the charge, the fee, the intent's status and the events. */
export function attemptPayment(
  fake: Fake,
  account: string,
  intent: PaymentIntent,
  method: PaymentMethod,
  options: { at: number; onSession: boolean; authenticated?: boolean; returnUrl?: string | null },
): AttemptResult {
  const { store } = fake;
  const { at } = options;
  intent.payment_method = method.id;
  const outcome = outcomeOf(method, options.onSession, options.authenticated ?? false);
  if (outcome === 'authenticate') {
    intent.status = 'requires_action';
    intent.next_action = {
      type: 'redirect_to_url',
      redirect_to_url: { url: `${fake.baseUrl}/authenticate/${intent.id}`, return_url: options.returnUrl ?? null },
    };
    fake.webhooks.emit(account, 'payment_intent.requires_action', intent, { at });
    return 'requires_action';
  }
  const ok = outcome === 'succeed';
  const charge = store.put<Charge>(account, {
    id: newId('ch'),
    object: 'charge',
    created: at,
    livemode: false,
    amount: intent.amount,
    amount_captured: ok ? intent.amount : 0,
    amount_refunded: 0,
    application_fee: null,
    application_fee_amount: intent.application_fee_amount,
    captured: ok,
    currency: intent.currency,
    customer: intent.customer,
    description: intent.description,
    failure_code: ok ? null : 'card_declined',
    failure_message: ok ? null : 'Your card was declined.',
    metadata: { ...intent.metadata },
    outcome: ok
      ? { type: 'authorized', network_status: 'approved_by_network', seller_message: 'Payment complete.' }
      : { type: 'issuer_declined', network_status: 'declined_by_network', seller_message: 'The bank did not return any further details with this decline.' },
    paid: ok,
    payment_intent: intent.id,
    payment_method: method.id,
    payment_method_details: { type: 'card', card: { ...method.card } },
    receipt_email: intent.receipt_email,
    refunded: false,
    status: ok ? 'succeeded' : 'failed',
  });
  intent.latest_charge = charge.id;
  intent.next_action = null;
  if (!ok) {
    intent.status = 'requires_payment_method';
    intent.last_payment_error = {
      type: 'card_error',
      code: 'card_declined',
      decline_code: 'generic_decline',
      message: 'Your card was declined.',
      payment_method: present(method),
    };
    fake.webhooks.emit(account, 'charge.failed', charge, { at });
    fake.webhooks.emit(account, 'payment_intent.payment_failed', intent, { at });
    return 'failed';
  }
  intent.status = 'succeeded';
  intent.amount_received = intent.amount;
  intent.last_payment_error = null;
  if (account !== store.platform && intent.application_fee_amount) {
    // A direct charge on a connected account with a fee leaves the fee with the platform (Stripe docs, "Collect application fees").
    const fee = store.put<ApplicationFee>(store.platform, {
      id: newId('fee'),
      object: 'application_fee',
      created: at,
      livemode: false,
      account,
      amount: intent.application_fee_amount,
      amount_refunded: 0,
      charge: charge.id,
      currency: intent.currency,
      originating_transaction: null,
      refunded: false,
    });
    charge.application_fee = fee.id;
    fake.webhooks.emit(store.platform, 'application_fee.created', fee, { at });
  }
  fake.webhooks.emit(account, 'payment_intent.succeeded', intent, { at });
  fake.webhooks.emit(account, 'charge.succeeded', charge, { at });
  return 'succeeded';
}

/** The customer failed the second step (Stripe docs, "3D Secure authentication": payment_intent_authentication_failure). */
export function failAuthentication(fake: Fake, account: string, intent: PaymentIntent, at: number): void {
  const method = intent.payment_method ? fake.store.maybe<PaymentMethod>(account, intent.payment_method, 'payment_method') : undefined;
  intent.status = 'requires_payment_method';
  intent.next_action = null;
  intent.last_payment_error = {
    type: 'invalid_request_error',
    code: 'payment_intent_authentication_failure',
    message:
      'The provided PaymentMethod has failed authentication. You can provide payment_method_data or a new PaymentMethod to attempt to fulfill this PaymentIntent again.',
    ...(method ? { payment_method: present(method) } : {}),
  };
  fake.webhooks.emit(account, 'payment_intent.payment_failed', intent, { at });
}

/** The 402 the real service answers a declined confirmation with (Stripe API reference, "Errors": card_error). */
export function cardError(fake: Fake, account: string, intent: PaymentIntent): ApiError {
  const method = intent.payment_method ? fake.store.maybe<PaymentMethod>(account, intent.payment_method, 'payment_method') : undefined;
  return new ApiError(402, {
    type: 'card_error',
    code: 'card_declined',
    decline_code: 'generic_decline',
    message: 'Your card was declined.',
    payment_intent: present(intent),
    ...(intent.latest_charge ? { charge: intent.latest_charge } : {}),
    ...(method ? { payment_method: present(method) } : {}),
    doc_url: 'https://stripe.com/docs/error-codes/card-declined',
  });
}

// Subscriptions.

/**
 * The k-th period boundary after the anchor. Months and years keep the anchor's day, clamped to the month's
 * last day (Stripe docs, "Billing cycle": a subscription anchored on the 31st bills on the last day of shorter months).
 */
export function periodBoundary(anchor: number, interval: Interval, count: number, k: number): number {
  if (interval === 'day') return anchor + k * count * 86_400;
  if (interval === 'week') return anchor + k * count * 7 * 86_400;
  const start = new Date(anchor * 1000);
  const months = (interval === 'year' ? 12 : 1) * count * k;
  const year = start.getUTCFullYear() + Math.floor((start.getUTCMonth() + months) / 12);
  const month = (start.getUTCMonth() + months) % 12;
  const lastDay = new Date(Date.UTC(year, month + 1, 0)).getUTCDate();
  const day = Math.min(start.getUTCDate(), lastDay);
  return Date.UTC(year, month, day, start.getUTCHours(), start.getUTCMinutes(), start.getUTCSeconds()) / 1000;
}

function nextBoundary(sub: Subscription, after: number): number {
  const recurring = sub.items.data[0]?.price.recurring;
  if (!recurring) throw new Error(`subscription ${sub.id} has no recurring price`);
  for (let k = 1; ; k++) {
    const boundary = periodBoundary(sub.billing_cycle_anchor, recurring.interval, recurring.interval_count, k);
    if (boundary > after) return boundary;
  }
}

function setPeriod(sub: Subscription, start: number, end: number): void {
  sub.current_period_start = start;
  sub.current_period_end = end;
  for (const item of sub.items.data) {
    item.current_period_start = start;
    item.current_period_end = end;
  }
}

/** Subscription default first, then the customer's invoice default (Stripe docs, "Payment methods for subscriptions"). */
function chargeableMethod(fake: Fake, account: string, sub: Subscription): PaymentMethod | undefined {
  const customer = fake.store.maybe<Customer>(account, sub.customer, 'customer');
  const id = sub.default_payment_method ?? customer?.invoice_settings.default_payment_method ?? null;
  return id ? fake.store.maybe<PaymentMethod>(account, id, 'payment_method') : undefined;
}

export interface NewSubscription {
  customer: Customer;
  items: { price: Price; quantity: number }[];
  applicationFeePercent: number | null;
  metadata: Metadata;
  defaultPaymentMethod: string | null;
  cancelAtPeriodEnd: boolean;
  paymentBehavior: 'allow_incomplete' | 'default_incomplete';
  /** The customer is at the hosted page (checkout): see outcomeOf. */
  onSession: boolean;
}

export function createSubscription(fake: Fake, account: string, input: NewSubscription): { subscription: Subscription; invoice: Invoice; result: AttemptResult | 'not_attempted' } {
  const { store } = fake;
  const first = input.items[0];
  if (!first) throw refused('Missing required param: items.', 'parameter_missing', 'items');
  for (const [index, item] of input.items.entries()) {
    if (!item.price.recurring) {
      throw refused('The price specified is set to `type=one_time` but this field only accepts prices with `type=recurring`.', undefined, `items[${index}][price]`);
    }
    if (item.price.currency !== first.price.currency) throw refused('All prices on a subscription must have the same currency.', undefined, `items[${index}][price]`);
  }
  const at = fake.timeFor(account, input.customer.id);
  const id = newId('sub');
  const sub: Subscription = {
    id,
    object: 'subscription',
    created: at,
    livemode: false,
    application_fee_percent: input.applicationFeePercent,
    billing_cycle_anchor: at,
    cancel_at: null,
    cancel_at_period_end: false,
    canceled_at: null,
    collection_method: 'charge_automatically',
    currency: first.price.currency,
    current_period_start: at,
    current_period_end: at,
    customer: input.customer.id,
    default_payment_method: input.defaultPaymentMethod,
    ended_at: null,
    items: {
      object: 'list',
      data: input.items.map((item) => ({
        id: newId('si'),
        object: 'subscription_item',
        created: at,
        current_period_start: at,
        current_period_end: at,
        metadata: {},
        price: present(item.price),
        quantity: item.quantity,
        subscription: id,
      })),
      has_more: false,
      url: `/v1/subscription_items?subscription=${id}`,
    },
    latest_invoice: null,
    metadata: input.metadata,
    start_date: at,
    status: 'incomplete',
    test_clock: input.customer.test_clock,
  };
  setPeriod(sub, at, nextBoundary(sub, at));
  if (input.cancelAtPeriodEnd) {
    sub.cancel_at_period_end = true;
    sub.cancel_at = sub.current_period_end;
  }
  const method = chargeableMethod(fake, account, sub);
  if (!method && input.paymentBehavior !== 'default_incomplete') {
    throw refused(
      'This customer has no attached payment source or default payment method. Please consider adding a default payment method.',
      'resource_missing',
    );
  }
  // The first invoice is paid inside the create call, so the created event already shows the outcome, as on the real service.
  const willPay = method && input.paymentBehavior !== 'default_incomplete' && outcomeOf(method, input.onSession, false) === 'succeed';
  sub.status = willPay ? 'active' : 'incomplete';
  store.put(account, sub);
  fake.webhooks.emit(account, 'customer.subscription.created', sub, { at });
  const invoice = createInvoice(fake, account, sub, 'subscription_create', at, { start: at, end: at });
  sub.latest_invoice = invoice.id;
  const result = input.paymentBehavior === 'default_incomplete' ? 'not_attempted' : collectInvoice(fake, account, invoice, sub, method ?? null, { at, onSession: input.onSession });
  return { subscription: sub, invoice, result };
}

/** `period` is the invoice's own period: the one before its lines' (Stripe API reference, invoice `period_start`). */
function createInvoice(fake: Fake, account: string, sub: Subscription, reason: Invoice['billing_reason'], at: number, period: Period): Invoice {
  const { store } = fake;
  const customer = store.get<Customer>(account, sub.customer, 'customer', 'customer');
  const id = newId('in');
  const lines = sub.items.data.map((item) => ({
    id: newId('il'),
    object: 'line_item' as const,
    amount: item.price.unit_amount * item.quantity,
    currency: item.price.currency,
    description: `${item.quantity} × ${item.price.nickname ?? item.price.product}`,
    period: { start: sub.current_period_start, end: sub.current_period_end },
    quantity: item.quantity,
    pricing: {
      type: 'price_details' as const,
      price_details: { price: item.price.id, product: item.price.product },
      unit_amount_decimal: item.price.unit_amount_decimal,
    },
    price: item.price,
  }));
  const total = lines.reduce((sum, line) => sum + line.amount, 0);
  const feePercent = account !== store.platform ? sub.application_fee_percent : null;
  const previousCount = store.all<Invoice>(account, 'invoice', (invoice) => invoice.customer === customer.id).length;
  const invoice = store.put<Invoice>(account, {
    id,
    object: 'invoice',
    created: at,
    livemode: false,
    amount_due: total,
    amount_paid: 0,
    amount_remaining: total,
    application_fee_amount: feePercent === null ? null : Math.round((total * feePercent) / 100),
    attempt_count: 0,
    attempted: false,
    billing_reason: reason,
    collection_method: 'charge_automatically',
    currency: sub.currency,
    customer: customer.id,
    customer_email: customer.email,
    default_payment_method: null,
    lines: { object: 'list', data: lines, has_more: false, url: `/v1/invoices/${id}/lines` },
    metadata: {},
    next_payment_attempt: null,
    number: `${customer.id.slice(-8).toUpperCase()}-${String(previousCount + 1).padStart(4, '0')}`,
    parent: { type: 'subscription_details', subscription_details: { subscription: sub.id, metadata: { ...sub.metadata } } },
    subscription: sub.id,
    payment_intent: null,
    period_start: period.start,
    period_end: period.end,
    status: 'draft',
    status_transitions: { finalized_at: null, paid_at: null },
    subtotal: total,
    total,
    test_clock: sub.test_clock,
  });
  fake.webhooks.emit(account, 'invoice.created', invoice, { at });
  // Simplification: the real service leaves a renewal invoice in draft for about an hour; the fake finalizes at once.
  invoice.status = 'open';
  invoice.status_transitions.finalized_at = at;
  fake.webhooks.emit(account, 'invoice.finalized', invoice, { at });
  return invoice;
}

/** Charges an open invoice; a paid invoice makes its subscription active, a failure makes an active one past_due. */
export function collectInvoice(
  fake: Fake,
  account: string,
  invoice: Invoice,
  sub: Subscription,
  method: PaymentMethod | null,
  options: { at: number; onSession: boolean },
): AttemptResult {
  const { store } = fake;
  const { at } = options;
  let intent = invoice.payment_intent ? store.maybe<PaymentIntent>(account, invoice.payment_intent, 'payment_intent') : undefined;
  if (!intent || intent.status === 'succeeded' || intent.status === 'canceled') {
    intent = createPaymentIntent(
      fake,
      account,
      {
        amount: invoice.amount_due,
        currency: invoice.currency,
        customer: invoice.customer,
        application_fee_amount: invoice.application_fee_amount,
        metadata: {},
        description: invoice.billing_reason === 'subscription_create' ? 'Subscription creation' : 'Subscription update',
        receipt_email: null,
      },
      at,
    );
    invoice.payment_intent = intent.id;
  }
  invoice.attempted = true;
  invoice.attempt_count += 1;
  const result: AttemptResult = method ? attemptPayment(fake, account, intent, method, { at, onSession: options.onSession }) : 'failed';
  if (result === 'succeeded') {
    invoice.status = 'paid';
    invoice.amount_paid = invoice.amount_due;
    invoice.amount_remaining = 0;
    invoice.status_transitions.paid_at = at;
    if (sub.status === 'incomplete' || sub.status === 'past_due') sub.status = 'active';
    fake.webhooks.emit(account, 'invoice.paid', invoice, { at });
    fake.webhooks.emit(account, 'invoice.payment_succeeded', invoice, { at });
  } else {
    if (sub.status === 'active') sub.status = 'past_due';
    if (result === 'requires_action') fake.webhooks.emit(account, 'invoice.payment_action_required', invoice, { at });
    fake.webhooks.emit(account, 'invoice.payment_failed', invoice, { at });
  }
  return result;
}

/** `POST /v1/invoices/:id/pay`: a retry with the current default payment method (or the one given). */
export function payInvoice(fake: Fake, account: string, invoice: Invoice, methodRef: string | undefined): AttemptResult {
  if (invoice.status === 'paid') throw refused('Invoice is already paid', 'invoice_already_paid');
  if (invoice.status !== 'open') throw refused(`You can only pay an open invoice; this one is ${invoice.status}.`, 'invoice_not_open');
  const sub = fake.store.get<Subscription>(account, invoice.subscription, 'subscription', 'subscription');
  const method = methodRef ? resolvePaymentMethod(fake, account, methodRef, invoice.customer, 'payment_method') : chargeableMethod(fake, account, sub);
  const at = fake.timeFor(account, invoice.customer);
  const before = sub.status;
  const result = collectInvoice(fake, account, invoice, sub, method ?? null, { at, onSession: false });
  if (sub.status !== before) fake.webhooks.emit(account, 'customer.subscription.updated', sub, { at, previous: { status: before } });
  return result;
}

export function endSubscription(fake: Fake, account: string, sub: Subscription, at: number): void {
  sub.status = 'canceled';
  sub.ended_at = at;
  sub.canceled_at ??= at;
  fake.webhooks.emit(account, 'customer.subscription.deleted', sub, { at });
}

/** One period end: a cancel-at-period-end subscription ends, any other gets its renewal invoice and is charged. */
function renew(fake: Fake, account: string, sub: Subscription): void {
  const at = sub.current_period_end;
  if (sub.cancel_at_period_end) {
    endSubscription(fake, account, sub, at);
    return;
  }
  const previous = {
    current_period_start: sub.current_period_start,
    current_period_end: sub.current_period_end,
    latest_invoice: sub.latest_invoice,
    status: sub.status,
  };
  setPeriod(sub, at, nextBoundary(sub, at));
  const invoice = createInvoice(fake, account, sub, 'subscription_cycle', at, { start: previous.current_period_start, end: previous.current_period_end });
  sub.latest_invoice = invoice.id;
  collectInvoice(fake, account, invoice, sub, chargeableMethod(fake, account, sub) ?? null, { at, onSession: false });
  const { status, ...unchanged } = previous;
  fake.webhooks.emit(account, 'customer.subscription.updated', sub, { at, previous: status === sub.status ? unchanged : previous });
}

/**
 * Walks every subscription of the clock's customers through each period end up to `target`, in time order.
 * Simplification: a past_due subscription keeps renewing (no smart retries, no dunning cancellation).
 */
export function runClock(fake: Fake, account: string, clock: TestClock, target: number): void {
  const due = (): Subscription | undefined =>
    fake.store
      .all<Subscription>(account, 'subscription', (sub) => sub.test_clock === clock.id && (sub.status === 'active' || sub.status === 'past_due') && sub.current_period_end <= target)
      .sort((a, b) => a.current_period_end - b.current_period_end)[0];
  for (let sub = due(); sub; sub = due()) {
    clock.frozen_time = sub.current_period_end;
    renew(fake, account, sub);
  }
  clock.frozen_time = target;
  clock.status = 'ready';
  fake.webhooks.emit(account, 'test_helpers.test_clock.ready', clock, { at: target });
}
