import { describe, expect, it } from 'vitest';
import { feePercent, planWords } from './plan-words';
import { signed, validityWords } from './words';

const plan = { stations: 2, activeStations: 2, periodEnd: null, graceUntil: null, pricePerStationMinor: 2900, currency: 'CAD', feeBps: 250 };

describe('the words of the products and billing screens', () => {
  it('says how long credits last, per kind', () => {
    expect(validityWords({ kind: 'punch_card', monthsValid: 12, interval: null, rolloverCap: null, graceDays: null })).toBe('12 months');
    expect(validityWords({ kind: 'single', monthsValid: null, interval: null, rolloverCap: null, graceDays: null })).toBe('no expiry');
    expect(validityWords({ kind: 'membership', monthsValid: null, interval: 'month', rolloverCap: 4, graceDays: 7 })).toBe('per month, rollover cap 4, grace 7 days');
  });

  it('signs credits the way the ledger shows them', () => {
    expect(signed(3)).toBe('+3');
    expect(signed(-2)).toBe('\u22122');
    expect(signed(0)).toBe('0');
  });

  it('turns basis points into a percent (1 bp = 0.01 %, common practice, no published source)', () => {
    expect(feePercent(250)).toMatch(/^2[.,]5\s?%$/);
    expect(feePercent(100)).toMatch(/^1\s?%$/);
  });

  it('names the grace date of a failed plan payment', () => {
    expect(planWords({ ...plan, state: 'none' }, 'UTC')).toBe('No plan yet');
    expect(planWords({ ...plan, state: 'past_due', graceUntil: '2026-03-14T12:00:00.000Z' }, 'UTC')).toMatch(/^Payment failed — grace until .*14/);
    expect(planWords({ ...plan, state: 'read_only' }, 'UTC')).toBe('Read-only until the plan is paid');
  });
});
