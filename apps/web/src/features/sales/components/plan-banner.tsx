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
  const billingLink = can(rink, 'billing', 'manage') ? (
    <>
      {' '}
      <Link className="font-bold underline" to={`/rinks/${rink.slug}/billing`}>
        Go to Billing
      </Link>
    </>
  ) : null;
  return (
    <div role="alert" className="mb-4 rounded-lg border-l-4 border-brick bg-red-50 px-4 py-3 text-sm font-medium text-ink">
      {plan.state === 'past_due' ? (
        <>The Rinkwright plan payment failed; the rink becomes read-only on {plan.graceUntil ? formatDate(plan.graceUntil, rink.timeZone) : 'the end of its grace'}.</>
      ) : (
        <>This rink is read-only until its plan is paid.</>
      )}
      {billingLink}
    </div>
  );
}
