import { Link, Outlet, useParams } from 'react-router';
import { Alert, Loading } from '../../../components/ui/feedback';
import { NotFound } from '../../../components/ui/not-found';
import { formatDate } from '../../../lib/format';
import { useMe } from '../../../lib/session';
import { usePlatformRinks } from '../api/get-platform-rinks';
import { Badge, PlanState } from '../components/plan-state';

/**
 * One rink as the platform console sees it: the way back to the console, where the rink stands, and the pages
 * under it (its reports), which are handed the rink as their outlet context.
 */
export function Component() {
  const me = useMe();
  const { rinkId = '' } = useParams();
  const rinks = usePlatformRinks();
  if (me.data && !me.data.user.platformAdmin) return <NotFound />;
  if (rinks.isPending) return <Loading label="Opening the rink…" />;
  if (rinks.isError) {
    return (
      <div className="mx-auto max-w-3xl px-4 py-8">
        <Alert>{rinks.error.message}</Alert>
      </div>
    );
  }
  const rink = rinks.data.rinks.find((r) => r.id === rinkId);
  if (!rink) return <NotFound message="No rink on the platform has this address." />;
  return (
    <div className="mx-auto max-w-6xl px-4 py-6">
      <nav aria-label="Breadcrumb" className="mb-4">
        <ol className="flex flex-wrap items-center gap-2 text-sm">
          <li>
            <Link to="/platform" className="inline-flex min-h-11 items-center font-semibold text-steel underline-offset-2 hover:underline">
              <span aria-hidden="true">←&nbsp;</span>Platform console
            </Link>
          </li>
          <li aria-hidden="true" className="text-ink-soft">
            /
          </li>
          <li aria-current="page" className="font-semibold">
            {rink.name}
          </li>
        </ol>
      </nav>
      <section aria-label={`${rink.name} on the platform`} className="mb-6 flex flex-wrap items-start gap-x-8 gap-y-3 rounded-lg bg-glacier px-4 py-3 text-sm">
        <p>
          <span className="block text-ink-soft">Rink</span>
          <span className="font-semibold">{rink.name}</span> <span className="text-ink-soft">/r/{rink.slug}</span>
        </p>
        <div>
          <span className="mb-1 block text-ink-soft">Plan</span>
          <PlanState plan={rink.plan} timeZone={rink.timeZone} />
        </div>
        <div>
          <span className="mb-1 block text-ink-soft">Access</span>
          {rink.suspension ? (
            <span className="inline-flex flex-col items-start gap-1">
              <Badge tone="stopped">Suspended</Badge>
              <span className="text-xs">
                Since {formatDate(rink.suspension.at)}: {rink.suspension.reason}. Its staff cannot open it; its reports stay readable here.
              </span>
            </span>
          ) : (
            <Badge tone="good">Open</Badge>
          )}
        </div>
        <p>
          <span className="block text-ink-soft">Days and money</span>
          {rink.timeZone.replaceAll('_', ' ')} · {rink.currency}
        </p>
        <p>
          <span className="block text-ink-soft">Joined</span>
          {formatDate(rink.createdAt)}
        </p>
      </section>
      <Outlet context={rink} />
    </div>
  );
}
