// The credit rules the ledger will follow (pure; the billing work stores them as append-only entries).
// A credit is the right to one standard sharpening. Credits sit in lots: one purchase or grant, with its
// price, its number of credits and its expiry. Money is integer minor units.

export interface Lot {
  id: string;
  /** Credits the lot started with. */
  credits: number;
  /** Credits not yet redeemed, expired or refunded. */
  remaining: number;
  /** What the whole lot was paid (0 for a grant). */
  priceMinor: number;
  /** null: never expires. */
  expiresAt: Date | null;
  createdAt: Date;
}

const isLive = (lot: Lot, now: Date) => lot.remaining > 0 && (lot.expiresAt === null || lot.expiresAt > now);

function assertLot(lot: Lot): void {
  const whole = (n: number) => Number.isInteger(n) && n >= 0;
  if (!whole(lot.credits) || lot.credits === 0 || !whole(lot.remaining) || lot.remaining > lot.credits || !whole(lot.priceMinor)) {
    throw new RangeError(`Lot ${lot.id} is not a valid lot`);
  }
}

/** Credits that can be redeemed now. */
export function creditBalance(lots: readonly Lot[], now: Date): number {
  return lots.filter((l) => isLive(l, now)).reduce((sum, l) => sum + l.remaining, 0);
}

/**
 * The lot a redemption takes its credit from: the live lot that expires first, so no credit expires while a
 * later one is used; lots that never expire come last; ties go to the older lot. null when the balance is 0.
 */
export function lotToRedeem(lots: readonly Lot[], now: Date): Lot | null {
  const live = lots.filter((l) => isLive(l, now));
  live.forEach(assertLot);
  live.sort(
    (a, b) =>
      (a.expiresAt?.getTime() ?? Infinity) - (b.expiresAt?.getTime() ?? Infinity) ||
      a.createdAt.getTime() - b.createdAt.getTime() ||
      a.id.localeCompare(b.id),
  );
  return live[0] ?? null;
}

/**
 * What `count` of a lot's credits are worth: the price spread over its credits, rounded to the minor unit so that
 * the values of all a lot's credits, taken in any steps, add up to exactly its price (cumulative rounding).
 */
export function lotValueMinor(lot: Pick<Lot, 'credits' | 'remaining' | 'priceMinor'>, count: number = lot.remaining): number {
  if (!Number.isInteger(count) || count < 0 || count > lot.remaining) throw new RangeError('Cannot value more credits than the lot has left');
  // Value of the first k credits used is round(price × k / credits); a step's value is the difference.
  const used = lot.credits - lot.remaining;
  const valueOfUsed = (k: number) => Math.round((lot.priceMinor * k) / lot.credits);
  return valueOfUsed(used + count) - valueOfUsed(used);
}

/** Unredeemed credits are a liability: the sum of what each live lot's remaining credits are worth. */
export function deferredRevenueMinor(lots: readonly Lot[], now: Date): number {
  return lots.filter((l) => isLive(l, now)).reduce((sum, l) => sum + lotValueMinor(l), 0);
}

export interface Breakage {
  lotId: string;
  credits: number;
  valueMinor: number;
}

/** The breakage entries the nightly sweep writes: every lot past its expiry with credits left. */
export function expiredLots(lots: readonly Lot[], now: Date): Breakage[] {
  return lots
    .filter((l) => l.remaining > 0 && l.expiresAt !== null && l.expiresAt <= now)
    .map((l) => ({ lotId: l.id, credits: l.remaining, valueMinor: lotValueMinor(l) }));
}

/** A punch card refund returns the unredeemed share of its price, and removes those credits. */
export function punchCardRefund(lot: Lot, now: Date): { credits: number; refundMinor: number } {
  assertLot(lot);
  if (!isLive(lot, now)) return { credits: 0, refundMinor: 0 };
  return { credits: lot.remaining, refundMinor: lotValueMinor(lot) };
}

/**
 * A failed payment leaves something usable until its grace ends: a membership's credits, a rink's plan. Past the
 * grace, and still unpaid, the credits stop redeeming and the rink turns read-only.
 */
export function graceLapsed(state: string | null, graceUntil: Date | null, now: Date): boolean {
  return state === 'past_due' && graceUntil !== null && graceUntil <= now;
}

/** At a membership renewal, unused credits carry over up to the cap; the rest expire. */
export function membershipRollover(input: { remaining: number; cap: number }): { carried: number; expired: number } {
  const { remaining, cap } = input;
  if (!Number.isInteger(remaining) || remaining < 0 || !Number.isInteger(cap) || cap < 0) throw new RangeError('Credits and caps are whole numbers');
  const carried = Math.min(remaining, cap);
  return { carried, expired: remaining - carried };
}
