import { and, desc, eq, inArray } from 'drizzle-orm';
import type { PortalRink, PortalRinkDetail, PreferencesInput } from '@rinkwright/core';
import { customer, directory, levelReading, scoped, sharpening, skateProfile, station, ticket, ticketPair, type Scope } from '@rinkwright/db';
import { AppError } from '../../http/errors';
import type { UserContext } from '../../http/route';
import { readDeskSettings } from '../../lib/desk-settings';
import * as ledger from '../../lib/ledger/ledger';
import { catalogOf } from './catalog';
import { cancelMembership, membershipRows } from './memberships';
import { paymentRows, startCheckout, type SalesDeps } from './sales';

// The skater's own pages: every rink where their verified e-mail has a customer record, with its credits,
// history and readings. A skater reaches only their own records; anything else is "not found".

async function linksOf(user: UserContext) {
  // A record the rink made before the skater signed up joins their account once the e-mail is verified.
  await directory.linkCustomersByVerifiedEmail(user.userId);
  return directory.listCustomerLinksOfUser(user.userId);
}

async function summaryOf(s: Scope, customerId: string): Promise<PortalRink | null> {
  const rink = await s.rink();
  const found = await s.findOne(customer, eq(customer.id, customerId));
  if (!rink || !found) return null;
  const account = await ledger.findSkaterAccount(s, customerId);
  const balance = await ledger.balanceOf(s, account ? [account.id] : []);
  const next = balance.lots.filter((l) => l.redeemable && l.expiresAt).map((l) => l.expiresAt!).sort()[0] ?? null;
  return {
    rink: { slug: rink.slug, name: rink.name, currency: rink.currency, timeZone: rink.timeZone, unitPreference: rink.unitPreference },
    customer: { id: found.id, name: found.name, memberCode: found.memberCode },
    credits: balance.credits,
    nextExpiry: next,
    memberships: await membershipRows(s, customerId),
  };
}

export async function portalHome(user: UserContext) {
  const links = await linksOf(user);
  const rinks: PortalRink[] = [];
  for (const link of links) {
    const row = await summaryOf(scoped(link.rinkId), link.customerId);
    if (row) rinks.push(row);
  }
  return { rinks };
}

async function requireLink(user: UserContext, slug: string) {
  const link = (await linksOf(user)).find((l) => l.slug === slug);
  if (!link) throw AppError.notFound('You have no record at this rink yet');
  return { s: scoped(link.rinkId), customerId: link.customerId };
}

export async function portalRink(user: UserContext, slug: string): Promise<PortalRinkDetail> {
  const { s, customerId } = await requireLink(user, slug);
  const summary = await summaryOf(s, customerId);
  if (!summary) throw AppError.notFound('You have no record at this rink yet');
  const found = (await s.findOne(customer, eq(customer.id, customerId)))!;
  const account = await ledger.findSkaterAccount(s, customerId);
  const ids = account ? [account.id] : [];
  const [balance, entries, payments, profiles, settings, catalog] = await Promise.all([
    ledger.balanceOf(s, ids),
    ledger.historyOf(s, ids, 100),
    paymentRows(s, { customerId }),
    s.find(skateProfile, { where: eq(skateProfile.customerId, customerId) }),
    readDeskSettings(s.tenantId),
    catalogOf(s),
  ]);
  return {
    ...summary,
    balance: { credits: balance.credits, valueMinor: balance.valueMinor, currency: summary.rink.currency, lots: balance.lots },
    entries: entries.map(({ actor: _actor, ...e }) => e),
    payments,
    sharpenings: await sharpeningsOf(s, customerId),
    profiles: profiles.map((p) => ({ id: p.id, label: p.label, bladeWidthNm: p.bladeWidthNm, preferredHollowNm: p.preferredHollowNm, notes: p.notes })),
    preferences: { notifyReady: found.notifyReady === 1, notifyReminders: found.notifyReminders === 1 },
    products: catalog
      .filter((p) => p.active && p.listed && p.kind !== 'league_pack')
      .map(({ id, kind, name, description, credits, monthsValid, interval, price }) => ({ id, kind, name, description, credits, monthsValid, interval, price })),
    bands: { trueNm: settings.trueNm, fairNm: settings.fairNm },
  };
}

async function sharpeningsOf(s: Scope, customerId: string) {
  const rows = await s.findJoined(sharpening, {
    fields: {
      id: sharpening.id,
      ticketNumber: ticket.number,
      pairLabel: ticketPair.label,
      stationName: station.name,
      hollowNm: sharpening.hollowNm,
      passes: sharpening.passes,
      bladeWidthNm: sharpening.bladeWidthNm,
      doneAt: sharpening.doneAt,
    },
    joins: [
      { table: ticket, on: eq(ticket.id, sharpening.ticketId) },
      { table: ticketPair, on: eq(ticketPair.id, sharpening.ticketPairId) },
      { table: station, on: eq(station.id, sharpening.stationId) },
    ],
    where: eq(ticket.customerId, customerId),
    orderBy: desc(sharpening.doneAt),
    limit: 50,
  });
  const readings = rows.length ? await s.find(levelReading, { where: and(inArray(levelReading.sharpeningId, rows.map((r) => r.id)), eq(levelReading.kind, 'sharpening')) }) : [];
  return rows.map((r) => ({
    ...r,
    doneAt: r.doneAt.toISOString(),
    readings: readings
      .filter((x) => x.sharpeningId === r.id)
      .map((x) => ({ id: x.id, blade: x.blade, attempt: x.attempt, readingNm: x.readingNm, tiltMillideg: x.tiltMillideg, takenAt: x.takenAt.toISOString() })),
  }));
}

export async function savePreferences(user: UserContext, slug: string, input: PreferencesInput) {
  const { s, customerId } = await requireLink(user, slug);
  await s.update(customer, { notifyReady: input.notifyReady ? 1 : 0, notifyReminders: input.notifyReminders ? 1 : 0 }, eq(customer.id, customerId));
  return input;
}

export async function portalCheckout(user: UserContext, deps: SalesDeps, slug: string, productId: string) {
  const { s, customerId } = await requireLink(user, slug);
  const found = (await s.findOne(customer, eq(customer.id, customerId)))!;
  return startCheckout(s, deps, { productId, customer: found, successPath: `/portal/${slug}`, cancelPath: `/portal/${slug}`, createdBy: user.userId });
}

export async function portalCancelMembership(user: UserContext, deps: SalesDeps, slug: string, membershipId: string, when: 'now' | 'period_end') {
  const { s, customerId } = await requireLink(user, slug);
  await cancelMembership(s, deps, membershipId, when, customerId);
  return portalRink(user, slug);
}
