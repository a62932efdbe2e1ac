import { randomUUID } from 'node:crypto';
import type { Faker } from '@faker-js/faker';
import { eq } from 'drizzle-orm';
import { lotValueMinor } from '@rinkwright/core';
import type { Database } from './client';
import { creditAccount, creditEntry, creditLot, customer, league, leaguePlayer, leagueTeam, payment, product, productPrice, rinkBilling } from './schema/index';

// The demo's money: each rink's products, six months of counter sales with their credits redeemed, expired and
// refunded as the ledger would have written them, a youth league with its pool and team allocations, and the
// rinks' plans. Values follow the same cumulative rounding as the live ledger (core's lotValueMinor).

const DAY = 86_400_000;
type Tx = Database;

interface ProductSpec {
  kind: (typeof product.$inferInsert)['kind'];
  name: string;
  credits: number;
  priceMinor: number;
  monthsValid?: number;
  rolloverCap?: number;
  graceDays?: number;
  interval?: 'month';
  description?: string;
}

interface Ledger {
  lots: (typeof creditLot.$inferInsert)[];
  entries: (typeof creditEntry.$inferInsert)[];
}

function openLot(l: Ledger, rinkId: string, input: { accountId: string; origin: (typeof creditLot.$inferInsert)['origin']; credits: number; priceMinor: number; at: Date; expiresAt: Date | null; productId?: string; paymentId?: string; actor?: string | null; source: (typeof creditEntry.$inferInsert)['source'] }) {
  const lot = { id: randomUUID(), tenantId: rinkId, accountId: input.accountId, origin: input.origin, credits: input.credits, remaining: input.credits, priceMinor: input.priceMinor, expiresAt: input.expiresAt, productId: input.productId ?? null, paymentId: input.paymentId ?? null, createdAt: input.at };
  l.lots.push(lot);
  const id = randomUUID();
  l.entries.push({ id, tenantId: rinkId, accountId: input.accountId, lotId: lot.id, kind: input.origin === 'transfer' ? 'transfer' : input.origin === 'adjust' ? 'adjust' : 'purchase', credits: input.credits, valueMinor: input.priceMinor, source: input.source, sourceId: input.paymentId ?? null, operationId: id, idemKey: `seed:${id}`, actorUserId: input.actor ?? null, createdAt: input.at });
  return lot;
}

function take(l: Ledger, lot: Ledger['lots'][number], n: number, kind: 'redeem' | 'expire' | 'refund' | 'transfer', at: Date, actor: string | null, source: (typeof creditEntry.$inferInsert)['source'], reason: string | null = null) {
  const value = lotValueMinor({ credits: lot.credits, remaining: lot.remaining!, priceMinor: lot.priceMinor }, n);
  lot.remaining! -= n;
  const id = randomUUID();
  l.entries.push({ id, tenantId: lot.tenantId, accountId: lot.accountId, lotId: lot.id!, kind, credits: -n, valueMinor: -value, source, sourceId: null, reason, operationId: id, idemKey: `seed:${id}`, actorUserId: actor, createdAt: at });
  return value;
}

export async function seedBilling(tx: Tx, faker: Faker, input: { rinkId: string; currency: string; products: ProductSpec[]; sales: number; technicianIds: string[]; managerId: string | null; leagueManagerId?: string | null; planState: 'active' | 'past_due'; stations: number; now: Date }) {
  const { rinkId, now } = input;
  const made: { id: string; priceId: string; spec: ProductSpec }[] = [];
  for (const spec of input.products) {
    const id = randomUUID();
    const priceId = randomUUID();
    const at = new Date(now.getTime() - 200 * DAY);
    await tx.insert(product).values({ id, tenantId: rinkId, kind: spec.kind, name: spec.name, description: spec.description ?? null, credits: spec.credits, monthsValid: spec.monthsValid ?? null, rolloverCap: spec.rolloverCap ?? null, graceDays: spec.graceDays ?? null, interval: spec.interval ?? null, listed: spec.kind === 'league_pack' ? 0 : 1, createdAt: at, updatedAt: at });
    await tx.insert(productPrice).values({ id: priceId, tenantId: rinkId, productId: id, amountMinor: spec.priceMinor, currency: input.currency, createdAt: at });
    made.push({ id, priceId, spec });
  }
  const customers = await tx.select({ id: customer.id }).from(customer).where(eq(customer.tenantId, rinkId));
  const accounts = new Map<string, string>();
  const accountOf = async (customerId: string) => {
    const known = accounts.get(customerId);
    if (known) return known;
    const id = randomUUID();
    await tx.insert(creditAccount).values({ id, tenantId: rinkId, kind: 'skater', customerId });
    accounts.set(customerId, id);
    return id;
  };
  const l: Ledger = { lots: [], entries: [] };
  const payments: (typeof payment.$inferInsert)[] = [];
  const cards = made.filter((m) => m.spec.kind === 'punch_card' || m.spec.kind === 'single');
  for (let i = 0; i < input.sales; i++) {
    const buyer = faker.helpers.arrayElement(customers);
    const item = faker.helpers.arrayElement(cards);
    const at = new Date(now.getTime() - faker.number.int({ min: 2, max: 180 }) * DAY - faker.number.int({ min: 0, max: 8 * 3600 }) * 1000);
    const paymentId = randomUUID();
    const staff = faker.helpers.arrayElement(input.technicianIds);
    payments.push({ id: paymentId, tenantId: rinkId, customerId: buyer.id, productId: item.id, priceId: item.priceId, channel: 'counter', state: 'paid', amountMinor: item.spec.priceMinor, currency: input.currency, feeMinor: 0, createdBy: staff, paidAt: at, createdAt: at });
    const expiresAt = item.spec.monthsValid ? new Date(at.getTime() + item.spec.monthsValid * 30.44 * DAY) : null;
    const lot = openLot(l, rinkId, { accountId: await accountOf(buyer.id), origin: 'purchase', credits: item.spec.credits, priceMinor: item.spec.priceMinor, at, expiresAt, productId: item.id, paymentId, actor: staff, source: 'payment' });
    // Skaters use most of a card, one every week or two; some stop, so their lots expire as breakage.
    const horizon = Math.min(now.getTime(), expiresAt?.getTime() ?? now.getTime());
    let t = at.getTime();
    const uses = faker.number.int({ min: Math.floor(item.spec.credits * 0.4), max: item.spec.credits });
    for (let u = 0; u < uses; u++) {
      t += faker.number.int({ min: 5, max: 16 }) * DAY;
      if (t >= horizon) break;
      take(l, lot, 1, 'redeem', new Date(t), faker.helpers.arrayElement(input.technicianIds), 'ticket');
    }
    if (expiresAt && expiresAt <= now && lot.remaining! > 0) take(l, lot, lot.remaining!, 'expire', expiresAt, null, 'system', 'Expired unused');
  }
  // One refund a manager made: the unused share of a card, by the same rule the refund screen shows.
  const refundable = payments.find((p) => l.lots.some((x) => x.paymentId === p.id && x.remaining! > 1 && x.remaining! < x.credits));
  if (refundable && input.managerId) {
    const lot = l.lots.find((x) => x.paymentId === refundable.id)!;
    const back = take(l, lot, lot.remaining!, 'refund', new Date(now.getTime() - DAY), input.managerId, 'payment', 'Moved away');
    refundable.state = 'partially_refunded';
    refundable.refundedMinor = back;
  }

  let leagueId: string | null = null;
  const pack = made.find((m) => m.spec.kind === 'league_pack');
  if (pack && input.leagueManagerId) {
    leagueId = randomUUID();
    await tx.insert(league).values({ id: leagueId, tenantId: rinkId, name: 'Harbor Youth League', season: '2026–27', managerUserId: input.leagueManagerId });
    const poolId = randomUUID();
    await tx.insert(creditAccount).values({ id: poolId, tenantId: rinkId, kind: 'league_pool', leagueId });
    const bought = new Date(now.getTime() - 75 * DAY);
    const paymentId = randomUUID();
    payments.push({ id: paymentId, tenantId: rinkId, leagueId, productId: pack.id, priceId: pack.priceId, channel: 'counter', state: 'paid', amountMinor: pack.spec.priceMinor, currency: input.currency, feeMinor: 0, createdBy: input.leagueManagerId, paidAt: bought, createdAt: bought });
    const pool = openLot(l, rinkId, { accountId: poolId, origin: 'purchase', credits: pack.spec.credits, priceMinor: pack.spec.priceMinor, at: bought, expiresAt: new Date(bought.getTime() + (pack.spec.monthsValid ?? 10) * 30.44 * DAY), productId: pack.id, paymentId, actor: input.leagueManagerId, source: 'payment' });
    const players = faker.helpers.arrayElements(customers, 12);
    for (const [ti, name] of ['Gulls', 'Pilots', 'Tide'].entries()) {
      const teamId = randomUUID();
      await tx.insert(leagueTeam).values({ id: teamId, tenantId: rinkId, leagueId, name });
      const accountId = randomUUID();
      await tx.insert(creditAccount).values({ id: accountId, tenantId: rinkId, kind: 'team', leagueId, teamId });
      for (const p of players.slice(ti * 4, ti * 4 + 4)) await tx.insert(leaguePlayer).values({ id: randomUUID(), tenantId: rinkId, leagueId, teamId, customerId: p.id });
      const at = new Date(bought.getTime() + DAY);
      const value = take(l, pool, 24, 'transfer', at, input.leagueManagerId, 'league');
      const allocation = openLot(l, rinkId, { accountId, origin: 'transfer', credits: 24, priceMinor: value, at: new Date(at.getTime() + 1), expiresAt: pool.expiresAt ?? null, productId: pack.id, actor: input.leagueManagerId, source: 'league' });
      const used = faker.number.int({ min: 8, max: 18 });
      for (let u = 0; u < used; u++) take(l, allocation, 1, 'redeem', new Date(at.getTime() + (u + 1) * 4 * DAY), faker.helpers.arrayElement(input.technicianIds), 'ticket');
    }
  }
  if (payments.length) for (let i = 0; i < payments.length; i += 200) await tx.insert(payment).values(payments.slice(i, i + 200));
  for (let i = 0; i < l.lots.length; i += 200) await tx.insert(creditLot).values(l.lots.slice(i, i + 200));
  for (let i = 0; i < l.entries.length; i += 500) await tx.insert(creditEntry).values(l.entries.slice(i, i + 500));
  await tx.insert(rinkBilling).values({
    tenantId: rinkId,
    feeBps: 300,
    planState: input.planState,
    planStations: input.stations,
    planPeriodEnd: new Date(now.getTime() + 20 * DAY),
    planGraceUntil: input.planState === 'past_due' ? new Date(now.getTime() + 4 * DAY) : null,
    updatedAt: now,
  });
  return { leagueId };
}
