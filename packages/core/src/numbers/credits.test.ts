import { describe, expect, it } from 'vitest';
import { creditBalance, deferredRevenueMinor, expiredLots, graceLapsed, lotToRedeem, lotValueMinor, membershipRollover, punchCardRefund, type Lot } from './credits';

const day = (d: number) => new Date(Date.UTC(2026, 0, 1 + d));
const lot = (over: Partial<Lot> & { id: string }): Lot => ({ credits: 10, remaining: 10, priceMinor: 10_000, expiresAt: day(365), createdAt: day(0), ...over });

describe('redemption order', () => {
  // Using the credit that expires first is common practice for prepaid balances (no published source): it is the
  // order that lets the fewest credits expire.
  it('takes the live lot that expires first, then the older of two, and never-expiring lots last', () => {
    const lots = [
      lot({ id: 'forever', expiresAt: null }),
      lot({ id: 'late', expiresAt: day(300) }),
      lot({ id: 'soon-new', expiresAt: day(100), createdAt: day(5) }),
      lot({ id: 'soon-old', expiresAt: day(100), createdAt: day(1) }),
      lot({ id: 'empty', expiresAt: day(50), remaining: 0 }),
      lot({ id: 'expired', expiresAt: day(9) }),
    ];
    expect(lotToRedeem(lots, day(10))?.id).toBe('soon-old');
    expect(lotToRedeem(lots.filter((l) => l.id.startsWith('forever')), day(10))?.id).toBe('forever');
    expect(lotToRedeem([lot({ id: 'gone', expiresAt: day(9) })], day(10))).toBeNull();
  });

  it('counts only live credits in the balance (an expiry at the very instant counts as expired)', () => {
    const lots = [lot({ id: 'a', remaining: 3 }), lot({ id: 'b', remaining: 4, expiresAt: day(10) }), lot({ id: 'c', remaining: 0 })];
    expect(creditBalance(lots, day(9))).toBe(7);
    expect(creditBalance(lots, day(10))).toBe(3);
  });
});

describe('what credits are worth', () => {
  it('spreads a price over its credits so every credit of a lot adds up to exactly its price', () => {
    // 10 credits for 99.99, by hand: the first k credits are worth round(999.9 × k) = 1000, 2000, 3000, 4000,
    // 5000 (4999.5 rounds up), 5999, 6999, 7999, 8999, 9999, so the sixth credit is the one worth 9.99.
    const card = { credits: 10, remaining: 10, priceMinor: 9_999 };
    const steps: number[] = [];
    for (let left = 10; left > 0; left--) steps.push(lotValueMinor({ ...card, remaining: left }, 1));
    expect(steps).toEqual([1000, 1000, 1000, 1000, 1000, 999, 1000, 1000, 1000, 1000]);
    expect(steps.reduce((a, b) => a + b, 0)).toBe(9_999);
  });

  it('values the unredeemed credits of live lots as deferred revenue', () => {
    // Hand-computed: 7 of 10 credits of a 120.00 card = 84.00, 2 of 5 of a 50.00 pack = 20.00, the expired lot none.
    const lots = [
      lot({ id: 'card', priceMinor: 12_000, remaining: 7 }),
      lot({ id: 'pack', credits: 5, priceMinor: 5_000, remaining: 2 }),
      lot({ id: 'old', remaining: 5, expiresAt: day(1) }),
    ];
    expect(deferredRevenueMinor(lots, day(30))).toBe(8_400 + 2_000);
  });

  it('writes breakage for each lot past its expiry with credits left', () => {
    const lots = [lot({ id: 'old', remaining: 3, priceMinor: 10_000, expiresAt: day(1) }), lot({ id: 'used-up', remaining: 0, expiresAt: day(1) }), lot({ id: 'live' })];
    expect(expiredLots(lots, day(2))).toEqual([{ lotId: 'old', credits: 3, valueMinor: 3_000 }]);
  });

  it('refunds the unredeemed share of a punch card, rounded to the minor unit', () => {
    // 4 of 10 credits used on a 99.99 card: the 6 left are worth 99.99 − round(99.99 × 4 / 10) = 99.99 − 40.00.
    expect(punchCardRefund(lot({ id: 'card', priceMinor: 9_999, remaining: 6 }), day(10))).toEqual({ credits: 6, refundMinor: 5_999 });
    expect(punchCardRefund(lot({ id: 'late', remaining: 6, expiresAt: day(1) }), day(10))).toEqual({ credits: 0, refundMinor: 0 });
  });
});

describe('membership rollover', () => {
  it('carries unused credits up to the cap and lets the rest expire', () => {
    expect(membershipRollover({ remaining: 5, cap: 2 })).toEqual({ carried: 2, expired: 3 });
    expect(membershipRollover({ remaining: 1, cap: 2 })).toEqual({ carried: 1, expired: 0 });
    expect(() => membershipRollover({ remaining: -1, cap: 2 })).toThrow(RangeError);
  });
});

describe('grace after a failed payment', () => {
  const now = new Date('2026-12-02T12:00:00Z');
  it('lapses only for an unpaid state whose grace has ended (the end itself counts as ended)', () => {
    expect(graceLapsed('past_due', new Date('2026-12-02T12:00:00Z'), now)).toBe(true);
    expect(graceLapsed('past_due', new Date('2026-12-01T00:00:00Z'), now)).toBe(true);
    expect(graceLapsed('past_due', new Date('2026-12-03T00:00:00Z'), now)).toBe(false);
    expect(graceLapsed('past_due', null, now)).toBe(false);
    expect(graceLapsed('active', new Date('2026-12-01T00:00:00Z'), now)).toBe(false);
  });
});
