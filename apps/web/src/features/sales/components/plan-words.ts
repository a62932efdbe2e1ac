import type { BillingResponse } from '@rinkwright/core';
import { formatDate } from '../../../lib/format';

type Plan = BillingResponse['plan'];

/** The plan's state in words, with the grace date when a payment has failed. */
export function planWords(plan: Plan, timeZone: string): string {
  switch (plan.state) {
    case 'none':
      return 'No plan yet';
    case 'active':
      return plan.periodEnd ? `Active, renews ${formatDate(plan.periodEnd, timeZone)}` : 'Active';
    case 'past_due':
      return `Payment failed — grace until ${plan.graceUntil ? formatDate(plan.graceUntil, timeZone) : 'soon'}`;
    case 'read_only':
      return 'Read-only until the plan is paid';
    case 'canceled':
      return 'Canceled';
  }
}

/** The platform's fee in basis points as a percent (250 → 2.5%). */
export const feePercent = (bps: number) => new Intl.NumberFormat(undefined, { style: 'percent', maximumFractionDigits: 2 }).format(bps / 10_000);
