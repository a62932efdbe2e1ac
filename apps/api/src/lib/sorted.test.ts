import { describe, expect, it } from 'vitest';
import { compareText, firstIndex, groupBy, runningTotals } from './sorted';

describe('sorted-list helpers', () => {
  it('finds the first index where a condition starts to hold, by bisection', () => {
    const days = ['2026-11-01', '2026-11-03', '2026-11-03', '2026-11-07'];
    expect(firstIndex(days, (d) => d >= '2026-10-01')).toBe(0);
    expect(firstIndex(days, (d) => d >= '2026-11-03')).toBe(1);
    expect(firstIndex(days, (d) => d > '2026-11-03')).toBe(3);
    expect(firstIndex(days, (d) => d >= '2026-12-01')).toBe(4);
    expect(firstIndex([], () => true)).toBe(0);
  });

  it('keeps running totals one longer than the values', () => {
    expect(runningTotals([4, 0, 5, 3])).toEqual([0, 4, 4, 9, 12]);
    expect(runningTotals([])).toEqual([0]);
  });

  it('groups by key in the list order', () => {
    const grouped = groupBy([{ w: 'a', n: 1 }, { w: 'b', n: 2 }, { w: 'a', n: 3 }], (x) => x.w);
    expect([...grouped]).toEqual([
      ['a', [{ w: 'a', n: 1 }, { w: 'a', n: 3 }]],
      ['b', [{ w: 'b', n: 2 }]],
    ]);
  });

  it('orders text by code unit, as the default sort does', () => {
    const ids = ['b2', 'B1', 'a10', 'a9', 'a9'];
    expect([...ids].sort(compareText)).toEqual([...ids].sort());
    expect([compareText('left', 'right'), compareText('right', 'left'), compareText('a9', 'a9')]).toEqual([-1, 1, 0]);
  });
});
