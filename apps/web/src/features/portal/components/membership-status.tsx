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

/** The period's end in words, with the date kept whole so a narrow screen never splits it. */
function PeriodLine({ membership: m, timeZone }: { membership: MembershipRow; timeZone: string }) {
  if (m.state === 'canceled' || !m.periodEnd) return null;
  const end = <span className="whitespace-nowrap">{formatDate(m.periodEnd, timeZone)}</span>;
  return m.cancelAtPeriodEnd ? <>Cancels at the end of the period, on {end}</> : <>Current period ends {end}</>;
}

export function MembershipStatus({ membership, timeZone }: { membership: MembershipRow; timeZone: string }) {
  const warn = membership.state === 'past_due' || membership.state === 'blocked';
  const live = membership.state !== 'canceled' && membership.periodEnd !== null;
  return (
    <div>
      <p className="font-semibold">{membership.productName}</p>
      <p className={`text-sm font-semibold ${warn ? 'text-brick' : ''}`}>{membershipState(membership, timeZone)}</p>
      <p className="text-sm text-ink-soft tabular-nums">
        <span className="whitespace-nowrap">
          {membership.creditsPerPeriod} credits per {membership.interval === 'year' ? 'year' : 'month'}
        </span>
        {live ? ' · ' : null}
        <PeriodLine membership={membership} timeZone={timeZone} />
      </p>
    </div>
  );
}
