import { useState } from 'react';
import type { MembershipRow } from '@rinkwright/core';
import { Button } from '../../../components/ui/button';
import { Alert } from '../../../components/ui/feedback';
import { formatDate } from '../../../lib/format';
import { useCancelMembership, type CancelWhen } from '../api/cancel-membership';
import { MembershipStatus } from './membership-status';

/** A membership with its cancel choices; each asks once more before anything is sent. */
export function MembershipActions({ slug, membership, timeZone }: { slug: string; membership: MembershipRow; timeZone: string }) {
  const cancel = useCancelMembership(slug);
  const [asking, setAsking] = useState<CancelWhen | null>(null);
  const [problem, setProblem] = useState('');
  const open = membership.state !== 'canceled' && membership.state !== 'incomplete';
  const end = membership.periodEnd ? formatDate(membership.periodEnd, timeZone) : null;

  async function confirm(when: CancelWhen) {
    setProblem('');
    try {
      await cancel.mutateAsync({ membershipId: membership.id, when });
      setAsking(null);
    } catch (error) {
      setProblem(error instanceof Error ? error.message : 'Not canceled.');
    }
  }

  return (
    <div className="space-y-3">
      <MembershipStatus membership={membership} timeZone={timeZone} />
      <Alert>{problem}</Alert>
      {open && asking === null ? (
        <div className="flex flex-wrap gap-2">
          {membership.cancelAtPeriodEnd ? null : (
            <Button tone="secondary" onClick={() => setAsking('period_end')}>
              Cancel at period end
            </Button>
          )}
          <Button tone="danger" onClick={() => setAsking('now')}>
            Cancel now
          </Button>
        </div>
      ) : null}
      {asking ? (
        <div role="group" aria-label="Confirm cancelling" className="space-y-2 rounded-lg border border-rule bg-glacier p-3">
          <p className="text-sm font-semibold">
            {asking === 'now'
              ? `Cancel ${membership.productName} now? It ends today and no further payment is taken.`
              : `Cancel ${membership.productName} at the end of the period${end ? ` (${end})` : ''}? It stays active until then, and no further payment is taken.`}
          </p>
          <div className="flex flex-wrap gap-2">
            <Button tone="danger" busy={cancel.isPending} onClick={() => void confirm(asking)}>
              {asking === 'now' ? 'Yes, cancel now' : 'Yes, cancel at period end'}
            </Button>
            <Button tone="secondary" disabled={cancel.isPending} onClick={() => setAsking(null)}>
              Keep the membership
            </Button>
          </div>
        </div>
      ) : null}
    </div>
  );
}
