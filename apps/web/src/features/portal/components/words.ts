import type { EntryRow, LotRow, PaymentRow, PublicProduct } from '@rinkwright/core';

const plural = (n: number, word: string) => `${n} ${word}${n === 1 ? '' : 's'}`;
export const credits = (n: number) => plural(n, 'credit');

export const ENTRY_WORDS: Record<EntryRow['kind'], string> = {
  purchase: 'Purchase',
  grant: 'Credits granted',
  redeem: 'Redemption',
  expire: 'Expiry',
  refund: 'Refund',
  transfer: 'Transfer',
  adjust: 'Adjustment',
  reversal: 'Reversal',
};

export const SOURCE_WORDS: Record<EntryRow['source'], string> = {
  payment: 'Payment',
  ticket: 'Sharpening ticket',
  roster: 'League roster',
  membership: 'Membership',
  staff: 'At the counter',
  league: 'League',
  system: 'Automatic',
};

export const LOT_ORIGIN_WORDS: Record<LotRow['origin'], string> = {
  purchase: 'Bought',
  membership: 'Membership',
  grant: 'Granted',
  adjust: 'Adjustment',
  transfer: 'Transferred',
};

/** The word before a lot's date: when its credits came, and how. */
export const LOT_DATE_WORDS: Record<LotRow['origin'], string> = {
  purchase: 'bought',
  membership: 'granted',
  grant: 'granted',
  adjust: 'added',
  transfer: 'received',
};

export const PAYMENT_WORDS: Record<PaymentRow['state'], string> = {
  pending: 'waiting for the payment service',
  paid: 'paid',
  failed: 'failed',
  refunded: 'refunded',
  partially_refunded: 'partly refunded',
};

/** A signed count with a true minus sign, so a redemption reads −1 and a purchase +10. */
export const signed = (n: number) => (n > 0 ? `+${n}` : n < 0 ? `\u2212${-n}` : '0');

export function productTerms(p: PublicProduct): string {
  if (p.kind === 'membership') {
    const every = p.interval === 'year' ? 'year' : 'month';
    return `Renews every ${every}, ${credits(p.credits)} per ${every}`;
  }
  return p.monthsValid === null ? `${credits(p.credits)}, no expiry date` : `${credits(p.credits)}, use within ${plural(p.monthsValid, 'month')}`;
}
