import type { Api, Ctx } from '../app';
import { attemptPayment, cardError, createPaymentIntent, resolvePaymentMethod } from '../billing';
import { allowParams, bool, int, invalid, mergeMetadata, nullableStr, oneOf, refused, requireInt, requireStr, str, strList } from '../errors';
import type { Fake } from '../fake';
import { newId, paginate } from '../store';
import type { ApplicationFee, Charge, Customer, PaymentIntent, Refund } from '../types';
import { change, changeMetadata } from './catalog';
import { feeNotAllowed } from './checkout';

// Payment intents (counter sales), charges, refunds and application fees.

function money(amount: number, currency: string): string {
  return new Intl.NumberFormat('en-US', { style: 'currency', currency: currency.toUpperCase() }).format(amount / 100);
}

/**
 * Confirmation with `pm_card_authenticationRequired` stops at requires_action with a redirect to the fake's
 * "Confirm this payment" page. Simplification: confirming a requires_action intent again counts as the customer
 * having passed the second step.
 */
function confirm(fake: Fake, account: string, intent: PaymentIntent, methodRef: string | undefined, returnUrl: string | undefined): PaymentIntent {
  if (intent.status === 'succeeded' || intent.status === 'canceled' || intent.status === 'processing') {
    throw refused(
      `This PaymentIntent's status is ${intent.status}, and it cannot be confirmed.`,
      'payment_intent_unexpected_state',
    );
  }
  const authenticated = intent.status === 'requires_action' && !methodRef;
  const ref = methodRef ?? intent.payment_method;
  if (!ref) {
    throw refused(
      "You cannot confirm this PaymentIntent because it's missing a payment method. To confirm the PaymentIntent, you can provide a payment_method.",
      'payment_intent_unexpected_state',
    );
  }
  const method = resolvePaymentMethod(fake, account, ref, intent.customer, 'payment_method');
  const at = fake.timeFor(account, intent.customer);
  const result = attemptPayment(fake, account, intent, method, { at, onSession: false, authenticated, returnUrl: returnUrl ?? null });
  // A declined confirmation answers 402, but its failed charge and events stay, as on the real service.
  if (result === 'failed') throw cardError(fake, account, intent);
  return intent;
}

function intentOf({ fake, account, path }: Ctx): PaymentIntent {
  return fake.store.get<PaymentIntent>(account, path.id ?? '', 'payment_intent', 'payment_intent', 'intent');
}

export function registerPayments(api: Api): void {
  api.post('/v1/payment_intents', ({ fake, account, params }) => {
    allowParams(params, [
      'amount',
      'currency',
      'customer',
      'payment_method',
      'payment_method_types',
      'confirm',
      'application_fee_amount',
      'metadata',
      'description',
      'receipt_email',
      'return_url',
      'off_session',
    ]);
    const amount = requireInt(params, 'amount');
    if (amount < 1) throw invalid('This value must be greater than or equal to 1.', 'amount');
    const currency = requireStr(params, 'currency').toLowerCase();
    const customerId = str(params, 'customer');
    if (customerId) fake.store.get<Customer>(account, customerId, 'customer', 'customer', 'customer');
    const fee = int(params, 'application_fee_amount');
    if (fee !== undefined && account === fake.store.platform) throw feeNotAllowed('application_fee_amount');
    if (fee !== undefined && fee > amount) throw invalid(`The application fee (${money(fee, currency)}) cannot exceed the amount (${money(amount, currency)}).`, 'application_fee_amount');
    const types = strList(params, 'payment_method_types');
    if (types && types.some((type) => type !== 'card')) throw invalid('The payment method type provided is not supported by the fake; use card.', 'payment_method_types');
    const intent = createPaymentIntent(
      fake,
      account,
      {
        amount,
        currency,
        customer: customerId ?? null,
        application_fee_amount: fee ?? null,
        metadata: mergeMetadata({}, params),
        description: nullableStr(params, 'description') ?? null,
        receipt_email: nullableStr(params, 'receipt_email') ?? null,
        payment_method_types: types ?? ['card'],
      },
      fake.timeFor(account, customerId ?? null),
    );
    const methodRef = str(params, 'payment_method');
    if (methodRef) {
      intent.payment_method = resolvePaymentMethod(fake, account, methodRef, intent.customer, 'payment_method').id;
      intent.status = 'requires_confirmation';
    }
    if (bool(params, 'confirm')) return confirm(fake, account, intent, undefined, str(params, 'return_url'));
    return intent;
  });

  api.get('/v1/payment_intents/:id', (ctx) => intentOf(ctx));

  api.post('/v1/payment_intents/:id', (ctx) => {
    const { fake, account, params } = ctx;
    allowParams(params, ['amount', 'currency', 'customer', 'payment_method', 'metadata', 'description', 'receipt_email', 'application_fee_amount']);
    const intent = intentOf(ctx);
    const settled = intent.status === 'succeeded' || intent.status === 'canceled' || intent.status === 'processing';
    const locked = ['amount', 'currency', 'customer', 'payment_method', 'application_fee_amount'].filter((key) => params[key] !== undefined);
    if (settled && locked.length > 0) {
      throw refused(`You cannot update ${locked.join(', ')} on a PaymentIntent with status ${intent.status}.`, 'payment_intent_unexpected_state', locked[0]);
    }
    const previous: Record<string, unknown> = {};
    change(intent, 'amount', int(params, 'amount'), previous);
    change(intent, 'currency', str(params, 'currency')?.toLowerCase(), previous);
    const customer = str(params, 'customer');
    if (customer) fake.store.get<Customer>(account, customer, 'customer', 'customer', 'customer');
    change(intent, 'customer', customer, previous);
    const fee = int(params, 'application_fee_amount');
    if (fee !== undefined && account === fake.store.platform) throw feeNotAllowed('application_fee_amount');
    change(intent, 'application_fee_amount', fee, previous);
    const methodRef = str(params, 'payment_method');
    if (methodRef) {
      change(intent, 'payment_method', resolvePaymentMethod(fake, account, methodRef, intent.customer, 'payment_method').id, previous);
      if (intent.status === 'requires_payment_method') intent.status = 'requires_confirmation';
    }
    change(intent, 'description', nullableStr(params, 'description'), previous);
    change(intent, 'receipt_email', nullableStr(params, 'receipt_email'), previous);
    changeMetadata(intent, params, previous);
    return intent;
  });

  api.post('/v1/payment_intents/:id/confirm', (ctx) => {
    allowParams(ctx.params, ['payment_method', 'return_url', 'off_session']);
    return confirm(ctx.fake, ctx.account, intentOf(ctx), str(ctx.params, 'payment_method'), str(ctx.params, 'return_url'));
  });

  api.post('/v1/payment_intents/:id/cancel', (ctx) => {
    const { fake, account, params } = ctx;
    allowParams(params, ['cancellation_reason']);
    const intent = intentOf(ctx);
    if (intent.status === 'succeeded' || intent.status === 'canceled' || intent.status === 'processing') {
      throw refused(
        `You cannot cancel this PaymentIntent because it has a status of ${intent.status}. Only a PaymentIntent with one of the following statuses may be canceled: requires_payment_method, requires_capture, requires_confirmation, requires_action, processing.`,
        'payment_intent_unexpected_state',
      );
    }
    const reason = oneOf(str(params, 'cancellation_reason'), ['duplicate', 'fraudulent', 'requested_by_customer', 'abandoned'], 'cancellation_reason');
    const at = fake.timeFor(account, intent.customer);
    intent.status = 'canceled';
    intent.canceled_at = at;
    intent.cancellation_reason = reason ?? null;
    intent.next_action = null;
    fake.webhooks.emit(account, 'payment_intent.canceled', intent, { at });
    return intent;
  });

  api.get('/v1/payment_intents', ({ fake, account, params }) => {
    const customer = str(params, 'customer');
    return paginate(fake.store.all<PaymentIntent>(account, 'payment_intent', (i) => !customer || i.customer === customer), params, '/v1/payment_intents');
  });

  api.get('/v1/charges/:id', ({ fake, account, path }) => fake.store.get<Charge>(account, path.id ?? '', 'charge', 'charge', 'id'));

  api.get('/v1/charges', ({ fake, account, params }) => {
    const intent = str(params, 'payment_intent');
    const customer = str(params, 'customer');
    const items = fake.store.all<Charge>(account, 'charge', (c) => (!intent || c.payment_intent === intent) && (!customer || c.customer === customer));
    return paginate(items, params, '/v1/charges');
  });

  api.post('/v1/refunds', ({ fake, account, params }) => {
    allowParams(params, ['payment_intent', 'charge', 'amount', 'reason', 'metadata']);
    const intentId = str(params, 'payment_intent');
    const chargeId = str(params, 'charge');
    if (!intentId && !chargeId) throw invalid('One of the following params should be provided for this request: payment_intent or charge.', 'charge');
    let charge: Charge;
    if (chargeId) {
      charge = fake.store.get<Charge>(account, chargeId, 'charge', 'charge', 'charge');
    } else {
      const intent = fake.store.get<PaymentIntent>(account, intentId ?? '', 'payment_intent', 'payment_intent', 'payment_intent');
      const latest = intent.latest_charge ? fake.store.maybe<Charge>(account, intent.latest_charge, 'charge') : undefined;
      if (!latest || intent.status !== 'succeeded') {
        throw refused(`This PaymentIntent (${intent.id}) does not have a successful charge to refund.`, 'charge_not_refundable');
      }
      charge = latest;
    }
    const remaining = charge.amount - charge.amount_refunded;
    if (charge.status !== 'succeeded') throw refused(`Charge ${charge.id} was not successful and cannot be refunded.`, 'charge_not_refundable');
    if (remaining === 0) throw refused(`Charge ${charge.id} has already been refunded.`, 'charge_already_refunded');
    const amount = int(params, 'amount') ?? remaining;
    if (amount < 1) throw invalid('This value must be greater than or equal to 1.', 'amount');
    // Stripe API reference, "Create a refund": more than the unrefunded remainder is refused.
    if (amount > remaining) {
      throw refused(
        `Refund amount (${money(amount, charge.currency)}) is greater than unrefunded amount on charge (${money(remaining, charge.currency)})`,
        undefined,
        'amount',
      );
    }
    const at = fake.timeFor(account, charge.customer);
    const refund = fake.store.put<Refund>(account, {
      id: newId('re'),
      object: 'refund',
      created: at,
      livemode: false,
      amount,
      charge: charge.id,
      currency: charge.currency,
      metadata: mergeMetadata({}, params),
      payment_intent: charge.payment_intent,
      reason: oneOf(str(params, 'reason'), ['duplicate', 'fraudulent', 'requested_by_customer'], 'reason') ?? null,
      status: 'succeeded',
    });
    const previous = { amount_refunded: charge.amount_refunded, refunded: charge.refunded };
    charge.amount_refunded += amount;
    charge.refunded = charge.amount_refunded === charge.amount;
    fake.webhooks.emit(account, 'refund.created', refund, { at });
    fake.webhooks.emit(account, 'charge.refunded', charge, { at, previous });
    return refund;
  });

  api.get('/v1/refunds/:id', ({ fake, account, path }) => fake.store.get<Refund>(account, path.id ?? '', 'refund', 'refund', 'id'));

  api.get('/v1/refunds', ({ fake, account, params }) => {
    const intent = str(params, 'payment_intent');
    const charge = str(params, 'charge');
    const items = fake.store.all<Refund>(account, 'refund', (r) => (!intent || r.payment_intent === intent) && (!charge || r.charge === charge));
    return paginate(items, params, '/v1/refunds');
  });

  api.get('/v1/application_fees', ({ fake, account, params }) => {
    if (account !== fake.store.platform) throw refused('Application fees belong to the platform; drop the Stripe-Account header.');
    const charge = str(params, 'charge');
    return paginate(fake.store.all<ApplicationFee>(fake.store.platform, 'application_fee', (f) => !charge || f.charge === charge), params, '/v1/application_fees');
  });

  api.get('/v1/application_fees/:id', ({ fake, path }) =>
    fake.store.get<ApplicationFee>(fake.store.platform, path.id ?? '', 'application_fee', 'application fee', 'id'),
  );
}
