import { z } from 'zod';
import { email, id } from './common';
import { isoTime, readingRow } from './desk';

// Requests and responses of selling, the credit ledger, leagues, the skater portal and the rink's own plan.
// Money is integer minor units of the rink's currency; credits are whole numbers.

const minor = z.number().int();
const wholeCredits = (max: number) => z.number().int('Whole credits only').min(1, 'At least 1 credit').max(max, `At most ${max} credits`);

// ---- catalog ---------------------------------------------------------------------------------------------
export const PRODUCT_KINDS = ['punch_card', 'membership', 'league_pack', 'single'] as const;
export const productKind = z.enum(PRODUCT_KINDS);
export type ProductKind = z.infer<typeof productKind>;
export const PRODUCT_KIND_LABELS: Record<ProductKind, string> = {
  punch_card: 'Punch card',
  membership: 'Membership',
  league_pack: 'League pack',
  single: 'Single sharpening',
};

export const productInput = z
  .object({
    kind: productKind,
    name: z.string().trim().min(1, 'Give the product a name').max(120),
    description: z.string().trim().max(1000).nullable().default(null),
    credits: wholeCredits(500),
    priceMinor: minor.min(50, 'At least 0.50').max(10_000_000, 'That price is too high'),
    monthsValid: z.number().int().min(1, 'At least 1 month').max(60, 'At most 60 months').nullable().default(null),
    rolloverCap: z.number().int().min(0, 'Zero or more').max(500).nullable().default(null),
    graceDays: z.number().int().min(0, 'Zero or more').max(60, 'At most 60 days').nullable().default(null),
    interval: z.enum(['month', 'year']).nullable().default(null),
    listed: z.boolean().default(true),
  })
  .superRefine((p, ctx) => {
    if (p.kind === 'membership') {
      if (p.interval === null) ctx.addIssue({ code: 'custom', path: ['interval'], message: 'Choose how often a membership renews' });
      if (p.rolloverCap === null) ctx.addIssue({ code: 'custom', path: ['rolloverCap'], message: 'Say how many credits may carry over' });
      if (p.graceDays === null) ctx.addIssue({ code: 'custom', path: ['graceDays'], message: 'Say how many days of grace follow a failed payment' });
      if (p.monthsValid !== null) ctx.addIssue({ code: 'custom', path: ['monthsValid'], message: 'Membership credits follow the period and the rollover cap' });
    } else {
      for (const key of ['interval', 'rolloverCap', 'graceDays'] as const) {
        if (p[key] !== null) ctx.addIssue({ code: 'custom', path: [key], message: 'Only memberships have this' });
      }
    }
  });
export type ProductInput = z.infer<typeof productInput>;
export const productParams = z.object({ rinkSlug: z.string(), productId: id });

export const priceRow = z.object({ id: z.string(), amountMinor: minor, currency: z.string(), createdAt: isoTime, retiredAt: isoTime.nullable() });
export const productRow = z.object({
  id: z.string(),
  kind: productKind,
  name: z.string(),
  description: z.string().nullable(),
  credits: z.number().int(),
  monthsValid: z.number().int().nullable(),
  rolloverCap: z.number().int().nullable(),
  graceDays: z.number().int().nullable(),
  interval: z.enum(['month', 'year']).nullable(),
  listed: z.boolean(),
  active: z.boolean(),
  price: priceRow,
  priceHistory: z.array(priceRow),
  /** Product and current price exist on the rink's payout account. */
  synced: z.boolean(),
});
export type ProductRow = z.infer<typeof productRow>;
export const productList = z.object({ products: z.array(productRow) });
export const productUpdate = z.object({ input: productInput.optional(), active: z.boolean().optional() });

// ---- ledger ----------------------------------------------------------------------------------------------
export const entryKind = z.enum(['purchase', 'grant', 'redeem', 'expire', 'refund', 'transfer', 'adjust', 'reversal']);
export const entrySource = z.enum(['payment', 'ticket', 'roster', 'membership', 'staff', 'league', 'system']);
export const entryRow = z.object({
  id: z.string(),
  kind: entryKind,
  credits: z.number().int(),
  valueMinor: minor,
  source: entrySource,
  sourceId: z.string().nullable(),
  reason: z.string().nullable(),
  reversesId: z.string().nullable(),
  lotId: z.string(),
  operationId: z.string(),
  actor: z.string().nullable(),
  createdAt: isoTime,
});
export type EntryRow = z.infer<typeof entryRow>;

export const lotRow = z.object({
  id: z.string(),
  origin: z.enum(['purchase', 'membership', 'grant', 'adjust', 'transfer']),
  credits: z.number().int(),
  remaining: z.number().int(),
  priceMinor: minor,
  /** What the remaining credits are worth (cumulative rounding of the lot's price). */
  remainingValueMinor: minor,
  expiresAt: isoTime.nullable(),
  productName: z.string().nullable(),
  /** False when the lot has expired, or its membership's grace after a failed payment has run out. */
  redeemable: z.boolean(),
  createdAt: isoTime,
});
export type LotRow = z.infer<typeof lotRow>;

export const balanceResponse = z.object({
  credits: z.number().int(),
  valueMinor: minor,
  currency: z.string(),
  lots: z.array(lotRow),
});
export type BalanceResponse = z.infer<typeof balanceResponse>;

export const creditAdjustmentInput = z.object({
  credits: z.number().int('Whole credits only').min(-500, 'At most 500 at once').max(500, 'At most 500 at once').refine((n) => n !== 0, 'Add or remove at least 1 credit'),
  reason: z.string().trim().min(3, 'Say why').max(500),
});
export type CreditAdjustmentInput = z.infer<typeof creditAdjustmentInput>;
export const redemptionInput = z.object({ ticketPairId: id.nullable().default(null), note: z.string().trim().max(200).nullable().default(null) });
export const entryResponse = z.object({ entry: entryRow, balance: z.number().int() });
export type EntryResponse = z.infer<typeof entryResponse>;

export const membershipState = z.enum(['incomplete', 'active', 'past_due', 'blocked', 'canceled']);
export const membershipRow = z.object({
  id: z.string(),
  productName: z.string(),
  state: membershipState,
  periodEnd: isoTime.nullable(),
  cancelAtPeriodEnd: z.boolean(),
  graceUntil: isoTime.nullable(),
  creditsPerPeriod: z.number().int(),
  priceMinor: minor,
  interval: z.enum(['month', 'year']).nullable(),
});
export type MembershipRow = z.infer<typeof membershipRow>;
export const membershipParams = z.object({ rinkSlug: z.string(), membershipId: id });
export const cancelMembershipInput = z.object({ when: z.enum(['now', 'period_end']) });

export const paymentState = z.enum(['pending', 'paid', 'failed', 'refunded', 'partially_refunded']);
export const paymentRow = z.object({
  id: z.string(),
  productName: z.string(),
  productKind: productKind,
  channel: z.enum(['online', 'counter']),
  state: paymentState,
  amountMinor: minor,
  feeMinor: minor,
  refundedMinor: minor,
  currency: z.string(),
  paidAt: isoTime.nullable(),
  createdAt: isoTime,
  refunds: z.array(z.object({ id: z.string(), amountMinor: minor, credits: z.number().int(), reason: z.string().nullable(), createdAt: isoTime })),
});
export type PaymentRow = z.infer<typeof paymentRow>;
export const paymentParams = z.object({ rinkSlug: z.string(), paymentId: id });

export const ledgerResponse = z.object({
  entries: z.array(entryRow),
  payments: z.array(paymentRow),
  memberships: z.array(membershipRow),
});
export type LedgerResponse = z.infer<typeof ledgerResponse>;

/** The rink's outstanding credits: a liability until redeemed, expired or refunded. */
export const creditSummary = z.object({
  currency: z.string(),
  outstandingCredits: z.number().int(),
  deferredRevenueMinor: minor,
  byProduct: z.array(z.object({ productName: z.string(), credits: z.number().int(), valueMinor: minor })),
  last30Days: z.object({ soldMinor: minor, redeemedCredits: z.number().int(), breakageCredits: z.number().int(), breakageMinor: minor, refundedMinor: minor }),
});
export type CreditSummary = z.infer<typeof creditSummary>;

// ---- sales -----------------------------------------------------------------------------------------------
/** Test payment methods the counter can charge while the payment service is in test mode. */
export const TEST_PAYMENT_METHODS = {
  pm_card_visa: 'Test card that succeeds',
  pm_card_chargeDeclined: 'Test card that is declined',
} as const;
export const counterSaleInput = z.object({
  productId: id,
  paymentMethodId: z.string().trim().min(1, 'Choose how the skater pays').max(80),
});
export type CounterSaleInput = z.infer<typeof counterSaleInput>;
export const saleResponse = z.object({ payment: paymentRow, balance: z.number().int() });

export const refundQuote = z.object({
  credits: z.number().int(),
  refundMinor: minor,
  currency: z.string(),
  /** The rule in words, shown before the manager confirms. */
  rule: z.string(),
});
export type RefundQuote = z.infer<typeof refundQuote>;
export const refundInput = z.object({ reason: z.string().trim().min(3, 'Say why').max(500) });

export const checkoutInput = z.object({
  productId: id,
  email,
  name: z.string().trim().min(1, 'Enter a name').max(200),
});
export type CheckoutInput = z.infer<typeof checkoutInput>;
export const checkoutResponse = z.object({ url: z.string() });
export const publicRinkParams = z.object({ slug: z.string().min(1).max(64) });
export const checkoutStatusParams = z.object({ slug: z.string().min(1).max(64), sessionId: z.string().min(1).max(100) });
export const checkoutStatus = z.object({
  state: z.enum(['pending', 'paid', 'failed']),
  productName: z.string(),
  credits: z.number().int(),
  amountMinor: minor,
  currency: z.string(),
});
export type CheckoutStatus = z.infer<typeof checkoutStatus>;

export const publicProduct = productRow.pick({ id: true, kind: true, name: true, description: true, credits: true, monthsValid: true, interval: true, price: true });
export type PublicProduct = z.infer<typeof publicProduct>;
export const publicRink = z.object({
  rink: z.object({ name: z.string(), slug: z.string(), currency: z.string(), timeZone: z.string() }),
  products: z.array(publicProduct),
  /** False until the rink has finished connecting its payout account (or while it is read-only). */
  selling: z.boolean(),
});
export type PublicRink = z.infer<typeof publicRink>;

// ---- the rink's payout account and plan --------------------------------------------------------------------
export const planState = z.enum(['none', 'active', 'past_due', 'read_only', 'canceled']);
export type PlanState = z.infer<typeof planState>;
export const billingResponse = z.object({
  payout: z.object({ connected: z.boolean(), chargesEnabled: z.boolean(), accountId: z.string().nullable() }),
  plan: z.object({
    state: planState,
    stations: z.number().int(),
    activeStations: z.number().int(),
    periodEnd: isoTime.nullable(),
    graceUntil: isoTime.nullable(),
    pricePerStationMinor: minor,
    currency: z.string(),
    feeBps: z.number().int(),
  }),
  /** The payment service is in test mode: test clocks may be advanced from the billing page. */
  testMode: z.boolean(),
});
export type BillingResponse = z.infer<typeof billingResponse>;
export const advanceClockInput = z.object({ days: z.number().int().min(1, 'At least 1 day').max(400, 'At most 400 days') });

// ---- leagues ---------------------------------------------------------------------------------------------
export const leagueInput = z.object({
  name: z.string().trim().min(1, 'Name the league').max(120),
  season: z.string().trim().max(40).nullable().default(null),
  managerUserId: id.nullable().default(null),
});
export type LeagueInput = z.infer<typeof leagueInput>;
export const leagueParams = z.object({ rinkSlug: z.string(), leagueId: id });
export const leagueSummary = z.object({
  id: z.string(),
  name: z.string(),
  season: z.string().nullable(),
  manager: z.string().nullable(),
  poolCredits: z.number().int(),
  teams: z.number().int(),
  players: z.number().int(),
});
export const leagueList = z.object({ leagues: z.array(leagueSummary) });
export const teamRow = z.object({
  id: z.string(),
  name: z.string(),
  allocated: z.number().int(),
  used: z.number().int(),
  remaining: z.number().int(),
  players: z.array(z.object({ id: z.string(), customerId: z.string(), name: z.string(), email: z.string().nullable(), credits: z.number().int() })),
});
export type TeamRow = z.infer<typeof teamRow>;
export const leagueDetail = z.object({
  league: leagueSummary,
  pool: balanceResponse,
  teams: z.array(teamRow),
  packs: z.array(publicProduct),
  imports: z.array(z.object({ id: z.string(), rowCount: z.number().int(), createdAt: isoTime, by: z.string() })),
});
export type LeagueDetail = z.infer<typeof leagueDetail>;
export const rosterInput = z.object({ csv: z.string().min(1, 'The file is empty').max(1_000_000, 'The file is too large (1 MB at most)') });
export const rosterResult = z.object({
  /** False when this exact file was applied before: nothing changed. */
  applied: z.boolean(),
  rows: z.number().int(),
  teamsCreated: z.number().int(),
  playersAdded: z.number().int(),
  customersCreated: z.number().int(),
});
export type RosterResult = z.infer<typeof rosterResult>;
/** One roster row, as the CSV's header names it: team, name, email (phone optional). */
export const rosterRow = z.object({
  team: z.string().trim().min(1, 'team is empty').max(120, 'team is longer than 120 characters'),
  name: z.string().trim().min(1, 'name is empty').max(200, 'name is longer than 200 characters'),
  email: email.nullable(),
  phone: z.string().trim().max(32, 'phone is longer than 32 characters').nullable(),
});
export type RosterRow = z.infer<typeof rosterRow>;
export const allocationInput = z
  .object({ teamId: id.nullable().default(null), playerId: id.nullable().default(null), credits: wholeCredits(1000) })
  .refine((a) => (a.teamId === null) !== (a.playerId === null), { message: 'Give credits to one team or one player', path: ['teamId'] });
export type AllocationInput = z.infer<typeof allocationInput>;
export const counterTeams = z.object({ teams: z.array(z.object({ id: z.string(), name: z.string(), leagueName: z.string(), credits: z.number().int() })) });
export const leagueCheckoutInput = z.object({ productId: id });

// ---- skater portal ---------------------------------------------------------------------------------------
export const portalRink = z.object({
  rink: z.object({ slug: z.string(), name: z.string(), currency: z.string(), timeZone: z.string(), unitPreference: z.enum(['in', 'mm']) }),
  customer: z.object({ id: z.string(), name: z.string(), memberCode: z.string() }),
  credits: z.number().int(),
  nextExpiry: isoTime.nullable(),
  memberships: z.array(membershipRow),
});
export type PortalRink = z.infer<typeof portalRink>;
export const portalHome = z.object({ rinks: z.array(portalRink) });
export const portalRinkParams = z.object({ slug: z.string().min(1).max(64) });
export const portalMembershipParams = z.object({ slug: z.string().min(1).max(64), membershipId: id });
export const preferencesInput = z.object({ notifyReady: z.boolean(), notifyReminders: z.boolean() });
export type PreferencesInput = z.infer<typeof preferencesInput>;
export const portalSharpening = z.object({
  id: z.string(),
  ticketNumber: z.number().int(),
  pairLabel: z.string(),
  stationName: z.string(),
  hollowNm: z.number().int(),
  passes: z.number().int(),
  bladeWidthNm: z.number().int(),
  doneAt: isoTime,
  readings: z.array(readingRow.omit({ takenBy: true })),
});
export const portalRinkDetail = portalRink.extend({
  balance: balanceResponse,
  entries: z.array(entryRow.omit({ actor: true })),
  payments: z.array(paymentRow),
  sharpenings: z.array(portalSharpening),
  profiles: z.array(z.object({ id: z.string(), label: z.string(), bladeWidthNm: z.number().int().nullable(), preferredHollowNm: z.number().int().nullable(), notes: z.string().nullable() })),
  preferences: preferencesInput,
  products: z.array(publicProduct),
  bands: z.object({ trueNm: z.number().int(), fairNm: z.number().int() }),
});
export type PortalRinkDetail = z.infer<typeof portalRinkDetail>;
export const portalCheckoutInput = z.object({ productId: id });
