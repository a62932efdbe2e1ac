import type { MembershipRow } from '@rinkwright/core';
import { formatDate } from '../../../lib/format';

/** The membership's state in words, with the one date that matters for it. */
export function membershipState(m: MembershipRow, timeZone: string): string {
  const date = (iso: string | null) => (iso ? formatDate(iso, timeZone) : 'a date the rink sets');
  switch (m.state) {
    case 'active':
      return 'Active';
    case 'past_due':
      return `Payment failed — credits usable until ${date(m.graceUntil)}`;
    case 'blocked':
      return 'Paused until the payment goes through';
    case 'canceled':
      return 'Canceled';
    case 'incomplete':
      return 'Waiting for the first payment';
  }
}

export function periodLine(m: MembershipRow, timeZone: string): string | null {
  if (m.state === 'canceled' || !m.periodEnd) return null;
  const end = formatDate(m.periodEnd, timeZone);
  return m.cancelAtPeriodEnd ? `Cancels at the end of the period, on ${end}` : `Current period ends ${end}`;
}

export function MembershipStatus({ membership, timeZone }: { membership: MembershipRow; timeZone: string }) {
  const period = periodLine(membership, timeZone);
  const warn = membership.state === 'past_due' || membership.state === 'blocked';
  return (
    <div>
      <p className="font-semibold">{membership.productName}</p>
      <p className={`text-sm font-semibold ${warn ? 'text-brick' : ''}`}>{membershipState(membership, timeZone)}</p>
      <p className="text-sm text-ink-soft tabular-nums">
        {membership.creditsPerPeriod} credits per {membership.interval === 'year' ? 'year' : 'month'}
        {period ? ` · ${period}` : ''}
      </p>
    </div>
  );
}
