import type { PublicProduct } from '@rinkwright/core';

const plural = (n: number, word: string) => `${n} ${word}${n === 1 ? '' : 's'}`;

/** How the product's credits come and how long they last, in one line. */
export function productTerms(p: PublicProduct): string {
  if (p.kind === 'membership') {
    const every = p.interval === 'year' ? 'year' : 'month';
    return `Renews every ${every}, ${plural(p.credits, 'credit')} per ${every}`;
  }
  const credits = plural(p.credits, 'credit');
  return p.monthsValid === null ? `${credits}, no expiry date` : `${credits}, use within ${plural(p.monthsValid, 'month')}`;
}
