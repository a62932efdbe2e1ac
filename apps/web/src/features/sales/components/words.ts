import type { EntryRow, LotRow, MembershipRow, PaymentRow, ProductRow } from '@rinkwright/core';

export const ENTRY_KIND_WORDS: Record<EntryRow['kind'], string> = {
  purchase: 'Bought',
  grant: 'Granted',
  redeem: 'Redeemed',
  expire: 'Expired',
  refund: 'Refunded',
  transfer: 'Transferred',
  adjust: 'Adjusted',
  reversal: 'Reversal',
};

export const ENTRY_SOURCE_WORDS: Record<EntryRow['source'], string> = {
  payment: 'Payment',
  ticket: 'Ticket',
  roster: 'League roster',
  membership: 'Membership',
  staff: 'Staff',
  league: 'League',
  system: 'Rinkwright',
};

export const LOT_ORIGIN_WORDS: Record<LotRow['origin'], string> = {
  purchase: 'Bought',
  membership: 'Membership period',
  grant: 'Granted',
  adjust: 'Staff adjustment',
  transfer: 'From a league',
};

export const MEMBERSHIP_STATE_WORDS: Record<MembershipRow['state'], string> = {
  incomplete: 'Waiting for the first payment',
  active: 'Active',
  past_due: 'Payment failed',
  blocked: 'Blocked (grace ran out)',
  canceled: 'Canceled',
};

export const PAYMENT_STATE_WORDS: Record<PaymentRow['state'], string> = {
  pending: 'Pending',
  paid: 'Paid',
  failed: 'Failed',
  refunded: 'Refunded',
  partially_refunded: 'Partly refunded',
};

export const signed = (n: number) => (n > 0 ? `+${n}` : n < 0 ? `\u2212${Math.abs(n)}` : '0');

/** How long a product's credits last, in the words the products table and the sale picker use. */
export function validityWords(p: Pick<ProductRow, 'kind' | 'monthsValid' | 'interval' | 'rolloverCap' | 'graceDays'>): string {
  if (p.kind === 'membership') return `per ${p.interval ?? 'month'}, rollover cap ${p.rolloverCap ?? 0}, grace ${p.graceDays ?? 0} days`;
  if (p.monthsValid === null) return 'no expiry';
  return `${p.monthsValid} month${p.monthsValid === 1 ? '' : 's'}`;
}
