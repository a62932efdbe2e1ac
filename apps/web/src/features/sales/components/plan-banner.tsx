import { Link } from 'react-router';
import type { RinkSummary } from '@rinkwright/core';
import { formatDate } from '../../../lib/format';
import { can } from '../../../lib/rink-context';
import { useBilling } from '../api/get-billing';

/**
 * Warns every page of the rink when its plan has lapsed. The rink summary carries no plan state, so the billing
 * status is read by those allowed to; the others meet the API's read_only answer on the write they try.
 */
export function PlanBanner({ rink }: { rink: RinkSummary }) {
  const billing = useBilling(rink.slug, can(rink, 'billing', 'read'));
  const plan = billing.data?.plan;
  if (!plan || (plan.state !== 'past_due' && plan.state !== 'read_only')) return null;
  const until = plan.graceUntil ? formatDate(plan.graceUntil, rink.timeZone) : 'the end of its grace';
  // Only the owner can pay; everyone else who sees the banner is told whom to ask, so nobody is left guessing.
  const next = can(rink, 'billing', 'manage') ? (plan.state === 'read_only' ? 'Start the plan again under' : 'See the plan under') : "Only the rink's owner can pay it: let them know. The plan is under";
  return (
    <div role="alert" className="mb-4 rounded-lg border-l-4 border-brick bg-red-50 px-4 py-3 text-sm font-medium text-ink">
      {plan.state === 'past_due' ? (
        <>
          The Rinkwright plan payment failed. Everything works until {until}; after that the rink is read-only (no intake, sales or changes) until the plan is paid.
        </>
      ) : (
        <>This rink is read-only until its plan is paid: no intake, sales or changes.</>
      )}{' '}
      {next}{' '}
      <Link className="font-bold underline" to={`/rinks/${rink.slug}/billing`}>
        Billing
      </Link>
      .
    </div>
  );
}
