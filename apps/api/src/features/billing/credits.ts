import type { BalanceResponse, CreditSummary, EntryResponse, LedgerResponse } from '@rinkwright/core';
import { deferredRevenueMinor } from '@rinkwright/core';
import { scoped, type Scope } from '@rinkwright/db';
import { AppError } from '../../http/errors';
import type { RinkContext } from '../../http/route';
import * as ledger from '../../lib/ledger/ledger';
import { membershipRows } from './memberships';
import * as repo from './repository';
import { paymentRows } from './sales';

// A customer's credits at the counter: balance, redemption, a manager's adjustment, and the ledger behind them.

async function requireCustomer(ctx: RinkContext, customerId: string) {
  const found = await repo.findCustomer(scoped(ctx.tenantId), customerId);
  if (!found) throw AppError.notFound('No such customer at this rink');
  return found;
}

export async function balance(ctx: RinkContext, customerId: string): Promise<BalanceResponse> {
  await requireCustomer(ctx, customerId);
  const s = scoped(ctx.tenantId);
  const rink = await s.rink();
  const account = await ledger.findSkaterAccount(s, customerId);
  const b = await ledger.balanceOf(s, account ? [account.id] : []);
  return { credits: b.credits, valueMinor: b.valueMinor, currency: rink?.currency ?? 'USD', lots: b.lots };
}

export async function ledgerOf(ctx: RinkContext, customerId: string): Promise<LedgerResponse> {
  await requireCustomer(ctx, customerId);
  const s = scoped(ctx.tenantId);
  const account = await ledger.findSkaterAccount(s, customerId);
  const [entries, payments, memberships] = await Promise.all([ledger.historyOf(s, account ? [account.id] : []), paymentRows(s, { customerId }), membershipRows(s, customerId)]);
  return { entries, payments, memberships };
}

const entryOut = (op: ledger.Operation): EntryResponse => {
  const e = op.entries[0];
  if (!e) throw new Error('an operation without entries');
  return {
    entry: { ...e, actor: null, createdAt: e.createdAt.toISOString() },
    balance: op.balance,
  };
};

/**
 * One credit off the customer's account, in the route's transaction (it is atomic: a repeat of the key fails on the
 * entry's unique key and the route replays the first answer). The account's lock is the first read, so the lots
 * read after it are the ones every other redemption left.
 */
export async function redeemCredit(s: Scope, ctx: RinkContext, customerId: string, key: string, input: { ticketPairId: string | null; note: string | null }): Promise<EntryResponse> {
  const locked = await ledger.lockSkaterAccount(s, customerId);
  if (!locked) {
    await requireCustomer(ctx, customerId);
    throw new AppError('insufficient_credits', 'No credits left on this account');
  }
  const op = await ledger.redeem(s, {
    accountId: locked.account.id,
    key: `redeem:${key}`,
    actor: { userId: ctx.userId, source: input.ticketPairId ? 'ticket' : 'staff', sourceId: input.ticketPairId, reason: input.note },
    lockedLots: locked.lots,
    callerReplays: true,
  });
  return entryOut(op);
}

export async function adjustCredits(s: Scope, ctx: RinkContext, customerId: string, key: string, input: { credits: number; reason: string }): Promise<EntryResponse> {
  await requireCustomer(ctx, customerId);
  const account = await ledger.skaterAccount(s, customerId);
  const op = await ledger.adjust(s, { accountId: account.id, key: `adjust:${key}`, actor: { userId: ctx.userId, source: 'staff', sourceId: null, reason: input.reason }, credits: input.credits });
  return entryOut(op);
}

/** The rink's liability: every live lot's remaining credits at their value, and the last 30 days' movements. */
export async function creditSummary(ctx: RinkContext): Promise<CreditSummary> {
  const s = scoped(ctx.tenantId);
  const now = new Date();
  const rink = await s.rink();
  const lots = await repo.outstandingLots(s, now);
  const asLots = lots.map((l) => ({ id: l.id, credits: l.credits, remaining: l.remaining, priceMinor: l.priceMinor, expiresAt: l.expiresAt, createdAt: l.createdAt }));
  const byName = new Map<string, { credits: number; valueMinor: number }>();
  for (const l of lots) {
    const name = l.productName ?? 'Granted by staff';
    const row = byName.get(name) ?? { credits: 0, valueMinor: 0 };
    row.credits += l.remaining;
    row.valueMinor += deferredRevenueMinor([asLots.find((a) => a.id === l.id)!], now);
    byName.set(name, row);
  }
  const since = new Date(now.getTime() - 30 * 86_400_000);
  const totals = await repo.entryTotalsSince(s, since);
  const of = (kind: string) => totals.find((t) => t.kind === kind);
  const sold = await repo.paidSince(s, since);
  return {
    currency: rink?.currency ?? 'USD',
    outstandingCredits: lots.reduce((n, l) => n + l.remaining, 0),
    deferredRevenueMinor: deferredRevenueMinor(asLots, now),
    byProduct: [...byName.entries()].map(([productName, v]) => ({ productName, ...v })).sort((a, b) => b.valueMinor - a.valueMinor),
    last30Days: {
      soldMinor: sold.soldMinor,
      redeemedCredits: -(of('redeem')?.credits ?? 0),
      breakageCredits: -(of('expire')?.credits ?? 0),
      breakageMinor: -(of('expire')?.value ?? 0),
      refundedMinor: sold.refundedMinor,
    },
  };
}
