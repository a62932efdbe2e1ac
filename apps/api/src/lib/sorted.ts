// Small helpers over lists the database returned in order.

/** The first index of an ascending list at which `reached` holds (the list's length when it never does). */
export function firstIndex<T>(sorted: readonly T[], reached: (value: T) => boolean): number {
  let lo = 0;
  let hi = sorted.length;
  while (lo < hi) {
    const mid = (lo + hi) >>> 1;
    if (reached(sorted[mid]!)) hi = mid;
    else lo = mid + 1;
  }
  return lo;
}

/** Running totals: element i is the sum of the first i values (so the list is one longer than its input). */
export function runningTotals(values: readonly number[]): number[] {
  const totals = [0];
  for (const v of values) totals.push(totals[totals.length - 1]! + v);
  return totals;
}

/** Orders text as MariaDB's binary collation and JS's default sort do, by code unit (ids, enum names). */
export const compareText = (a: string, b: string): number => (a < b ? -1 : a > b ? 1 : 0);

/** The items of a list by key, each group in the list's own order. */
export function groupBy<T, K>(items: readonly T[], keyOf: (item: T) => K): Map<K, T[]> {
  const groups = new Map<K, T[]>();
  for (const item of items) {
    const key = keyOf(item);
    const group = groups.get(key);
    if (group) group.push(item);
    else groups.set(key, [item]);
  }
  return groups;
}
