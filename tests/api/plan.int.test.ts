import { eq } from 'drizzle-orm';
import { rinkBilling } from '@rinkwright/db';
import { createStation, createUser } from '@rinkwright/db/testing';
import { currentDb } from '@rinkwright/db/unscoped';
import { beforeAll, describe, expect, it } from 'vitest';
import { sweepRink } from '../../apps/api/src/jobs/worker';
import { webhookSecrets } from '../../apps/api/src/lib/payment-settings';
import { advanceClock, deliveriesSettled, eventually, listeningApp, payOnCheckoutPage, redeemPath, workerDeps } from '../support/billing';
import { createDesk, write, type Desk } from '../support/desk';
import { PASSWORD, uniqueEmail } from '../support/world';
import type { Client } from '../support/app';

// The rink's own Rinkwright plan against MariaDB and the payment fake: started through hosted checkout for the
// active stations, its quantity following station changes, a failed payment's grace, the read-only rink after it
// (reads and billing still work), and paying again. The plan's price is PLAN_STATION_PRICE_MINOR (default 2900,
// 29.00 per active station per month, apps/api/src/env.ts) and its grace PLAN_GRACE_DAYS (default 7).

const api = await listeningApp();
const DAY = 86_400_000;
/** A test that waits for the fake's webhooks, at most a minute a wait (see eventually): the fake is shared and may be busy. */
const CLOCKED = 180_000;
const PER_STATION = 2900;
/** More than any calendar month and less than two: one advance is exactly one renewal. */
const ONE_PERIOD_DAYS = 32;

let desk: Desk;
let owner: Client;
let manager: Client;
let technician: Client;
let admin: Client;
const stationIds: string[] = [];

type Billing = { plan: { state: string; stations: number; activeStations: number; periodEnd: string | null; graceUntil: string | null; pricePerStationMinor: number } };
const billing = async (agent: Client = owner) => (await agent.get(`/api/rinks/${desk.world.slug}/billing`)).body as Billing;
const billingRow = async () => (await currentDb().select().from(rinkBilling).where(eq(rinkBilling.tenantId, desk.world.id)))[0]!;
const subscription = async (id?: string) => api.payments.subscriptions.retrieve(id ?? (await billingRow()).planSubscriptionId!);
const quantityAtService = async () => (await subscription()).items.data[0]?.quantity;
const stationBody = (name: string, status: 'active' | 'maintenance' | 'retired') => ({ name, status, rpm: 3450, adjustStepMilli: 125 });
const stationsPath = () => `/api/rinks/${desk.world.slug}/stations`;
const platformRow = async () => ((await admin.get('/api/platform/rinks')).body.rinks as { slug: string; plan: unknown }[]).find((r) => r.slug === desk.world.slug);

/** The owner starts (or restarts) the plan and pays its hosted checkout on the platform account. */
async function startPlan(card: string) {
  const started = await owner.post(`/api/rinks/${desk.world.slug}/billing/plan`).send({});
  expect(started.status).toBe(201);
  const paid = await payOnCheckoutPage(started.body.url as string, card, desk.world.staff.owner.email);
  expect(paid.status).toBe(303);
}

/** A platform event delivered as a late first delivery would arrive: a fresh event id, signed with our secret. */
async function deliverLate(type: string, object: object) {
  const payload = JSON.stringify({ id: `evt_late_${Date.now()}`, object: 'event', type, created: Math.floor(Date.now() / 1000), data: { object }, livemode: false, pending_webhooks: 1, request: { id: null, idempotency_key: null }, api_version: null });
  const [secret] = await webhookSecrets('platform');
  const header = api.payments.webhooks.generateTestHeaderString({ payload, secret: secret! });
  return api.client().post('/api/webhooks/stripe').set('Stripe-Signature', header).set('Content-Type', 'application/json').send(payload);
}

/** Writes of four kinds a rink makes every day: a customer, a station change, a redemption, a product. */
async function everydayWrites() {
  return {
    customer: await manager.post(`/api/rinks/${desk.world.slug}/customers`).send({ name: 'Walk-up Skater', email: uniqueEmail('walkup') }),
    station: await manager.put(`${stationsPath()}/${stationIds[0]}`).send(stationBody('Station One', 'active')),
    redemption: await write(technician, redeemPath(desk.world, desk.skater.id), {}),
    product: await manager.post(`/api/rinks/${desk.world.slug}/products`).send({ kind: 'punch_card', name: 'Five sharpenings', credits: 5, priceMinor: 3000, monthsValid: 6, listed: true }),
  };
}

beforeAll(async () => {
  desk = await createDesk('Plan Rink');
  stationIds.push(desk.station.id, (await createStation(currentDb(), desk.world.id, { name: 'Station Two' })).id);
  await createStation(currentDb(), desk.world.id, { name: 'Old Bench', status: 'retired' });
  owner = await api.signIn(desk.world.staff.owner.email, desk.world.staff.owner.password);
  manager = await api.signIn(desk.world.staff.manager.email, desk.world.staff.manager.password);
  technician = await api.signIn(desk.world.staff.technician.email, desk.world.staff.technician.password);
  const adminEmail = uniqueEmail('plan-admin');
  await createUser(currentDb(), { email: adminEmail, name: 'Test Admin', password: PASSWORD, verified: true, platformRole: 'admin' });
  admin = await api.signIn(adminEmail, PASSWORD);
  const opening = await write(manager, `/api/rinks/${desk.world.slug}/customers/${desk.skater.id}/adjustments`, { credits: 10, reason: 'Opening balance' });
  expect(opening.status).toBe(201);
}, CLOCKED);

describe('starting the plan', { timeout: CLOCKED }, () => {
  it('is the owner’s to start; a manager reads it and cannot', async () => {
    expect((await billing(manager)).plan).toMatchObject({ state: 'none', stations: 0, activeStations: 2 });
    expect((await manager.post(`/api/rinks/${desk.world.slug}/billing/plan`).send({})).status).toBe(403);
  });

  it('bills the active stations through hosted checkout', async () => {
    // 0341 pays at the hosted page and fails every later charge (the fake's README, test cards).
    await startPlan('4000 0000 0000 0341');
    const status = await eventually(billing, (b) => b.plan.state === 'active');
    // Two active stations (the retired one is not billed): 2 × 29.00.
    expect(status.plan).toMatchObject({ stations: 2, activeStations: 2, graceUntil: null, pricePerStationMinor: PER_STATION });
    const sub = await subscription();
    expect(sub).toMatchObject({ status: 'active', metadata: { kind: 'plan', rink_id: desk.world.id } });
    const invoice = await api.payments.invoices.retrieve(sub.latest_invoice as string);
    expect(invoice).toMatchObject({ status: 'paid', amount_paid: 2 * PER_STATION });
    const months = (Date.parse(status.plan.periodEnd!) - Date.now()) / DAY;
    expect(months).toBeGreaterThan(27);
    expect(months).toBeLessThan(32);
    expect(await platformRow()).toMatchObject({ plan: { state: 'active', stations: 2, activeStations: 2, graceUntil: null } });
    expect((await owner.post(`/api/rinks/${desk.world.slug}/billing/plan`).send({})).status).toBe(409);
  });
});

describe('the quantity follows the active stations', { timeout: CLOCKED }, () => {
  const quantityUpdates = async (subId: string) => {
    const events = await api.payments.events.list({ type: 'customer.subscription.updated', limit: 100 });
    return events.data.filter((e) => (e.data.object as { id: string }).id === subId && e.request?.idempotency_key?.startsWith('plan-quantity:'));
  };

  it('updates the subscription once per change that moves the count, each with its own key', async () => {
    const subId = (await billingRow()).planSubscriptionId!;
    const put = (id: string, name: string, status: 'active' | 'maintenance') => manager.put(`${stationsPath()}/${id}`).send(stationBody(name, status));

    expect((await put(stationIds[0]!, 'Station One', 'maintenance')).status).toBe(200);
    expect(await quantityAtService()).toBe(1);
    expect((await put(stationIds[0]!, 'Station One', 'active')).status).toBe(200);
    expect(await quantityAtService()).toBe(2);
    const added = await manager.post(stationsPath()).send(stationBody('Station Three', 'active'));
    expect(added.status).toBe(201);
    stationIds.push(added.body.id as string);
    expect(await quantityAtService()).toBe(3);
    // Neither a station added out of service nor a new name moves the count.
    expect((await manager.post(stationsPath()).send(stationBody('Spare Bench', 'maintenance'))).status).toBe(201);
    expect((await put(stationIds[0]!, 'Station 1', 'active')).status).toBe(200);
    expect(await quantityAtService()).toBe(3);

    expect((await billing()).plan).toMatchObject({ stations: 3, activeStations: 3 });
    await deliveriesSettled(api, 'platform');
    const updates = await quantityUpdates(subId);
    expect(updates).toHaveLength(3);
    expect(new Set(updates.map((e) => e.request!.idempotency_key)).size).toBe(3);
  });

  it('saves a station change the payment service refuses, and the daily sweep sets the quantity after', async () => {
    const row = await billingRow();
    // An id the payment service does not know makes its answer an error, as an outage or a refusal would.
    await currentDb().update(rinkBilling).set({ planSubscriptionId: 'sub_unknown_to_the_service' }).where(eq(rinkBilling.tenantId, desk.world.id));
    const changed = await manager.put(`${stationsPath()}/${stationIds[2]}`).send(stationBody('Station Three', 'maintenance'));
    expect(changed.status).toBe(200);
    expect(changed.body).toMatchObject({ name: 'Station Three', status: 'maintenance' });
    await currentDb().update(rinkBilling).set({ planSubscriptionId: row.planSubscriptionId }).where(eq(rinkBilling.tenantId, desk.world.id));
    expect(await quantityAtService()).toBe(3);

    const deps = workerDeps(api);
    expect((await sweepRink(desk.world.id, deps)).plan).toEqual({ quantity: 2, updated: true });
    expect(await quantityAtService()).toBe(2);
    expect((await sweepRink(desk.world.id, deps)).plan).toEqual({ quantity: 2, updated: false });
    await eventually(billing, (b) => b.plan.stations === 2);
  });
});

describe('a failed plan payment', { timeout: CLOCKED }, () => {
  it('makes the plan past_due with a grace date, and the rink keeps working meanwhile', async () => {
    const from = Date.now();
    await advanceClock(owner, desk.world, ONE_PERIOD_DAYS);
    const status = await eventually(billing, (b) => b.plan.state === 'past_due');
    const until = Date.parse(status.plan.graceUntil!);
    expect(until).toBeGreaterThanOrEqual(from + 7 * DAY - 1000);
    expect(until).toBeLessThanOrEqual(Date.now() + 7 * DAY);
    // The renewal billed the 2 active stations it was set to: 2 × 29.00, unpaid.
    const open = await api.payments.invoices.list({ subscription: (await billingRow()).planSubscriptionId!, status: 'open' });
    expect(open.data.map((i) => [i.billing_reason, i.amount_due])).toEqual([['subscription_cycle', 2 * PER_STATION]]);
    expect(await platformRow()).toMatchObject({ plan: { state: 'past_due', graceUntil: status.plan.graceUntil } });
    const writes = await everydayWrites();
    expect(Object.values(writes).map((w) => w.status)).toEqual([201, 200, 201, 201]);
    // During the grace the owner may pay with another card: a new checkout, not a refusal.
    const another = await owner.post(`/api/rinks/${desk.world.slug}/billing/plan`).send({});
    expect(another.status, JSON.stringify(another.body)).toBe(201);
    expect(another.body.url).toMatch(/\/checkout\//);
  });

  it('is active again when the open invoice is paid at the payment service', async () => {
    const open = await api.payments.invoices.list({ subscription: (await billingRow()).planSubscriptionId!, status: 'open' });
    await api.payments.invoices.pay(open.data[0]!.id, { payment_method: 'pm_card_visa' });
    const status = await eventually(billing, (b) => b.plan.state === 'active');
    expect(status.plan.graceUntil).toBeNull();
  });

  it('turns the rink read-only when the grace runs out: writes 403, reads and billing still answer', async () => {
    // The card on file still fails, so the next renewal fails too.
    await advanceClock(owner, desk.world, ONE_PERIOD_DAYS);
    await eventually(billing, (b) => b.plan.state === 'past_due');
    await deliveriesSettled(api, 'platform');
    // Grace is counted in wall-clock days; moving its end into the past stands for the seven days passing.
    await currentDb().update(rinkBilling).set({ planGraceUntil: new Date(Date.now() - 1000) }).where(eq(rinkBilling.tenantId, desk.world.id));
    expect((await billing()).plan.state).toBe('read_only');

    const writes = await everydayWrites();
    for (const [what, answer] of Object.entries(writes)) {
      expect(answer.status, what).toBe(403);
      expect(answer.body.error.code, what).toBe('read_only');
    }
    expect((await manager.get(stationsPath())).status).toBe(200);
    expect((await manager.get(`/api/rinks/${desk.world.slug}/customers/${desk.skater.id}/balance`)).status).toBe(200);
    expect((await technician.get(`/api/rinks/${desk.world.slug}/customers`).query({ q: 'Robin' })).status).toBe(200);
    expect((await owner.post(`/api/rinks/${desk.world.slug}/billing/payout-account/refresh`).send({})).status).toBe(201);

    // The nightly sweep writes the lapse down; the platform admin sees it.
    await sweepRink(desk.world.id, workerDeps(api));
    expect((await billingRow()).planState).toBe('read_only');
    expect(await platformRow()).toMatchObject({ plan: { state: 'read_only', stations: 2, activeStations: 2 } });
  });

  it('is active again when the owner pays a new checkout, and the unpaid subscription is ended', async () => {
    const unpaid = (await billingRow()).planSubscriptionId!;
    await startPlan('4242 4242 4242 4242');
    const status = await eventually(billing, (b) => b.plan.state === 'active');
    expect(status.plan).toMatchObject({ stations: 2, activeStations: 2, graceUntil: null });
    const current = (await billingRow()).planSubscriptionId!;
    expect(current).not.toBe(unpaid);
    expect((await subscription(unpaid)).status).toBe('canceled');
    await deliveriesSettled(api, 'platform');

    // A late event about the replaced subscription leaves the new plan alone.
    const old = await subscription(unpaid);
    expect((await deliverLate('customer.subscription.updated', { ...old, status: 'past_due' })).status).toBe(200);
    expect((await billing()).plan).toMatchObject({ state: 'active', graceUntil: null });
    expect((await billingRow()).planSubscriptionId).toBe(current);

    const writes = await everydayWrites();
    expect(Object.values(writes).map((w) => w.status)).toEqual([201, 200, 201, 201]);
    expect(await platformRow()).toMatchObject({ plan: { state: 'active', stations: 2, activeStations: 2, graceUntil: null } });
  });
});
