import { PageHeader } from '../../../components/ui/layout';
import { NotFound } from '../../../components/ui/not-found';
import { can, useRink } from '../../../lib/rink-context';
import { InvitationsPanel } from '../components/invitations-panel';
import { MembersPanel } from '../components/members-panel';

export function Component() {
  const rink = useRink();
  if (!can(rink, 'member', 'read')) return <NotFound />;
  return (
    <div className="space-y-6">
      <PageHeader title="Staff and invitations" subtitle="Who can work in this rink, and with which role." />
      <MembersPanel rink={rink} />
      <InvitationsPanel rink={rink} />
    </div>
  );
}
