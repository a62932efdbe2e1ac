import { randomUUID } from 'node:crypto';
import type Stripe from 'stripe';
import { lotValueMinor, punchCardRefund, type CounterSaleInput, type PaymentRow, type RefundQuote } from '@rinkwright/core';
import { scoped, type Scope } from '@rinkwright/db';
import type { Env } from '../../env';
import { AppError } from '../../http/errors';
import type { RinkContext } from '../../http/route';
import { insertNewCustomer } from '../../lib/customers';
import * as ledger from '../../lib/ledger/ledger';
import { receiptMail, type Mailer } from '../../lib/mailer';
import { applicationFee, callPayments, type Payments } from '../../lib/payments';
import { sellable } from './catalog';
import * as repo from './repository';

// Selling credits: hosted checkout (the public page, the portal, league packs), counter sales, refunds, and the
// one function that turns a paid payment into credits, exactly once, whichever of its events arrives first.

export interface SalesDeps {
  env: Env;
  payments: Payments;
  mailer: Mailer;
}

const money = (minor: number, currency: string) => new Intl.NumberFormat('en', { style: 'currency', currency }).format(minor / 100);
const addMonths = (d: Date, months: number) => {
  const out = new Date(d);
  out.setUTCMonth(out.getUTCMonth() + months);
  return out;
};

export async function requireConnected(s: Scope) {
  const billing = await repo.findBilling(s);
  if (!billing?.connectedAccountId || billing.chargesEnabled !== 1) {
    throw new AppError('conflict', 'This rink has not finished connecting its payout account, so it cannot sell yet');
  }
  if (billing.planState === 'read_only') throw new AppError('read_only', 'This rink is read-only until its Rinkwright plan is paid');
  if (billing.suspendedAt) throw new AppError('suspended', 'This rink is not selling at the moment');
  return { ...billing, connectedAccountId: billing.connectedAccountId };
}

/** The customer with this e-mail at the rink, or a new walk-up record for them. */
export async function customerByEmail(s: Scope, email: string, name: string) {
  const found = await repo.findCustomerByEmail(s, email);
  if (found) return found;
  const id = await insertNewCustomer(s, { name, email, phone: null });
  const made = await repo.findCustomer(s, id);
  if (!made) throw new Error('customer vanished after insert');
  return made;
}

/** The customer's record on the rink's payout account (memberships are billed to it, on the rink's test clock). */
async function paymentCustomer(s: Scope, deps: SalesDeps, account: string, customer: { id: string; email: string | null; name: string; paymentCustomerId: string | null }, testClock: string | null) {
  if (customer.paymentCustomerId) return customer.paymentCustomerId;
  const made = await deps.payments.customers.create(
    { email: customer.email ?? undefined, name: customer.name, metadata: { rink_id: s.tenantId, customer_id: customer.id }, ...(testClock ? { test_clock: testClock } : {}) },
    { stripeAccount: account, idempotencyKey: `customer:${customer.id}` },
  );
  await repo.setPaymentCustomer(s, customer.id, made.id);
  return made.id;
}

// ---- hosted checkout ------------------------------------------------------------------------------------------

export interface CheckoutRequest {
  productId: string;
  customer: { id: string; email: string | null; name: string; paymentCustomerId: string | null } | null;
  leagueId?: string | undefined;
  successPath: string;
  cancelPath: string;
  createdBy: string | null;
}

export async function startCheckout(s: Scope, deps: SalesDeps, request: CheckoutRequest): Promise<{ url: string }> {
  const billing = await requireConnected(s);
  const { product, price } = await sellable(s, deps.payments, request.productId);
  if (product.kind === 'league_pack' && !request.leagueId) throw AppError.field('productId', 'League packs are bought by a league manager for a league');
  if (product.kind !== 'league_pack' && request.leagueId) throw AppError.field('productId', 'Choose a league pack');
  if (product.kind === 'membership' && request.customer) {
    const held = (await repo.membershipsOf(s, request.customer.id)).find((m) => m.productId === product.id && m.state !== 'canceled' && m.state !== 'incomplete');
    // A second subscription would charge the skater twice for one membership.
    if (held) throw new AppError('conflict', `${product.name} is already running for this skater; cancel it before joining again`);
  }
  const paymentId = randomUUID();
  const fee = applicationFee(price.amountMinor, billing.feeBps);
  await repo.insertPayment(s, {
    id: paymentId,
    customerId: request.customer?.id ?? null,
    leagueId: request.leagueId ?? null,
    productId: product.id,
    priceId: price.id,
    membershipId: null,
    channel: 'online',
    state: 'pending',
    amountMinor: price.amountMinor,
    currency: price.currency,
    feeMinor: fee,
    createdBy: request.createdBy,
  });
  const base = deps.env.APP_URL.replace(/\/$/, '');
  const metadata = { rink_id: s.tenantId, payment_id: paymentId, customer_id: request.customer?.id ?? '', league_id: request.leagueId ?? '', product_id: product.id };
  const session = await callPayments(async () => {
    const isMembership = product.kind === 'membership';
    const customer = isMembership && request.customer ? await paymentCustomer(s, deps, billing.connectedAccountId, request.customer, billing.testClockId) : undefined;
    return deps.payments.checkout.sessions.create(
      {
        mode: isMembership ? 'subscription' : 'payment',
        line_items: [{ price: price.paymentPriceId!, quantity: 1 }],
        ...(customer ? { customer } : request.customer?.email ? { customer_email: request.customer.email } : {}),
        client_reference_id: paymentId,
        success_url: `${base}${request.successPath}?session={CHECKOUT_SESSION_ID}`,
        cancel_url: `${base}${request.cancelPath}`,
        metadata,
        ...(isMembership
          ? { subscription_data: { application_fee_percent: billing.feeBps / 100, metadata } }
          : { payment_intent_data: { application_fee_amount: fee, metadata } }),
      },
      { stripeAccount: billing.connectedAccountId, idempotencyKey: `checkout:${paymentId}` },
    );
  });
  await repo.updatePayment(s, paymentId, { checkoutSessionId: session.id });
  if (!session.url) throw new AppError('payment_unavailable', 'The payment service gave no checkout page');
  return { url: session.url };
}

/** What the return page shows while the payment's events arrive. */
export async function checkoutStatus(s: Scope, sessionId: string) {
  const found = await repo.findPaymentBySession(s, sessionId);
  if (!found) throw AppError.notFound('No such checkout at this rink');
  const product = await repo.findProduct(s, found.productId);
  const state = found.state === 'pending' ? 'pending' : found.state === 'failed' ? 'failed' : 'paid';
  return { state, productName: product?.name ?? '', credits: product?.credits ?? 0, amountMinor: found.amountMinor, currency: found.currency } as const;
}

// ---- at the counter -------------------------------------------------------------------------------------------

/** A counter sale: cash is recorded as paid; a card is charged through the payment service (payment intent). */
export async function sellAtCounter(ctx: RinkContext, deps: SalesDeps, customerId: string, input: CounterSaleInput) {
  const s = scoped(ctx.tenantId);
  const customer = await repo.findCustomer(s, customerId);
  if (!customer) throw AppError.notFound('No such customer at this rink');
  const cash = input.paymentMethodId === 'cash';
  const billing = cash ? await repo.ensureBilling(s, deps.env.PLATFORM_FEE_BPS) : await requireConnected(s);
  if (billing.planState === 'read_only') throw new AppError('read_only', 'This rink is read-only until its Rinkwright plan is paid');
  const { product, price } = cash ? await cashSellable(s, input.productId) : await sellable(s, deps.payments, input.productId);
  if (product.kind === 'membership') throw AppError.field('productId', 'Memberships renew by card: the skater joins from the rink’s page or their portal');
  if (product.kind === 'league_pack') throw AppError.field('productId', 'League packs are bought by the league manager for the league’s pool');
  const paymentId = randomUUID();
  // Cash never reaches the payment service, so the platform's fee is taken only on card sales.
  const fee = cash ? 0 : applicationFee(price.amountMinor, billing.feeBps);
  await repo.insertPayment(s, {
    id: paymentId,
    customerId,
    leagueId: null,
    productId: product.id,
    priceId: price.id,
    membershipId: null,
    channel: 'counter',
    state: 'pending',
    amountMinor: price.amountMinor,
    currency: price.currency,
    feeMinor: fee,
    createdBy: ctx.userId,
  });
  if (!cash) {
    const account = billing.connectedAccountId!;
    let intent: Stripe.PaymentIntent;
    try {
      intent = await deps.payments.paymentIntents.create(
        {
          amount: price.amountMinor,
          currency: price.currency.toLowerCase(),
          payment_method: input.paymentMethodId,
          payment_method_types: ['card'],
          confirm: true,
          application_fee_amount: fee,
          description: product.name,
          metadata: { rink_id: ctx.tenantId, payment_id: paymentId, customer_id: customerId, product_id: product.id },
        },
        { stripeAccount: account, idempotencyKey: `counter:${paymentId}` },
      );
    } catch (error) {
      await repo.updatePayment(s, paymentId, { state: 'failed' });
      return callPayments(() => Promise.reject(error));
    }
    await repo.updatePayment(s, paymentId, { paymentIntentId: intent.id });
    if (intent.status !== 'succeeded') {
      await repo.updatePayment(s, paymentId, { state: 'failed' });
      throw new AppError('payment_failed', 'The card needs a step the counter cannot take; ask for another card or cash');
    }
  }
  const granted = await grantPayment(s, deps, paymentId, { paidAt: new Date(), paymentIntentId: null, serviceTime: 0 });
  return { payment: await paymentRowOf(s, paymentId), balance: granted?.balance ?? 0 };
}

async function cashSellable(s: Scope, productId: string) {
  const product = await repo.findProduct(s, productId);
  if (!product || product.active !== 1) throw AppError.field('productId', 'Choose one of the rink’s products');
  const price = (await repo.pricesOf(s, [product.id])).find((p) => p.retiredAt === null);
  if (!price) throw AppError.field('productId', 'That product has no price');
  return { product, price };
}

// ---- paid → credits, exactly once -------------------------------------------------------------------------------

/**
 * Marks a payment paid and grants its credits. Safe to call for every event about the payment, in any order and
 * any number of times: the payment row is locked, and the grant's ledger key is the payment's id.
 */
export async function grantPayment(
  s: Scope,
  deps: Pick<SalesDeps, 'mailer'>,
  paymentId: string,
  paid: { paidAt: Date; paymentIntentId: string | null; serviceTime: number },
): Promise<ledger.Operation | null> {
  const result = await s.transaction(async (tx) => {
    const found = await repo.lockPayment(tx, paymentId);
    if (!found) return null;
    const product = await repo.findProduct(tx, found.productId);
    if (!product) return null;
    if (found.state === 'pending' || found.state === 'failed') {
      await repo.updatePayment(tx, paymentId, { state: 'paid', paidAt: paid.paidAt, paymentIntentId: found.paymentIntentId ?? paid.paymentIntentId, serviceUpdatedAt: Math.max(found.serviceUpdatedAt, paid.serviceTime) });
    }
    const account = found.leagueId ? await ledger.poolAccount(tx, found.leagueId) : found.customerId ? await ledger.skaterAccount(tx, found.customerId) : null;
    if (!account) return null;
    const op = await ledger.addLot(tx, {
      accountId: account.id,
      key: `grant:${paymentId}`,
      actor: { userId: found.createdBy, source: 'payment', sourceId: paymentId },
      kind: 'purchase',
      lot: {
        origin: 'purchase',
        credits: product.credits,
        priceMinor: found.amountMinor,
        expiresAt: product.monthsValid ? addMonths(paid.paidAt, product.monthsValid) : null,
        productId: product.id,
        paymentId,
      },
    });
    return { op, found, product };
  });
  if (!result) return null;
  if (!result.op.replayed) await sendReceipt(s, deps.mailer, result.found.id, `${result.product.credits} credit${result.product.credits === 1 ? '' : 's'} added`);
  return result.op;
}

export async function markFailed(s: Scope, paymentId: string) {
  const found = await repo.findPayment(s, paymentId);
  if (found?.state === 'pending') await repo.updatePayment(s, paymentId, { state: 'failed' });
}

/** A receipt for every payment and refund, to the payer's e-mail if the rink has one. */
export async function sendReceipt(s: Scope, mailer: Mailer, paymentId: string, line: string) {
  const rows = await repo.paymentsWhere(s, { paymentIds: [paymentId] }, 1);
  const row = rows[0];
  const found = await repo.findPayment(s, paymentId);
  const customer = found?.customerId ? await repo.findCustomer(s, found.customerId) : undefined;
  const rink = await s.rink();
  if (!row || !customer?.email || !rink) return;
  await mailer.deliver(
    receiptMail({
      to: customer.email,
      rinkName: rink.name,
      greeting: `Hello ${customer.name},`,
      lines: [`${row.productName}: ${money(row.amountMinor, row.currency)} (${row.channel === 'online' ? 'paid online' : 'paid at the counter'})`, line, ...(row.refundedMinor ? [`Refunded so far: ${money(row.refundedMinor, row.currency)}`] : [])],
      reference: paymentId,
    }),
    { tenantId: s.tenantId, dedupeKey: `receipt:${paymentId}:${row.state}:${row.refundedMinor}` },
  );
}

// ---- reading ----------------------------------------------------------------------------------------------------

export async function paymentRows(s: Scope, where: { customerId?: string; leagueId?: string; paymentIds?: string[] }): Promise<PaymentRow[]> {
  const rows = await repo.paymentsWhere(s, where);
  const refunds = await repo.refundsOf(s, rows.map((r) => r.id));
  return rows.map((r) => ({
    ...r,
    paidAt: r.paidAt?.toISOString() ?? null,
    createdAt: r.createdAt.toISOString(),
    refunds: refunds.filter((f) => f.paymentId === r.id).map((f) => ({ id: f.id, amountMinor: f.amountMinor, credits: f.credits, reason: f.reason, createdAt: f.createdAt.toISOString() })),
  }));
}

async function paymentRowOf(s: Scope, paymentId: string): Promise<PaymentRow> {
  const [row] = await paymentRows(s, { paymentIds: [paymentId] });
  if (!row) throw AppError.notFound('No such payment at this rink');
  return row;
}

// ---- refunds ----------------------------------------------------------------------------------------------------

async function refundPlan(s: Scope, paymentId: string, now: Date) {
  const found = await repo.findPayment(s, paymentId);
  if (!found) throw AppError.notFound('No such payment at this rink');
  if (found.state !== 'paid' && found.state !== 'partially_refunded') throw new AppError('conflict', 'Only a paid payment can be refunded');
  const lots = await ledger.lotsOfPayment(s, paymentId);
  const parts = lots.map((l) => ({ lot: l, ...punchCardRefund({ id: l.id, credits: l.credits, remaining: l.remaining, priceMinor: l.priceMinor, expiresAt: l.expiresAt, createdAt: l.createdAt }, now) }));
  const credits = parts.reduce((n, p) => n + p.credits, 0);
  const refundMinor = Math.min(parts.reduce((n, p) => n + p.refundMinor, 0), found.amountMinor - found.refundedMinor);
  const lot = lots[0];
  const used = lot ? lot.credits - lot.remaining : 0;
  const rule = lot && credits > 0
    ? `Refunds the unused share of the price: ${lot.remaining} of ${lot.credits} credits are unused, so ${money(lotValueMinor({ credits: lot.credits, remaining: lot.remaining, priceMinor: lot.priceMinor }), found.currency)} of ${money(found.amountMinor, found.currency)} comes back (${used} used credit${used === 1 ? ' keeps' : 's keep'} ${money(found.amountMinor - lotValueMinor({ credits: lot.credits, remaining: lot.remaining, priceMinor: lot.priceMinor }), found.currency)}, each credit valued at the price ÷ ${lot.credits}, rounded to the cent). The ${lot.remaining} credits are removed.`
    : 'No unused credits are left on this payment, so nothing more can be refunded.';
  return { found, lots, credits, refundMinor, rule };
}

export async function quoteRefund(ctx: RinkContext, paymentId: string): Promise<RefundQuote> {
  const plan = await refundPlan(scoped(ctx.tenantId), paymentId, new Date());
  return { credits: plan.credits, refundMinor: plan.refundMinor, currency: plan.found.currency, rule: plan.rule };
}

/**
 * Takes back the unused credits and returns their share of the price. The ledger moves first, inside a
 * transaction; if the payment service then refuses, a reversal puts the credits back, so neither side is lost.
 */
export async function refundPayment(ctx: RinkContext, deps: SalesDeps, paymentId: string, reason: string): Promise<PaymentRow> {
  const s = scoped(ctx.tenantId);
  const refundId = randomUUID();
  const taken = await s.transaction(async (tx) => {
    const locked = await repo.lockPayment(tx, paymentId);
    if (!locked) throw AppError.notFound('No such payment at this rink');
    const plan = await refundPlan(tx, paymentId, new Date());
    if (plan.credits === 0 || plan.refundMinor <= 0) throw new AppError('conflict', 'Nothing is left to refund on this payment');
    const accountId = plan.lots[0]!.accountId;
    const op = await ledger.removeLots(tx, { accountId, key: `refund:${refundId}`, actor: { userId: ctx.userId, source: 'payment', sourceId: paymentId, reason }, lotIds: plan.lots.map((l) => l.id), kind: 'refund' });
    await repo.insertRefund(tx, { id: refundId, paymentId, amountMinor: plan.refundMinor, credits: plan.credits, paymentRefundId: null, reason, createdBy: ctx.userId });
    const refunded = plan.found.refundedMinor + plan.refundMinor;
    await repo.updatePayment(tx, paymentId, { refundedMinor: refunded, state: refunded >= plan.found.amountMinor ? 'refunded' : 'partially_refunded' });
    return { op, accountId, plan };
  });
  const { found } = taken.plan;
  if (found.paymentIntentId || found.invoiceId) {
    const billing = await repo.findBilling(s);
    try {
      const intent = found.paymentIntentId ?? (await invoiceIntent(deps, billing?.connectedAccountId ?? '', found.invoiceId!));
      const made = await deps.payments.refunds.create(
        { payment_intent: intent, amount: taken.plan.refundMinor, reason: 'requested_by_customer', metadata: { rink_id: ctx.tenantId, payment_id: paymentId, refund_id: refundId } },
        { stripeAccount: billing?.connectedAccountId ?? undefined, idempotencyKey: `refund:${refundId}` },
      );
      await repo.updateRefund(s, refundId, { paymentRefundId: made.id });
    } catch (error) {
      await s.transaction(async (tx) => {
        await ledger.reverse(tx, { accountId: taken.accountId, key: `refund-undo:${refundId}`, actor: { userId: ctx.userId, source: 'payment', sourceId: paymentId, reason: 'The payment service refused the refund' }, operationId: taken.op.entries[0]!.operationId });
        await repo.removeRefund(tx, refundId);
        await repo.updatePayment(tx, paymentId, { refundedMinor: found.refundedMinor, state: found.state });
      });
      return callPayments(() => Promise.reject(error));
    }
  }
  await sendReceipt(s, deps.mailer, paymentId, `Refunded ${money(taken.plan.refundMinor, found.currency)}; ${taken.plan.credits} unused credit${taken.plan.credits === 1 ? '' : 's'} removed`);
  return paymentRowOf(s, paymentId);
}

async function invoiceIntent(deps: SalesDeps, account: string, invoiceId: string): Promise<string> {
  const invoice = (await deps.payments.invoices.retrieve(invoiceId, {}, { stripeAccount: account })) as Stripe.Invoice & { payment_intent?: string | { id: string } | null };
  const intent = invoice.payment_intent;
  if (!intent) throw new AppError('conflict', 'The payment service has no charge for this invoice');
  return typeof intent === 'string' ? intent : intent.id;
}

