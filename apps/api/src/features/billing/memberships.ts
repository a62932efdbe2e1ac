import { randomUUID } from 'node:crypto';
import type Stripe from 'stripe';
import { graceLapsed, type MembershipRow } from '@rinkwright/core';
import { isDuplicateKey, type Scope } from '@rinkwright/db';
import { AppError } from '../../http/errors';
import * as ledger from '../../lib/ledger/ledger';
import { noticeMail } from '../../lib/mailer';
import { callPayments } from '../../lib/payments';
import * as repo from './repository';
import { sendReceipt, type SalesDeps } from './sales';

// Memberships follow their subscription on the rink's payout account. Every handler re-reads the subscription
// or invoice from the payment service, so events may arrive in any order, twice, or late: the row ends up as
// the service says now, and each paid invoice grants its period's credits once (keyed by the payment).

const DAY = 86_400_000;
const toDate = (unix: number | null | undefined) => (unix ? new Date(unix * 1000) : null);

type SubscriptionWithPeriod = Stripe.Subscription & { current_period_start?: number; current_period_end?: number };

function periodOf(sub: SubscriptionWithPeriod) {
  const item = sub.items?.data?.[0] as (Stripe.SubscriptionItem & { current_period_start?: number; current_period_end?: number }) | undefined;
  return { start: toDate(item?.current_period_start ?? sub.current_period_start), end: toDate(item?.current_period_end ?? sub.current_period_end) };
}

function stateOf(status: Stripe.Subscription.Status): repo.MembershipRecord['state'] {
  if (status === 'active' || status === 'trialing') return 'active';
  if (status === 'past_due' || status === 'unpaid') return 'past_due';
  if (status === 'canceled' || status === 'incomplete_expired') return 'canceled';
  return 'incomplete';
}

/** Brings the membership row in line with the subscription as the payment service has it now. */
export async function syncMembership(s: Scope, deps: SalesDeps, account: string, subscriptionId: string): Promise<repo.MembershipRecord | undefined> {
  const sub = (await deps.payments.subscriptions.retrieve(subscriptionId, {}, { stripeAccount: account })) as SubscriptionWithPeriod;
  const customerId = sub.metadata?.customer_id;
  const productId = sub.metadata?.product_id;
  if (sub.metadata?.rink_id !== s.tenantId || !customerId || !productId) return undefined;
  const product = await repo.findProduct(s, productId);
  if (!product) return undefined;
  const period = periodOf(sub);
  let state = stateOf(sub.status);
  const existing = await repo.findMembershipBySubscription(s, sub.id);
  // A cancellation is final: a late "active" event must not bring a canceled membership back.
  if (existing?.state === 'canceled') state = 'canceled';
  const graceUntil = state === 'past_due' ? new Date(Date.now() + (product.graceDays ?? 0) * DAY) : null;
  const set = { state, periodStart: period.start, periodEnd: period.end, cancelAtPeriodEnd: sub.cancel_at_period_end ? 1 : 0, updatedAt: new Date() };
  const update = { ...set, graceUntil: graceUntil && repo.membershipGraceFrom(graceUntil) };
  if (existing) {
    await repo.updateMembership(s, existing.id, update);
  } else {
    try {
      await repo.insertMembership(s, { id: randomUUID(), customerId, productId, subscriptionId: sub.id, serviceUpdatedAt: 0, createdAt: new Date(), ...set, graceUntil });
    } catch (error) {
      // Another delivery about the same subscription made the row a moment ago.
      if (!isDuplicateKey(error)) throw error;
      await repo.updateMembership(s, (await repo.findMembershipBySubscription(s, sub.id))!.id, update);
    }
  }
  return repo.findMembershipBySubscription(s, sub.id);
}

type InvoiceWithLinks = Stripe.Invoice & { subscription?: string | { id: string } | null; payment_intent?: string | { id: string } | null };
const idOf = (v: string | { id: string } | null | undefined) => (v ? (typeof v === 'string' ? v : v.id) : null);

function subscriptionOfInvoice(invoice: InvoiceWithLinks): string | null {
  const parent = (invoice as { parent?: { subscription_details?: { subscription?: string | { id: string } } } }).parent;
  return idOf(invoice.subscription) ?? idOf(parent?.subscription_details?.subscription);
}

/** A paid or failed membership invoice: the payment row, and on payment the period's credits with rollover. */
export async function applyInvoice(s: Scope, deps: SalesDeps, account: string, invoiceId: string): Promise<void> {
  const invoice = (await deps.payments.invoices.retrieve(invoiceId, {}, { stripeAccount: account })) as InvoiceWithLinks;
  const subscriptionId = subscriptionOfInvoice(invoice);
  if (!subscriptionId) return;
  const membership = await syncMembership(s, deps, account, subscriptionId);
  if (!membership) return;
  const product = await repo.findProduct(s, membership.productId);
  if (!product) return;
  const paid = invoice.status === 'paid';
  const failed = !paid && invoice.status === 'open' && (invoice.attempt_count ?? 0) > 0;
  if (!paid && !failed) return;

  const paymentId = await paymentOfInvoice(s, deps, account, invoice, membership, subscriptionId);
  if (failed) {
    const payment = await repo.findPayment(s, paymentId);
    if (payment?.state === 'pending') {
      await repo.updatePayment(s, paymentId, { state: 'failed' });
      await tellPaymentFailed(s, deps, membership);
    }
    return;
  }
  // The membership's state and grace stay as syncMembership read them from the subscription: a paid invoice
  // delivered late (an earlier period's) must not clear the grace of a renewal that has failed since.
  const paidAt = toDate(invoice.status_transitions?.paid_at) ?? new Date();
  const lineEnd = toDate(invoice.lines?.data?.[0]?.period?.end) ?? membership.periodEnd;
  const op = await s.transaction(async (tx) => {
    const locked = await repo.lockPayment(tx, paymentId);
    if (!locked) return null;
    if (locked.state === 'pending' || locked.state === 'failed') {
      await repo.updatePayment(tx, paymentId, { state: 'paid', paidAt, amountMinor: invoice.amount_paid, paymentIntentId: locked.paymentIntentId ?? idOf(invoice.payment_intent) });
    }
    const account = await ledger.skaterAccount(tx, membership.customerId);
    return ledger.grantMembershipPeriod(tx, {
      accountId: account.id,
      key: `grant:${paymentId}`,
      actor: { userId: null, source: 'membership', sourceId: membership.id },
      cap: product.rolloverCap ?? 0,
      lot: { credits: product.credits, priceMinor: invoice.amount_paid, expiresAt: lineEnd, productId: product.id, paymentId, membershipId: membership.id },
    });
  });
  if (op && !op.replayed) await sendReceipt(s, deps.mailer, paymentId, `${product.credits} membership credits for this period`);
}

async function paymentOfInvoice(s: Scope, deps: SalesDeps, account: string, invoice: InvoiceWithLinks, membership: repo.MembershipRecord, subscriptionId: string): Promise<string> {
  const byInvoice = await repo.findPaymentByInvoice(s, invoice.id!);
  if (byInvoice) return byInvoice.id;
  // The first invoice pays for the checkout that started the subscription: that row carries the invoice from now on.
  const sub = await deps.payments.subscriptions.retrieve(subscriptionId, {}, { stripeAccount: account });
  const fromCheckout = sub.metadata?.payment_id ? await repo.findPayment(s, sub.metadata.payment_id) : undefined;
  if (fromCheckout && !fromCheckout.invoiceId) {
    await repo.updatePayment(s, fromCheckout.id, { invoiceId: invoice.id!, membershipId: membership.id });
    return fromCheckout.id;
  }
  const product = await repo.findProduct(s, membership.productId);
  const price = (await repo.pricesOf(s, [membership.productId])).find((p) => p.retiredAt === null);
  const billing = await repo.findBilling(s);
  const id = randomUUID();
  try {
    await repo.insertPayment(s, {
      id,
      customerId: membership.customerId,
      leagueId: null,
      productId: membership.productId,
      priceId: price!.id,
      membershipId: membership.id,
      channel: 'online',
      state: 'pending',
      amountMinor: invoice.amount_due,
      currency: (product && price?.currency) || invoice.currency.toUpperCase(),
      feeMinor: Math.round((invoice.amount_due * (billing?.feeBps ?? 0)) / 10_000),
      invoiceId: invoice.id!,
      createdBy: null,
    });
    return id;
  } catch (error) {
    // Another delivery of the same invoice made the row a moment ago.
    if (!isDuplicateKey(error)) throw error;
    return (await repo.findPaymentByInvoice(s, invoice.id!))!.id;
  }
}

async function tellPaymentFailed(s: Scope, deps: SalesDeps, membership: repo.MembershipRecord) {
  const customer = await repo.findCustomer(s, membership.customerId);
  const rink = await s.rink();
  if (!customer?.email || !rink) return;
  const until = membership.graceUntil ? membership.graceUntil.toISOString().slice(0, 10) : 'the end of the grace period';
  await deps.mailer.deliver(
    noticeMail({
      to: customer.email,
      subject: `Your ${rink.name} membership payment failed`,
      greeting: `Hello ${customer.name},`,
      body: `The renewal of your membership at ${rink.name} could not be charged. Your credits stay usable until ${until}; update your card from your portal or at the counter to keep them.`,
      footer: 'You get this mail because you have a membership at this rink.',
    }),
    { tenantId: s.tenantId, dedupeKey: `membership-failed:${membership.id}:${membership.periodEnd?.toISOString() ?? ''}` },
  );
}

export async function membershipRows(s: Scope, customerId: string): Promise<MembershipRow[]> {
  const rows = await repo.membershipsOf(s, customerId);
  const prices = await repo.pricesOf(s, [...new Set(rows.map((r) => r.productId))]);
  const now = new Date();
  return rows.map((r) => ({
    id: r.id,
    productName: r.productName,
    state: graceLapsed(r.state, r.graceUntil, now) ? 'blocked' : r.state,
    periodEnd: r.periodEnd?.toISOString() ?? null,
    cancelAtPeriodEnd: r.cancelAtPeriodEnd === 1,
    graceUntil: r.graceUntil?.toISOString() ?? null,
    creditsPerPeriod: r.creditsPerPeriod,
    priceMinor: prices.find((p) => p.productId === r.productId && p.retiredAt === null)?.amountMinor ?? 0,
    interval: r.interval,
  }));
}

/** Cancels now (credits of the paid period stay until it ends) or at the end of the period. */
export async function cancelMembership(s: Scope, deps: SalesDeps, membershipId: string, when: 'now' | 'period_end', onlyCustomerId?: string) {
  const found = await repo.findMembership(s, membershipId);
  if (!found || (onlyCustomerId && found.customerId !== onlyCustomerId)) throw AppError.notFound('No such membership');
  if (found.state === 'canceled') throw new AppError('conflict', 'This membership is already canceled');
  const billing = await repo.findBilling(s);
  const account = billing?.connectedAccountId;
  if (!account) throw new AppError('conflict', 'This rink has no payout account');
  await callPayments(async () => {
    if (when === 'now') await deps.payments.subscriptions.cancel(found.subscriptionId, {}, { stripeAccount: account, idempotencyKey: `cancel:${found.id}` });
    else await deps.payments.subscriptions.update(found.subscriptionId, { cancel_at_period_end: true }, { stripeAccount: account, idempotencyKey: `cancel-at-end:${found.id}` });
  });
  await syncMembership(s, deps, account, found.subscriptionId);
  return membershipRows(s, found.customerId);
}
