import type Stripe from 'stripe';
import { graceLapsed, type BillingResponse } from '@rinkwright/core';
import { scoped, type Scope } from '@rinkwright/db';
import { AppError } from '../../http/errors';
import type { RinkContext } from '../../http/route';
import { readSetting, writeSetting } from '../../lib/payment-settings';
import { callPayments } from '../../lib/payments';
import { syncCatalog } from './catalog';
import * as repo from './repository';
import type { SalesDeps } from './sales';

// The rink's side of the payment service: its payout account (a connected account, onboarded on the service's
// own pages) and its Rinkwright plan (a subscription on the platform account, per active station per month).

const DAY = 86_400_000;

export async function billingStatus(ctx: RinkContext, deps: SalesDeps): Promise<BillingResponse> {
  const s = scoped(ctx.tenantId);
  const billing = await repo.ensureBilling(s, deps.env.PLATFORM_FEE_BPS);
  return {
    payout: { connected: billing.connectedAccountId !== null, chargesEnabled: billing.chargesEnabled === 1, accountId: billing.connectedAccountId },
    plan: {
      state: effectivePlanState(billing, new Date()),
      stations: billing.planStations,
      activeStations: await repo.countActiveStations(s),
      periodEnd: billing.planPeriodEnd?.toISOString() ?? null,
      graceUntil: billing.planGraceUntil?.toISOString() ?? null,
      pricePerStationMinor: deps.env.PLAN_STATION_PRICE_MINOR,
      currency: deps.env.PLAN_CURRENCY.toUpperCase(),
      feeBps: billing.feeBps,
    },
    testMode: deps.env.PAYMENT_TEST_MODE,
  };
}

/** past_due turns into read_only when its grace runs out, even before the worker writes it down. */
export function effectivePlanState(billing: Pick<repo.BillingRecord, 'planState' | 'planGraceUntil'>, now: Date): repo.BillingRecord['planState'] {
  return graceLapsed(billing.planState, billing.planGraceUntil, now) ? 'read_only' : billing.planState;
}

/** Creates the payout account once and returns a fresh onboarding link to the payment service's pages. */
export async function startOnboarding(ctx: RinkContext, deps: SalesDeps): Promise<{ url: string }> {
  const s = scoped(ctx.tenantId);
  const billing = await repo.ensureBilling(s, deps.env.PLATFORM_FEE_BPS);
  const base = `${deps.env.APP_URL.replace(/\/$/, '')}/rinks/${ctx.rinkSlug}/billing`;
  return callPayments(async () => {
    let account = billing.connectedAccountId;
    if (!account) {
      const made = await deps.payments.accounts.create(
        { type: 'express', email: ctx.email, business_profile: { name: ctx.rinkName }, metadata: { rink_id: ctx.tenantId } },
        { idempotencyKey: `account:${ctx.tenantId}` },
      );
      account = made.id;
      const clock = deps.env.PAYMENT_TEST_MODE ? await deps.payments.testHelpers.testClocks.create({ frozen_time: Math.floor(Date.now() / 1000), name: `${ctx.rinkSlug} memberships` }, { stripeAccount: account, idempotencyKey: `clock:${ctx.tenantId}` }) : null;
      await repo.updateBilling(s, { connectedAccountId: account, testClockId: clock?.id ?? null });
    }
    const link = await deps.payments.accountLinks.create({ account, type: 'account_onboarding', refresh_url: base, return_url: `${base}?onboarded=1` });
    return { url: link.url };
  });
}

/** Reads the payout account's state from the service (the return from onboarding, and account.updated). */
export async function refreshPayoutAccount(s: Scope, deps: SalesDeps): Promise<void> {
  const billing = await repo.findBilling(s);
  if (!billing?.connectedAccountId) return;
  const account = await callPayments(() => deps.payments.accounts.retrieve(billing.connectedAccountId!));
  const enabled = account.charges_enabled ? 1 : 0;
  await repo.updateBilling(s, { chargesEnabled: enabled });
  if (enabled) await syncCatalog(s, deps.payments);
}

/** The platform's per-station plan price, made once on the platform account and remembered. */
async function planPrice(deps: SalesDeps): Promise<string> {
  const key = `plan-price:${deps.env.PLAN_CURRENCY}:${deps.env.PLAN_STATION_PRICE_MINOR}`;
  const known = await readSetting(key);
  if (known) return known.value;
  const product = await deps.payments.products.create({ name: 'Rinkwright plan (per active station)', metadata: { kind: 'plan' } }, { idempotencyKey: `${key}:product` });
  const price = await deps.payments.prices.create(
    { product: product.id, unit_amount: deps.env.PLAN_STATION_PRICE_MINOR, currency: deps.env.PLAN_CURRENCY, recurring: { interval: 'month' }, metadata: { kind: 'plan' } },
    { idempotencyKey: `${key}:price` },
  );
  return (await writeSetting(key, price.id, null)).value;
}

/** Starts (or restarts) the rink's plan through hosted checkout on the platform account. */
export async function startPlan(ctx: RinkContext, deps: SalesDeps): Promise<{ url: string }> {
  const s = scoped(ctx.tenantId);
  const billing = await repo.ensureBilling(s, deps.env.PLATFORM_FEE_BPS);
  const state = effectivePlanState(billing, new Date());
  // In its grace a rink may pay with another card: the new subscription replaces the unpaid one once it is paid.
  if (state === 'active') throw new AppError('conflict', 'The plan is already running');
  const stations = planQuantity(await repo.countActiveStations(s));
  const base = `${deps.env.APP_URL.replace(/\/$/, '')}/rinks/${ctx.rinkSlug}/billing`;
  return callPayments(async () => {
    let customer = billing.planCustomerId;
    if (!customer) {
      const clock = deps.env.PAYMENT_TEST_MODE ? await deps.payments.testHelpers.testClocks.create({ frozen_time: Math.floor(Date.now() / 1000), name: `${ctx.rinkSlug} plan` }, { idempotencyKey: `plan-clock:${ctx.tenantId}` }) : null;
      customer = (await deps.payments.customers.create({ email: ctx.email, name: ctx.rinkName, metadata: { rink_id: ctx.tenantId }, ...(clock ? { test_clock: clock.id } : {}) }, { idempotencyKey: `plan-customer:${ctx.tenantId}` })).id;
      await repo.updateBilling(s, { planCustomerId: customer, platformTestClockId: clock?.id ?? null });
    }
    const metadata = { kind: 'plan', rink_id: ctx.tenantId };
    const session = await deps.payments.checkout.sessions.create({
      mode: 'subscription',
      customer,
      line_items: [{ price: await planPrice(deps), quantity: stations }],
      success_url: `${base}?plan=started`,
      cancel_url: base,
      metadata,
      subscription_data: { metadata },
    });
    if (!session.url) throw new AppError('payment_unavailable', 'The payment service gave no checkout page');
    return { url: session.url };
  });
}

/**
 * A plan restarted after it lapsed replaces its unpaid subscription once the new one is paid, and the old one is
 * ended so it stops renewing (and failing) beside it. Ending it earlier, at checkout, would let an abandoned
 * checkout turn a read-only rink into one without a plan.
 */
async function endPreviousPlan(deps: SalesDeps, subscriptionId: string): Promise<void> {
  const previous = await deps.payments.subscriptions.retrieve(subscriptionId);
  if (previous.status === 'canceled' || previous.status === 'incomplete_expired') return;
  await deps.payments.subscriptions.cancel(subscriptionId, {}, { idempotencyKey: `plan-end:${subscriptionId}` });
}

type SubscriptionWithPeriod = Stripe.Subscription & { current_period_end?: number };

/** The plan's state from its subscription as the service has it now (events may come in any order). */
export async function syncPlan(deps: SalesDeps, subscriptionId: string, failedInvoice = false): Promise<void> {
  const sub = (await deps.payments.subscriptions.retrieve(subscriptionId)) as SubscriptionWithPeriod;
  const rinkId = sub.metadata?.rink_id;
  if (sub.metadata?.kind !== 'plan' || !rinkId) return;
  const s = scoped(rinkId);
  const billing = await repo.findBilling(s);
  if (!billing) return;
  const previous = billing.planSubscriptionId;
  if (previous && previous !== sub.id) {
    // Another subscription than the rink's current one: a paid restart takes over; anything else (the late events
    // of the one a restart replaced, a checkout that never got paid) describes no current plan.
    if (sub.status !== 'active' && sub.status !== 'trialing') return;
    await endPreviousPlan(deps, previous);
  }
  const item = sub.items?.data?.[0] as (Stripe.SubscriptionItem & { current_period_end?: number }) | undefined;
  const periodEnd = item?.current_period_end ?? sub.current_period_end;
  const state: repo.BillingRecord['planState'] =
    sub.status === 'active' || sub.status === 'trialing' ? 'active' : sub.status === 'past_due' || sub.status === 'unpaid' ? 'past_due' : sub.status === 'canceled' ? 'canceled' : billing.planState;
  const graceUntil = state === 'past_due' ? repo.planGraceFrom(new Date(Date.now() + deps.env.PLAN_GRACE_DAYS * DAY)) : null;
  await repo.updateBilling(s, {
    planSubscriptionId: sub.id,
    planState: failedInvoice && state === 'active' ? billing.planState : state,
    planStations: item?.quantity ?? billing.planStations,
    planPeriodEnd: periodEnd ? new Date(periodEnd * 1000) : null,
    planGraceUntil: graceUntil,
  });
}

/** Test mode only: moves the rink's test clocks on, so renewals (and failed renewals) happen in the demo. */
export async function advanceClocks(ctx: RinkContext, deps: SalesDeps, days: number): Promise<BillingResponse> {
  if (!deps.env.PAYMENT_TEST_MODE) throw AppError.notFound('Test clocks exist only in test mode');
  const s = scoped(ctx.tenantId);
  const billing = await repo.ensureBilling(s, deps.env.PLATFORM_FEE_BPS);
  await callPayments(async () => {
    const move = async (clockId: string, account?: string) => {
      const opts = account ? { stripeAccount: account } : {};
      const clock = await deps.payments.testHelpers.testClocks.retrieve(clockId, {}, opts);
      await deps.payments.testHelpers.testClocks.advance(clockId, { frozen_time: clock.frozen_time + days * 86_400 }, opts);
    };
    if (billing.testClockId && billing.connectedAccountId) await move(billing.testClockId, billing.connectedAccountId);
    if (billing.platformTestClockId) await move(billing.platformTestClockId);
  });
  return billingStatus(ctx, deps);
}

// ---- the plan's quantity follows the active stations --------------------------------------------------------

/** Stations billed for an active-station count: a running plan bills at least one, as it did when it started. */
export const planQuantity = (activeStations: number) => Math.max(1, activeStations);

/**
 * Sets the plan subscription's quantity at the service to the rink's active stations, if it differs. `changeKey`
 * names the change (a station's, or the day's sweep) and, with the quantity, makes the idempotency key, so a
 * retried request is applied once. A rink without a running plan is left alone.
 */
export async function syncPlanQuantity(
  s: Scope,
  deps: Pick<SalesDeps, 'payments'>,
  changeKey: string,
  options: Pick<Stripe.RequestOptions, 'timeout' | 'maxNetworkRetries'> = {},
): Promise<{ quantity: number; updated: boolean } | null> {
  const billing = await repo.findBilling(s);
  if (!billing?.planSubscriptionId || billing.planState === 'none' || billing.planState === 'canceled') return null;
  const sub = await deps.payments.subscriptions.retrieve(billing.planSubscriptionId, {}, options);
  const item = sub.items.data[0];
  if (!item || sub.status === 'canceled' || sub.status === 'incomplete_expired') return null;
  const quantity = planQuantity(await repo.countActiveStations(s));
  if (item.quantity === quantity) return { quantity, updated: false };
  await deps.payments.subscriptions.update(sub.id, { items: [{ id: item.id, quantity }] }, { ...options, idempotencyKey: `plan-quantity:${sub.id}:${changeKey}:${quantity}` });
  await repo.updateBilling(s, { planStations: quantity });
  return { quantity, updated: true };
}

/** One quantity sync at a time per rink in this process, so two quick station changes cannot leave the older count last. */
const syncing = new Map<string, Promise<unknown>>();

/**
 * A station was activated, deactivated or added: the plan follows at once. The station change does not wait long
 * for a slow service (5 s, one retry under the same key); a failure is the caller's to log, and the worker's daily
 * sweep sets the quantity again.
 */
export function followActiveStations(tenantId: string, deps: Pick<SalesDeps, 'payments'>, changeId: string) {
  const run = (syncing.get(tenantId) ?? Promise.resolve())
    .catch(() => undefined)
    .then(() => syncPlanQuantity(scoped(tenantId), deps, `station:${changeId}`, { timeout: 5_000, maxNetworkRetries: 1 }));
  syncing.set(tenantId, run);
  const forget = () => {
    if (syncing.get(tenantId) === run) syncing.delete(tenantId);
  };
  run.then(forget, forget);
  return run;
}
