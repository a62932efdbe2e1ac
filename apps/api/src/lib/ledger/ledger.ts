import { randomUUID } from 'node:crypto';
import { creditBalance, deferredRevenueMinor, graceLapsed, lotToRedeem, lotValueMinor, membershipRollover, type EntryRow, type Lot, type LotRow } from '@rinkwright/core';
import type { Scope } from '@rinkwright/db';
import { AppError } from '../../http/errors';
import { groupBy } from '../sorted';
import * as repo from './repository';

// The credit ledger's operations. Each runs inside the caller's transaction (or opens one), locks the account
// row first, and writes only append-only entries plus the lots' running `remaining`. An operation carries an
// idempotency key on its first entry, unique per rink: a repeat finds that entry and returns it unchanged.

export type { AccountRow } from './repository';
type Source = repo.EntryRecord['source'];

export interface Actor {
  userId: string | null;
  source: Source;
  sourceId: string | null;
  reason?: string | null;
}

export interface Operation {
  entries: repo.EntryRecord[];
  /** The account's balance after the operation (or when it first ran). */
  balance: number;
  replayed: boolean;
}

const asLot = (l: repo.LotRecord): Lot => ({ id: l.id, credits: l.credits, remaining: l.remaining, priceMinor: l.priceMinor, expiresAt: l.expiresAt, createdAt: l.createdAt });

/** A membership's credits stop being redeemable when its grace after a failed payment has run out. */
function membershipBlocked(lot: repo.LotWithContext, now: Date): boolean {
  return lot.membershipState === 'blocked' || graceLapsed(lot.membershipState, lot.membershipGraceUntil, now);
}

/**
 * After a failed renewal the last paid period's credits stay usable until the grace ends, though their period is
 * over (product.md, "Selling and billing": a grace period, then redemption blocked).
 */
function usableUntil(lot: repo.LotWithContext, now: Date): Date | null {
  const grace = lot.membershipState === 'past_due' ? lot.membershipGraceUntil : null;
  return grace && grace > now && lot.expiresAt !== null && lot.expiresAt < grace ? grace : lot.expiresAt;
}

const asUsableLot = (l: repo.LotWithContext, now: Date): Lot => ({ ...asLot(l), expiresAt: usableUntil(l, now) });

const redeemable = (lot: repo.LotWithContext, now: Date) => {
  const until = usableUntil(lot, now);
  return lot.remaining > 0 && (until === null || until > now) && !membershipBlocked(lot, now);
};

// ---- accounts -----------------------------------------------------------------------------------------------

export const skaterAccount = (s: Scope, customerId: string) =>
  repo.ensureAccount(s, { id: randomUUID(), kind: 'skater', customerId }, () => repo.findAccountOfCustomer(s, customerId));
export const teamAccount = (s: Scope, leagueId: string, teamId: string) =>
  repo.ensureAccount(s, { id: randomUUID(), kind: 'team', leagueId, teamId }, () => repo.findAccountOfTeam(s, teamId));
export const poolAccount = (s: Scope, leagueId: string) =>
  repo.ensureAccount(s, { id: randomUUID(), kind: 'league_pool', leagueId }, () => repo.findPoolOfLeague(s, leagueId));
export const findSkaterAccount = (s: Scope, customerId: string) => repo.findAccountOfCustomer(s, customerId);
/**
 * Inside a transaction: the customer's account, locked as an operation locks it, with its lots read under that lock
 * (one statement; pass them on as `lockedLots`); undefined when there is none yet.
 */
export const lockSkaterAccount = (s: Scope, customerId: string) => repo.lockAccountOfCustomerWithLots(s, customerId);
export const findTeamAccount = (s: Scope, teamId: string) => repo.findAccountOfTeam(s, teamId);
export const findPoolAccount = (s: Scope, leagueId: string) => repo.findPoolOfLeague(s, leagueId);

// ---- reading ------------------------------------------------------------------------------------------------

/** The credits of these lots usable now: what a balance counts and a redemption may take. */
const usableCredits = (lots: repo.LotWithContext[], now: Date) => creditBalance(lots.filter((l) => redeemable(l, now)).map((l) => asUsableLot(l, now)), now);

export interface Balance {
  credits: number;
  valueMinor: number;
  lots: LotRow[];
}

export async function balanceOf(s: Scope, accountIds: string[], now = new Date()): Promise<Balance> {
  const lots = await repo.lotsOf(s, accountIds);
  return {
    credits: usableCredits(lots, now),
    valueMinor: deferredRevenueMinor(lots.filter((l) => l.remaining > 0).map((l) => asUsableLot(l, now)), now),
    lots: lots
      .filter((l) => l.remaining > 0 || (l.expiresAt !== null && l.expiresAt > new Date(now.getTime() - 90 * 86_400_000)))
      .map((l) => ({
        id: l.id,
        origin: l.origin,
        credits: l.credits,
        remaining: l.remaining,
        priceMinor: l.priceMinor,
        remainingValueMinor: lotValueMinor(asLot(l)),
        expiresAt: l.expiresAt?.toISOString() ?? null,
        productName: l.productName,
        redeemable: redeemable(l, now),
        createdAt: l.createdAt.toISOString(),
      })),
  };
}

/** The credits usable now on each of the accounts (an account without any is left out). */
export async function creditsByAccount(s: Scope, accountIds: string[], now = new Date()): Promise<Map<string, number>> {
  const byAccount = groupBy(await repo.lotsOf(s, accountIds), (l) => l.accountId);
  return new Map([...byAccount].map(([accountId, lots]) => [accountId, usableCredits(lots, now)]));
}

/** The credits usable now by each of the customers, from their own accounts. */
export async function creditsOfCustomers(s: Scope, customerIds: string[], now = new Date()): Promise<Map<string, number>> {
  const accounts = await repo.accountsOfCustomers(s, customerIds);
  const credits = await creditsByAccount(s, accounts.map((a) => a.id), now);
  return new Map(accounts.map((a) => [a.customerId!, credits.get(a.id) ?? 0]));
}

export interface TeamUsage {
  allocated: number;
  used: number;
  /** Used within the range asked for (all of it without one). */
  usedInRange: number;
  /** Usable now. */
  remaining: number;
}

/**
 * Each team of the leagues, by team id: credits allocated to it, used, and left to use. The league's own page and
 * the league usage report both read this, so they cannot disagree.
 */
export async function teamUsage(s: Scope, leagueIds: string[], range?: { start: Date; end: Date }, now = new Date()): Promise<Map<string, TeamUsage>> {
  const moved = await repo.teamMovements(s, leagueIds, range);
  const remaining = await creditsByAccount(s, moved.map((m) => m.accountId), now);
  return new Map(moved.map((m) => [m.teamId!, { allocated: m.allocated, used: m.used, usedInRange: m.usedInRange, remaining: remaining.get(m.accountId) ?? 0 }]));
}

export async function historyOf(s: Scope, accountIds: string[], limit = 200): Promise<EntryRow[]> {
  const rows = await repo.entriesOf(s, accountIds, limit);
  return rows.map((r) => ({ ...r, createdAt: r.createdAt.toISOString() }));
}

async function usableBalance(s: Scope, accountId: string, now: Date): Promise<number> {
  return usableCredits(await repo.lotsOf(s, [accountId], { liveOnly: true }), now);
}

// ---- the one way entries are written ------------------------------------------------------------------------

interface Step {
  lot: repo.LotRecord;
  kind: repo.EntryRecord['kind'];
  /** Signed change of the lot's remaining credits. */
  credits: number;
  reversesId?: string;
}

/** The usable balance after an operation: the lots read under the lock, moved by its steps, and any lot it opened. */
function balanceAfter(lots: repo.LotWithContext[], remainingBefore: Map<string, number>, steps: Step[], accountId: string, now: Date): number {
  const moved = new Map<string, number>();
  for (const step of steps) if (step.lot.accountId === accountId) moved.set(step.lot.id, (moved.get(step.lot.id) ?? 0) + step.credits);
  const opened = steps.filter((step) => step.lot.accountId === accountId && !remainingBefore.has(step.lot.id)).map((step) => step.lot);
  const after = [
    ...lots.map((l) => ({ ...l, remaining: (remainingBefore.get(l.id) ?? 0) + (moved.get(l.id) ?? 0) })),
    ...[...new Map(opened.map((l) => [l.id, l])).values()].map((l) => ({ ...l, remaining: moved.get(l.id) ?? 0, productName: null, membershipState: null, membershipGraceUntil: null })),
  ];
  return usableCredits(after, now);
}

interface OperateOptions {
  /** The caller's transaction holds the account's lock already, and read these, all the account's lots, under it. */
  lockedLots?: repo.LotWithContext[];
  /**
   * The caller replays an earlier use of the key itself (an atomic route), so the operation does not look for one:
   * a repeat fails on the entries' unique key, rolls back, and the caller answers with the first one's answer.
   */
  callerReplays?: boolean;
}

/**
 * Locks the account (unless the caller holds its lock already), replays the key if it was used, otherwise lets
 * `plan` decide the steps (it sees the lots under the lock) and writes them: one entry per step and the lot's new
 * running total. Runs in `s`'s transaction or in a new one.
 */
async function operate(
  s: Scope,
  accountId: string,
  key: string,
  actor: Actor,
  plan: (ctx: { lots: repo.LotWithContext[]; now: Date; tx: Scope }) => Promise<Step[]> | Step[],
  options: OperateOptions = {},
): Promise<Operation> {
  return s.transaction(async (tx) => {
    if (!options.lockedLots) {
      const account = await repo.lockAccount(tx, accountId);
      if (!account) throw AppError.notFound('No such credit account');
    }
    const now = new Date();
    const earlier = options.callerReplays ? undefined : await repo.findEntryByKey(tx, key);
    if (earlier) {
      return { entries: await repo.entriesOfOperation(tx, earlier.operationId), balance: await usableBalance(tx, accountId, now), replayed: true };
    }
    const lots = options.lockedLots ?? (await repo.lotsOf(tx, [accountId]));
    const remainingBefore = new Map(lots.map((l) => [l.id, l.remaining]));
    const steps = await plan({ lots, now, tx });
    const operationId = randomUUID();
    const entries: repo.EntryRecord[] = [];
    const moves = steps.map((step) => repo.moveRemaining(step.lot.id, step.credits));
    for (const [i, step] of steps.entries()) {
      const used = step.lot.credits - step.lot.remaining;
      // Values follow the lot's cumulative rounding by position, so a lot's entries always add up to the value
      // of what it has used, and its remaining credits to exactly what is left of its price.
      const value =
        step.credits < 0
          ? -lotValueMinor(asLot(step.lot), -step.credits)
          : Math.round((step.lot.priceMinor * used) / step.lot.credits) - Math.round((step.lot.priceMinor * (used - step.credits)) / step.lot.credits);
      step.lot.remaining += step.credits;
      entries.push({
        id: i === 0 ? operationId : randomUUID(),
        tenantId: tx.tenantId,
        accountId: step.lot.accountId,
        lotId: step.lot.id,
        kind: step.kind,
        credits: step.credits,
        valueMinor: value,
        source: actor.source,
        sourceId: actor.sourceId,
        reason: actor.reason ?? null,
        reversesId: step.reversesId ?? null,
        operationId,
        idemKey: i === 0 ? key : null,
        actorUserId: actor.userId,
        createdAt: new Date(now.getTime() + i),
      });
    }
    // The lots' moves and the entries in one round trip; a move that would take a lot below zero changes no row,
    // and the whole transaction is refused with it.
    const moved = await tx.together([...moves, ...repo.insertEntries(entries)]);
    if (moved.slice(0, moves.length).some((rows) => rows !== 1)) throw new AppError('insufficient_credits', 'Not enough credits on that lot');
    return { entries, balance: balanceAfter(lots, remainingBefore, steps, accountId, now), replayed: false };
  });
}

/** Writes a new lot and its opening entry (purchase, grant, membership period, positive adjustment), once per key. */
export async function addLot(
  s: Scope,
  input: { accountId: string; key: string; actor: Actor; kind: 'purchase' | 'grant' | 'adjust' | 'transfer'; lot: Omit<repo.NewLot, 'id' | 'accountId' | 'remaining'> },
): Promise<Operation> {
  return operate(s, input.accountId, input.key, input.actor, async ({ tx }) => {
    const lot: repo.LotRecord = {
      id: randomUUID(),
      tenantId: tx.tenantId,
      accountId: input.accountId,
      remaining: 0,
      expiresAt: null,
      productId: null,
      paymentId: null,
      membershipId: null,
      fromLotId: null,
      createdAt: new Date(),
      ...input.lot,
    };
    await repo.insertLot(tx, lot);
    // The lot starts at 0 and the opening entry brings it to its credits, so `remaining` is always Σ entries.
    // The opening entry is valued by the same rule as credits coming back: all N arriving are worth the price.
    return [{ lot, kind: input.kind, credits: lot.credits }];
  });
}

/**
 * Takes one credit from the redeemable lot that expires first. 409 insufficient_credits when there is none.
 */
export function redeem(s: Scope, input: { accountId: string; key: string; actor: Actor } & OperateOptions): Promise<Operation> {
  return operate(s, input.accountId, input.key, input.actor, ({ lots, now }) => {
    const usable = lots.filter((l) => redeemable(l, now));
    const chosen = lotToRedeem(usable.map((l) => asUsableLot(l, now)), now);
    const lot = chosen && usable.find((l) => l.id === chosen.id);
    if (!lot) {
      const held = lots.some((l) => l.remaining > 0 && membershipBlocked(l, now));
      throw new AppError('insufficient_credits', held ? 'The membership’s payment failed and its grace has run out: its credits are kept, and usable again once it is paid' : 'No credits left on this account');
    }
    return [{ lot, kind: 'redeem', credits: -1 }];
  }, { lockedLots: input.lockedLots, callerReplays: input.callerReplays });
}

/** Takes `credits` from the usable lots, first to expire first (a negative adjustment, or a transfer out). */
function takeSteps(lots: repo.LotWithContext[], now: Date, credits: number, kind: Step['kind']): Step[] {
  const usable = lots.filter((l) => redeemable(l, now)).map((l) => ({ ...l }));
  const steps: Step[] = [];
  let left = credits;
  while (left > 0) {
    const chosen = lotToRedeem(usable.map((l) => asUsableLot(l, now)), now);
    const lot = chosen && usable.find((l) => l.id === chosen.id);
    if (!lot) throw new AppError('insufficient_credits', `Only ${credits - left} credit${credits - left === 1 ? '' : 's'} available`);
    const n = Math.min(left, lot.remaining);
    steps.push({ lot: { ...lot }, kind, credits: -n });
    lot.remaining -= n;
    left -= n;
  }
  return steps;
}

/** A manager's correction: positive adds a lot of no value and no expiry; negative removes usable credits. */
export function adjust(s: Scope, input: { accountId: string; key: string; actor: Actor; credits: number }): Promise<Operation> {
  if (input.credits > 0) {
    return addLot(s, { accountId: input.accountId, key: input.key, actor: input.actor, kind: 'adjust', lot: { origin: 'adjust', credits: input.credits, priceMinor: 0 } });
  }
  return operate(s, input.accountId, input.key, input.actor, ({ lots, now }) => takeSteps(lots, now, -input.credits, 'adjust'));
}

/** Removes what is left of the given lots (a refund takes back the unredeemed credits it pays for). */
export function removeLots(s: Scope, input: { accountId: string; key: string; actor: Actor; lotIds: string[]; kind: 'refund' | 'expire' }): Promise<Operation> {
  return operate(s, input.accountId, input.key, input.actor, ({ lots }) =>
    lots.filter((l) => input.lotIds.includes(l.id) && l.remaining > 0).map((lot) => ({ lot, kind: input.kind, credits: -lot.remaining })),
  );
}

/** Undoes an operation: one reversal entry per entry not already reversed, on the same lot. */
export function reverse(s: Scope, input: { accountId: string; key: string; actor: Actor; operationId: string }): Promise<Operation> {
  return operate(s, input.accountId, input.key, input.actor, async ({ lots, tx }) => {
    const original = (await repo.entriesOfOperation(tx, input.operationId)).filter((e) => e.accountId === input.accountId);
    const done = new Set((await repo.entriesReversing(tx, original.map((e) => e.id))).map((e) => e.reversesId));
    return original
      .filter((e) => !done.has(e.id))
      .map((e) => {
        const lot = lots.find((l) => l.id === e.lotId);
        if (!lot) throw new Error('an entry points at a lot of another account');
        return { lot, kind: 'reversal' as const, credits: -e.credits, reversesId: e.id };
      });
  });
}

/**
 * Moves credits from one account to another (a league pool to a team or a player). The source's lots are debited
 * first to expire first, and each arrives as a new lot with the same expiry and the value it carried.
 */
export async function transfer(s: Scope, input: { fromAccountId: string; toAccountId: string; key: string; actor: Actor; credits: number }): Promise<{ out: Operation; in: Operation[] }> {
  return s.transaction(async (tx) => {
    // Lock both accounts in id order, so two opposite transfers cannot deadlock.
    for (const id of [input.fromAccountId, input.toAccountId].sort()) await repo.lockAccount(tx, id);
    const out = await operate(tx, input.fromAccountId, input.key, input.actor, ({ lots, now }) => takeSteps(lots, now, input.credits, 'transfer'));
    const arrivals: Operation[] = [];
    for (const [i, e] of out.entries.entries()) {
      const from = await repo.lotById(tx, e.lotId);
      if (!from) throw new Error('transfer source lot vanished');
      arrivals.push(
        await addLot(tx, {
          accountId: input.toAccountId,
          key: `${input.key}:in:${i}`,
          actor: input.actor,
          kind: 'transfer',
          lot: { origin: 'transfer', credits: -e.credits, priceMinor: -e.valueMinor, expiresAt: from.expiresAt, productId: from.productId, fromLotId: from.id },
        }),
      );
    }
    return { out, in: arrivals };
  });
}

/**
 * A membership's paid period: its new lot, with the unused credits of earlier periods carried over up to the cap
 * (as transfers into the new period) and the rest expired as breakage. Once per key (the invoice).
 */
export async function grantMembershipPeriod(
  s: Scope,
  input: { accountId: string; key: string; actor: Actor; cap: number; lot: Omit<repo.NewLot, 'id' | 'accountId' | 'remaining' | 'origin'> & { membershipId: string } },
): Promise<Operation> {
  return s.transaction(async (tx) => {
    const opened = await addLot(tx, { accountId: input.accountId, key: input.key, actor: input.actor, kind: 'purchase', lot: { ...input.lot, origin: 'membership' } });
    if (opened.replayed) return opened;
    const earlier = (await repo.lotsOfMembership(tx, input.lot.membershipId)).filter((l) => l.id !== opened.entries[0]?.lotId);
    const left = earlier.reduce((n, l) => n + l.remaining, 0);
    const { carried, expired } = membershipRollover({ remaining: left, cap: input.cap });
    if (expired > 0) {
      const oldestFirst = [...earlier].sort((a, b) => a.createdAt.getTime() - b.createdAt.getTime());
      await operate(tx, input.accountId, `${input.key}:rollover-expire`, input.actor, () => {
        let n = expired;
        const steps: Step[] = [];
        for (const lot of oldestFirst) {
          const take = Math.min(n, lot.remaining);
          if (take > 0) steps.push({ lot: { ...lot }, kind: 'expire', credits: -take });
          lot.remaining -= take;
          n -= take;
        }
        return steps;
      });
    }
    if (carried > 0) {
      await operate(tx, input.accountId, `${input.key}:rollover-carry`, input.actor, async () => {
        const steps: Step[] = [];
        for (const lot of earlier.filter((l) => l.remaining > 0)) {
          const fresh = await repo.lotById(tx, lot.id);
          if (fresh && fresh.remaining > 0) steps.push({ lot: fresh, kind: 'transfer', credits: -fresh.remaining });
        }
        return steps;
      }).then(async (out) => {
        const value = -out.entries.reduce((n, e) => n + e.valueMinor, 0);
        await addLot(tx, {
          accountId: input.accountId,
          key: `${input.key}:rollover-in`,
          actor: input.actor,
          kind: 'transfer',
          lot: { origin: 'transfer', credits: carried, priceMinor: value, expiresAt: input.lot.expiresAt ?? null, membershipId: input.lot.membershipId, productId: input.lot.productId ?? null },
        });
      });
    }
    return { ...opened, balance: await usableBalance(tx, input.accountId, new Date()) };
  });
}

export const lotsOfPayment = (s: Scope, paymentId: string) => repo.lotsOfPayment(s, paymentId);

/** The redemptions of these ticket pairs (a void ticket reverses them). */
export async function redemptionsOfPairs(s: Scope, pairIds: string[]) {
  return (await repo.entriesOfSource(s, 'ticket', pairIds)).filter((e) => e.kind === 'redeem');
}
