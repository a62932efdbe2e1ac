import { randomUUID } from 'node:crypto';
import { and, eq } from 'drizzle-orm';
import { creditLot, membership } from '@rinkwright/db';
import { currentDb } from '@rinkwright/db/unscoped';
import { beforeAll, describe, expect, it } from 'vitest';
import { sweepRink } from '../../apps/api/src/jobs/worker';
import { webhookSecrets } from '../../apps/api/src/lib/payment-settings';
import {
  addProduct,
  advanceClock,
  balanceOf,
  buyOnPublicPage,
  connectPayout,
  customerIdByEmail,
  deliveriesSettled,
  eventually,
  listeningApp,
  redeemPath,
  setChaos,
  traceLots,
  workerDeps,
  type TracedLot,
} from '../support/billing';
import { createDesk, write, type Desk } from '../support/desk';
import { waitForMail } from '../support/mail';
import { uniqueEmail } from '../support/world';
import type { Client } from '../support/app';

// Memberships against MariaDB and the payment fake, driven through each rink's test clock: checkout, renewals
// with the rollover cap (webhooks duplicated and shuffled), a failed renewal with its grace and what follows it,
// and both ways of cancelling. Every expected number is worked by hand beside its check.
//
// The rule of product.md ("Selling and billing", "Credits"): a membership grants its credits each paid period;
// at a renewal unused credits carry over up to the rollover cap and the rest expire (breakage); after a failed
// payment its credits stay usable for the grace days, then redemption is blocked (409 insufficient_credits) with
// nothing removed, and paying the invoice brings them back, rolled over as at any renewal.

const api = await listeningApp();

/** 4 credits a month for 39.99, up to 2 carried over, 7 days of grace. 39.99 does not split evenly into 4. */
const club = { kind: 'membership', name: 'Monthly sharpening club', credits: 4, priceMinor: 3999, interval: 'month', rolloverCap: 2, graceDays: 7, listed: true };
// Hand-worked, cumulative rounding (credits.ts, lotValueMinor): the first k credits of a lot are worth
// round(3999 × k / 4): k=1 → 1000 (999.75), k=2 → 2000 (1999.5 rounds half up), k=3 → 2999 (2999.25), k=4 → 3999.

const DAY = 86_400_000;
/** A test that waits for the fake's webhooks, at most a minute a wait (see eventually): the fake is shared and may be busy. */
const CLOCKED = 180_000;
/** More than any calendar month and less than two: one advance is exactly one renewal. */
const ONE_PERIOD_DAYS = 32;
/** 3 % (PLATFORM_FEE_BPS default 300) of 39.99 = 119.97, rounded to 120. */
const FEE_MINOR = 120;

interface Rink {
  desk: Desk;
  account: string;
  owner: Client;
  manager: Client;
  technician: Client;
  productId: string;
}

/** Each describe gets a rink of its own: a rink's memberships share one test clock, so one advance renews them all. */
async function membershipRink(name: string): Promise<Rink> {
  const desk = await createDesk(name);
  const account = await connectPayout(api, desk.world);
  const owner = await api.signIn(desk.world.staff.owner.email, desk.world.staff.owner.password);
  const manager = await api.signIn(desk.world.staff.manager.email, desk.world.staff.manager.password);
  const technician = await api.signIn(desk.world.staff.technician.email, desk.world.staff.technician.password);
  const product = await addProduct(manager, desk.world, club);
  return { desk, account, owner, manager, technician, productId: product.id };
}

async function join(rink: Rink, label: string, card?: string) {
  const email = uniqueEmail(label);
  await buyOnPublicPage(api, rink.desk.world, rink.productId, email, card);
  const customerId = await customerIdByEmail(rink.manager, rink.desk.world, email);
  await eventually(
    () => balanceOf(rink.manager, rink.desk.world, customerId),
    (b) => b.credits === 4,
  );
  const ledger = await rink.manager.get(`/api/rinks/${rink.desk.world.slug}/customers/${customerId}/ledger`);
  const membershipId = ledger.body.memberships[0].id as string;
  return { email, customerId, membershipId };
}

const ledgerOf = async (rink: Rink, customerId: string) => (await rink.manager.get(`/api/rinks/${rink.desk.world.slug}/customers/${customerId}/ledger`)).body;
const membershipRow = async (rink: Rink, customerId: string) => (await ledgerOf(rink, customerId)).memberships[0];
const subscriptionOf = async (membershipId: string) => (await currentDb().select().from(membership).where(eq(membership.id, membershipId)))[0]!.subscriptionId;

/** Every lot's remaining is the sum of its entries' credits (the ledger's invariant, DEVELOPERS.md "Money and credits"). */
function expectTraceable(lots: TracedLot[]) {
  expect(lots.length).toBeGreaterThan(0);
  for (const { lot, entryCredits } of lots) expect(entryCredits, `lot ${lot.id} (${lot.origin})`).toBe(lot.remaining);
}

const shape = (t: TracedLot) => ({
  origin: t.lot.origin,
  credits: t.lot.credits,
  remaining: t.lot.remaining,
  priceMinor: t.lot.priceMinor,
  entries: t.entries.map((e) => [e.kind, e.credits, e.valueMinor]),
});

/** The connect endpoint's signing secret, to deliver an event the way a late first delivery would arrive. */
async function deliverLate(event: { id: string }) {
  const payload = JSON.stringify({ ...event, id: `evt_late_${randomUUID().replace(/-/g, '')}` });
  const [secret] = await webhookSecrets('connect');
  const header = api.payments.webhooks.generateTestHeaderString({ payload, secret: secret! });
  return api.client().post('/api/webhooks/stripe-connect').set('Stripe-Signature', header).set('Content-Type', 'application/json').send(payload);
}

describe('joining and renewing', { timeout: CLOCKED }, () => {
  let rink: Rink;
  let skater: Awaited<ReturnType<typeof join>>;

  beforeAll(async () => {
    rink = await membershipRink('Membership Renewals');
  }, CLOCKED);

  it('grants the period’s credits once when the checkout’s webhooks arrive', async () => {
    skater = await join(rink, 'member');
    await deliveriesSettled(api, 'connect');
    const balance = await balanceOf(rink.manager, rink.desk.world, skater.customerId);
    expect(balance).toMatchObject({ credits: 4, valueMinor: 3999 });
    const ledger = await ledgerOf(rink, skater.customerId);
    expect(ledger.memberships).toHaveLength(1);
    expect(ledger.memberships[0]).toMatchObject({ productName: club.name, state: 'active', cancelAtPeriodEnd: false, graceUntil: null, creditsPerPeriod: 4, priceMinor: 3999, interval: 'month' });
    expect(ledger.payments).toHaveLength(1);
    expect(ledger.payments[0]).toMatchObject({ state: 'paid', amountMinor: 3999, feeMinor: FEE_MINOR, channel: 'online', productKind: 'membership' });
    const lots = await traceLots(rink.desk.world.id, skater.customerId);
    expect(lots.map(shape)).toEqual([{ origin: 'membership', credits: 4, remaining: 4, priceMinor: 3999, entries: [['purchase', 4, 3999]] }]);
    expectTraceable(lots);
  });

  it('refuses a second checkout for a membership the skater already holds', async () => {
    const again = await api.client().post(`/api/public/rinks/${rink.desk.world.slug}/checkout`).send({ productId: rink.productId, email: skater.email, name: 'Member Again' });
    expect(again.status).toBe(409);
    expect(again.body.error.message).toMatch(/already running/);
  });

  it('renews past the period end: the new period once, 2 of 3 unused credits carried, 1 expired', async () => {
    expect((await write(rink.technician, redeemPath(rink.desk.world, skater.customerId), {})).status).toBe(201);
    const before = await membershipRow(rink, skater.customerId);
    // Every event of the renewal reaches the API twice, in shuffled order.
    await setChaos(api, 'connect', { duplicates: 1, shuffle: true });
    try {
      await advanceClock(rink.owner, rink.desk.world, ONE_PERIOD_DAYS);
      await eventually(
        () => balanceOf(rink.manager, rink.desk.world, skater.customerId),
        (b) => b.credits === 6,
      );
      await deliveriesSettled(api, 'connect');
    } finally {
      await setChaos(api, 'connect', { duplicates: 0, shuffle: false });
    }
    // Hand-worked: 3 unused, cap 2 → 2 carried, 1 expired. Period 1's lot (4 for 39.99, 1 redeemed, worth 1000):
    // the expired credit is the 2nd → 2000 − 1000 = 1000; the two carried are the 3rd and 4th → 3999 − 2000 = 1999,
    // which is the carried lot's price. The lot's values add up to 3999 − 1000 − 1000 − 1999 = 0.
    const lots = await traceLots(rink.desk.world.id, skater.customerId);
    expect(lots.map(shape)).toEqual([
      { origin: 'membership', credits: 4, remaining: 0, priceMinor: 3999, entries: [['purchase', 4, 3999], ['redeem', -1, -1000], ['expire', -1, -1000], ['transfer', -2, -1999]] },
      { origin: 'membership', credits: 4, remaining: 4, priceMinor: 3999, entries: [['purchase', 4, 3999]] },
      { origin: 'transfer', credits: 2, remaining: 2, priceMinor: 1999, entries: [['transfer', 2, 1999]] },
    ]);
    expect(lots[0]!.entryValueMinor).toBe(0);
    expectTraceable(lots);
    // 4 new + 2 carried, worth 3999 + 1999.
    expect(await balanceOf(rink.manager, rink.desk.world, skater.customerId)).toMatchObject({ credits: 6, valueMinor: 5998 });
    const ledger = await ledgerOf(rink, skater.customerId);
    expect(ledger.payments.map((p: { state: string; amountMinor: number; feeMinor: number }) => [p.state, p.amountMinor, p.feeMinor])).toEqual([
      ['paid', 3999, FEE_MINOR],
      ['paid', 3999, FEE_MINOR],
    ]);
    const after = ledger.memberships[0];
    expect(after.state).toBe('active');
    // The period moved on by one calendar month (28 to 31 days).
    const moved = (Date.parse(after.periodEnd) - Date.parse(before.periodEnd)) / DAY;
    expect(moved).toBeGreaterThanOrEqual(28);
    expect(moved).toBeLessThanOrEqual(31);
  });

  it('keeps the carry at the cap across renewals: 6 unused (4 + 2 carried) leave 2 carried and 4 expired', async () => {
    await advanceClock(rink.owner, rink.desk.world, ONE_PERIOD_DAYS);
    await eventually(
      async () => (await traceLots(rink.desk.world.id, skater.customerId)).filter((t) => t.lot.origin === 'membership').length,
      (n) => n === 3,
    );
    await deliveriesSettled(api, 'connect');
    const lots = await traceLots(rink.desk.world.id, skater.customerId);
    expectTraceable(lots);
    const entries = lots.flatMap((t) => t.entries);
    const renewal = entries.filter((e) => e.createdAt >= lots[3]!.lot.createdAt);
    // Hand-worked: period 2's lot (4, worth 3999) and the carried lot (2, worth 1999) hold 6 unused credits worth
    // 5998. Cap 2: 4 expire and 2 carry; whichever lot each comes from, the 2 carried are worth 1999 (the carried
    // lot's 2, or period 2's last 2 = 3999 − 2000), so the expired 4 are worth 5998 − 1999 = 3999.
    const expired = renewal.filter((e) => e.kind === 'expire');
    expect(expired.reduce((n, e) => n + e.credits, 0)).toBe(-4);
    expect(expired.reduce((n, e) => n + e.valueMinor, 0)).toBe(-3999);
    const carried = lots.filter((t) => t.lot.origin === 'transfer' && t.lot.remaining > 0);
    expect(carried.map(shape)).toEqual([{ origin: 'transfer', credits: 2, remaining: 2, priceMinor: 1999, entries: [['transfer', 2, 1999]] }]);
    expect(await balanceOf(rink.manager, rink.desk.world, skater.customerId)).toMatchObject({ credits: 6, valueMinor: 5998 });
    expect(lots.filter((t) => t.lot.origin === 'membership').map((t) => t.entries.filter((e) => e.kind === 'purchase').length)).toEqual([1, 1, 1]);
  });
});

describe('a failed renewal', { timeout: CLOCKED }, () => {
  let rink: Rink;
  let skater: Awaited<ReturnType<typeof join>>;
  let graceFrom: number;

  beforeAll(async () => {
    rink = await membershipRink('Membership Grace');
    // 0341 pays at the hosted page and fails every later charge (the fake's README, test cards).
    skater = await join(rink, 'grace', '4000 0000 0000 0341');
    expect((await write(rink.technician, redeemPath(rink.desk.world, skater.customerId), {})).status).toBe(201);
  }, CLOCKED);

  it('makes the membership past_due with 7 days of grace, records the failed payment and tells the skater', async () => {
    graceFrom = Date.now();
    await advanceClock(rink.owner, rink.desk.world, ONE_PERIOD_DAYS);
    const row = await eventually(
      () => membershipRow(rink, skater.customerId),
      (m) => m.state === 'past_due',
    );
    const until = Date.parse(row.graceUntil);
    expect(until).toBeGreaterThanOrEqual(graceFrom + 7 * DAY - 1000);
    expect(until).toBeLessThanOrEqual(Date.now() + 7 * DAY);
    await deliveriesSettled(api, 'connect');
    const ledger = await ledgerOf(rink, skater.customerId);
    expect(ledger.payments.map((p: { state: string; amountMinor: number }) => [p.state, p.amountMinor])).toEqual([
      ['failed', 3999],
      ['paid', 3999],
    ]);
    const mail = await waitForMail(skater.email, { subject: /membership payment failed/ });
    expect(mail.text).toContain(row.graceUntil.slice(0, 10));
    // No credits for the unpaid period: still the first lot alone, 3 left.
    const lots = await traceLots(rink.desk.world.id, skater.customerId);
    expect(lots.map(shape)).toEqual([{ origin: 'membership', credits: 4, remaining: 3, priceMinor: 3999, entries: [['purchase', 4, 3999], ['redeem', -1, -1000]] }]);
  });

  it('stays past_due when an earlier period’s paid invoice arrives late', async () => {
    const subscription = await subscriptionOf(skater.membershipId);
    const paid = await api.payments.events.list({ type: 'invoice.paid', limit: 100 }, { stripeAccount: rink.account });
    const first = paid.data.find((e) => (e.data.object as { subscription?: string }).subscription === subscription);
    expect(first?.data.object).toMatchObject({ billing_reason: 'subscription_create', status: 'paid' });
    const before = await membershipRow(rink, skater.customerId);
    expect((await deliverLate(first!)).status).toBe(200);
    const after = await membershipRow(rink, skater.customerId);
    expect(after).toMatchObject({ state: 'past_due', graceUntil: before.graceUntil });
  });

  it('redeems during the grace, though the paid period is over', async () => {
    // The fake's clock ran the period out but the wall clock the ledger reads did not, so the period's lot is put
    // where production has it at this point: expired at the period end, which the renewal failed at.
    await currentDb()
      .update(creditLot)
      .set({ expiresAt: new Date(Date.now() - DAY) })
      .where(and(eq(creditLot.tenantId, rink.desk.world.id), eq(creditLot.membershipId, skater.membershipId)));
    const redeemed = await write(rink.technician, redeemPath(rink.desk.world, skater.customerId), {});
    expect(redeemed.status).toBe(201);
    // 4 for 39.99, the 2nd credit used: 2000 − 1000.
    expect(redeemed.body).toMatchObject({ entry: { kind: 'redeem', credits: -1, valueMinor: -1000 }, balance: 2 });
    const balance = await balanceOf(rink.manager, rink.desk.world, skater.customerId);
    expect(balance.credits).toBe(2);
    expect(balance.lots).toMatchObject([{ remaining: 2, redeemable: true }]);
  });

  it('refuses redemption with insufficient_credits once the grace has run out, and keeps every credit and entry', async () => {
    const before = await traceLots(rink.desk.world.id, skater.customerId);
    // Grace is counted in wall-clock days; moving its end into the past stands for the seven days passing.
    await currentDb()
      .update(membership)
      .set({ graceUntil: new Date(Date.now() - 1000) })
      .where(eq(membership.id, skater.membershipId));
    const refused = await write(rink.technician, redeemPath(rink.desk.world, skater.customerId), {});
    expect(refused.status).toBe(409);
    expect(refused.body.error.code).toBe('insufficient_credits');
    expect(refused.body.error.message).toContain('grace');
    const balance = await balanceOf(rink.manager, rink.desk.world, skater.customerId);
    expect(balance.credits).toBe(0);
    expect(balance.lots).toMatchObject([{ remaining: 2, redeemable: false }]);
    expect((await membershipRow(rink, skater.customerId)).state).toBe('blocked');
    // The nightly sweep writes the block down and expires nothing of a membership that may still be paid.
    const deps = workerDeps(api);
    await sweepRink(rink.desk.world.id, deps);
    await sweepRink(rink.desk.world.id, deps, new Date(Date.now() + 40 * DAY));
    expect((await currentDb().select().from(membership).where(eq(membership.id, skater.membershipId)))[0]?.state).toBe('blocked');
    const after = await traceLots(rink.desk.world.id, skater.customerId);
    expect(after.map(shape)).toEqual(before.map(shape));
    expectTraceable(after);
  });

  it('gives the kept credits back, rolled over, when the open invoice is paid', async () => {
    const subscription = await subscriptionOf(skater.membershipId);
    const open = await api.payments.invoices.list({ subscription, status: 'open' }, { stripeAccount: rink.account });
    expect(open.data).toHaveLength(1);
    // The skater pays with another card on the payment service.
    await api.payments.invoices.pay(open.data[0]!.id, { payment_method: 'pm_card_visa' }, { stripeAccount: rink.account });
    const row = await eventually(
      () => membershipRow(rink, skater.customerId),
      (m) => m.state === 'active',
    );
    expect(row.graceUntil).toBeNull();
    await eventually(
      () => balanceOf(rink.manager, rink.desk.world, skater.customerId),
      (b) => b.credits === 6,
    );
    await deliveriesSettled(api, 'connect');
    // Hand-worked: the 2 kept credits are within the cap of 2, so both carry: period 1's 3rd and 4th credits,
    // 3999 − 2000 = 1999. The paid period adds its 4 for 39.99.
    const lots = await traceLots(rink.desk.world.id, skater.customerId);
    expect(lots.map(shape)).toEqual([
      { origin: 'membership', credits: 4, remaining: 0, priceMinor: 3999, entries: [['purchase', 4, 3999], ['redeem', -1, -1000], ['redeem', -1, -1000], ['transfer', -2, -1999]] },
      { origin: 'membership', credits: 4, remaining: 4, priceMinor: 3999, entries: [['purchase', 4, 3999]] },
      { origin: 'transfer', credits: 2, remaining: 2, priceMinor: 1999, entries: [['transfer', 2, 1999]] },
    ]);
    expectTraceable(lots);
    const ledger = await ledgerOf(rink, skater.customerId);
    expect(ledger.payments.map((p: { state: string }) => p.state)).toEqual(['paid', 'paid']);
    expect((await write(rink.technician, redeemPath(rink.desk.world, skater.customerId), {})).status).toBe(201);
  });
});

describe('cancelling', { timeout: CLOCKED }, () => {
  let rink: Rink;
  let now: Awaited<ReturnType<typeof join>>;
  let atEnd: Awaited<ReturnType<typeof join>>;
  const cancelPath = (id: string) => `/api/rinks/${rink.desk.world.slug}/memberships/${id}/cancel`;

  beforeAll(async () => {
    rink = await membershipRink('Membership Cancels');
    now = await join(rink, 'cancel-now');
    atEnd = await join(rink, 'cancel-end');
    await deliveriesSettled(api, 'connect');
  }, CLOCKED);

  it('lets a manager, not a technician, cancel', async () => {
    const refused = await rink.technician.post(cancelPath(now.membershipId)).send({ when: 'now' });
    expect(refused.status).toBe(403);
  });

  it('cancels now: canceled at once, the paid period’s credits still usable, nothing refunded', async () => {
    const answer = await rink.manager.post(cancelPath(now.membershipId)).send({ when: 'now' });
    expect(answer.status).toBe(201);
    expect(answer.body).toMatchObject([{ id: now.membershipId, state: 'canceled' }]);
    const subscription = await api.payments.subscriptions.retrieve(await subscriptionOf(now.membershipId), {}, { stripeAccount: rink.account });
    expect(subscription.status).toBe('canceled');
    expect((await write(rink.technician, redeemPath(rink.desk.world, now.customerId), {})).status).toBe(201);
    expect((await balanceOf(rink.manager, rink.desk.world, now.customerId)).credits).toBe(3);
    expect((await ledgerOf(rink, now.customerId)).payments).toMatchObject([{ state: 'paid', refundedMinor: 0 }]);
    const again = await rink.manager.post(cancelPath(now.membershipId)).send({ when: 'now' });
    expect(again.status).toBe(409);
  });

  it('is not revived by a late event that still says active', async () => {
    await deliveriesSettled(api, 'connect');
    const events = await api.payments.events.list({ limit: 100 }, { stripeAccount: rink.account });
    const subscription = await subscriptionOf(now.membershipId);
    const created = events.data.find((e) => e.type === 'customer.subscription.created' && (e.data.object as { id: string }).id === subscription);
    const paid = events.data.find((e) => e.type === 'invoice.paid' && (e.data.object as { subscription?: string }).subscription === subscription);
    expect(created?.data.object).toMatchObject({ status: 'active' });
    expect(paid?.data.object).toMatchObject({ status: 'paid' });
    for (const event of [created!, paid!]) expect((await deliverLate(event)).status).toBe(200);
    expect(await membershipRow(rink, now.customerId)).toMatchObject({ state: 'canceled' });
    expect((await traceLots(rink.desk.world.id, now.customerId)).length).toBe(1);
  });

  it('cancels at the period end: active until then, ended by the renewal that does not happen', async () => {
    const answer = await rink.manager.post(cancelPath(atEnd.membershipId)).send({ when: 'period_end' });
    expect(answer.status).toBe(201);
    expect(answer.body).toMatchObject([{ id: atEnd.membershipId, state: 'active', cancelAtPeriodEnd: true }]);
    expect((await write(rink.technician, redeemPath(rink.desk.world, atEnd.customerId), {})).status).toBe(201);
    await advanceClock(rink.owner, rink.desk.world, ONE_PERIOD_DAYS);
    await eventually(
      () => membershipRow(rink, atEnd.customerId),
      (m) => m.state === 'canceled',
    );
    await deliveriesSettled(api, 'connect');
    // No renewal for either: one lot each, one payment each.
    for (const who of [now, atEnd]) {
      expect((await traceLots(rink.desk.world.id, who.customerId)).length).toBe(1);
      expect((await ledgerOf(rink, who.customerId)).payments).toHaveLength(1);
    }
  });

  it('expires what is left after the paid period as breakage, once', async () => {
    const periodEnd = (await traceLots(rink.desk.world.id, atEnd.customerId))[0]!.lot.expiresAt!;
    const after = new Date(periodEnd.getTime() + DAY);
    const deps = workerDeps(api);
    await sweepRink(rink.desk.world.id, deps, after);
    await sweepRink(rink.desk.world.id, deps, after);
    for (const who of [now, atEnd]) {
      const lots = await traceLots(rink.desk.world.id, who.customerId);
      expectTraceable(lots);
      // Hand-worked: each redeemed 1 of 4 (worth 1000); the 3 left expire at 3999 − 1000 = 2999.
      expect(lots.map(shape)).toEqual([{ origin: 'membership', credits: 4, remaining: 0, priceMinor: 3999, entries: [['purchase', 4, 3999], ['redeem', -1, -1000], ['expire', -3, -2999]] }]);
    }
  });
});
