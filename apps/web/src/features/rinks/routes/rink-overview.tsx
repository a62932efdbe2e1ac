import { ROLE_LABELS } from '@rinkwright/core';
import { LinkButton } from '../../../components/ui/button';
import { Card, PageHeader, Stat } from '../../../components/ui/layout';
import { formatDate } from '../../../lib/format';
import { can, useRink } from '../../../lib/rink-context';
import { UNIT_OPTIONS } from '../components/rink-fields';

export function Component() {
  const rink = useRink();
  const unit = UNIT_OPTIONS.find((u) => u.value === rink.unitPreference)?.label ?? rink.unitPreference;
  return (
    <div>
      <PageHeader title={rink.name} subtitle={`You are signed in as ${ROLE_LABELS[rink.role].toLowerCase()}.`} />
      <dl className="mb-6 grid grid-cols-2 gap-3 sm:grid-cols-3">
        <Stat label="Staff" value={rink.counts.members} />
        <Stat label="Customers" value={rink.counts.customers} />
        {can(rink, 'invitation', 'read') ? <Stat label="Pending invitations" value={rink.counts.pendingInvitations} /> : null}
      </dl>
      <div className="grid gap-6 md:grid-cols-2">
        <Card title="This rink">
          <dl className="grid grid-cols-[auto_1fr] gap-x-4 gap-y-2 text-sm">
            <dt className="font-semibold text-ink-soft">Time zone</dt>
            <dd>{rink.timeZone.replaceAll('_', ' ')}</dd>
            <dt className="font-semibold text-ink-soft">Currency</dt>
            <dd>{rink.currency}</dd>
            <dt className="font-semibold text-ink-soft">Units</dt>
            <dd>{unit}</dd>
            <dt className="font-semibold text-ink-soft">On Rinkwright since</dt>
            <dd>{formatDate(rink.createdAt, rink.timeZone)}</dd>
          </dl>
          {can(rink, 'rink', 'update') ? (
            <LinkButton tone="secondary" to="settings" className="mt-4">
              Change settings
            </LinkButton>
          ) : null}
        </Card>
        <Card title="Safety at the counter">
          <ul className="list-disc space-y-1 pl-5 text-sm">
            <li>Keep wheel guards and work rests in place; never run a wheel above its rated speed.</li>
            <li>Ring-test and inspect a new wheel before mounting it.</li>
            <li>Wear eye protection and run the dust extraction while grinding.</li>
            <li>Blades are sharp: hand skates back with guards on, and supervise children at the counter.</li>
          </ul>
          <p className="mt-3 text-xs text-ink-soft">Local codes, the machine maker's manual and licensed practice take precedence over these notes.</p>
        </Card>
      </div>
    </div>
  );
}
