import { NavLink, Outlet, useParams } from 'react-router';
import { Button, LinkButton } from '../../components/ui/button';
import { Alert, Loading } from '../../components/ui/feedback';
import { NotFound } from '../../components/ui/not-found';
import { PendingWrites } from '../../components/ui/pending-writes';
import { reportsFor } from '../../features/reports/components/access';
import { useRinkSummary } from '../../features/rinks/api/get-rink';
import { PlanBanner } from '../../features/sales/components/plan-banner';
import { ApiError } from '../../lib/api-client';
import { can } from '../../lib/rink-context';
import { useMe } from '../../lib/session';

/**
 * A rink the platform suspended: its staff get the platform's reason instead of a page, and a way on. The name
 * comes from the caller's own list of rinks, since the rink itself answers nothing but why.
 */
function SuspendedNotice({ slug, message, checking, onCheck }: { slug: string; message: string; checking: boolean; onCheck: () => void }) {
  const { data: me } = useMe();
  const name = me?.rinks.find((r) => r.slug === slug)?.name ?? 'This rink';
  return (
    <div className="mx-auto max-w-2xl px-4 py-12">
      <section aria-labelledby="suspended-title" className="rounded-2xl border-2 border-brick bg-white p-6 shadow-sm sm:p-8">
        <p className="text-sm font-bold uppercase tracking-widest text-brick">Suspended by the platform</p>
        <h1 id="suspended-title" className="mt-2 text-3xl font-extrabold tracking-tight">
          {name} is suspended
        </h1>
        <p role="alert" className="mt-4 rounded-lg border-l-4 border-brick bg-red-50 px-4 py-3 text-base font-semibold text-ink" data-testid="suspended-message">
          {message}
        </p>
        <p className="mt-4 text-ink-soft">
          Until it is reactivated, none of the rink’s pages open for its staff and its public page is closed. Nothing has been deleted: skaters keep their credits, and the rink’s records are kept.
        </p>
        <div className="mt-6 flex flex-wrap gap-2">
          <LinkButton to="/rinks">All my rinks</LinkButton>
          <Button tone="secondary" busy={checking} onClick={onCheck}>
            {checking ? 'Checking…' : 'Check again'}
          </Button>
        </div>
      </section>
    </div>
  );
}

/** Loads the rink once for every page under /rinks/:rinkSlug and shows only what the caller's role may open. */
export function RinkLayout() {
  const { rinkSlug = '' } = useParams();
  const rink = useRinkSummary(rinkSlug);
  if (rink.isPending) return <Loading label="Opening the rink…" />;
  if (rink.isError) {
    if (rink.error instanceof ApiError && rink.error.status === 404) return <NotFound message="No such rink, or you are not one of its staff." />;
    if (rink.error instanceof ApiError && rink.error.code === 'suspended') {
      return <SuspendedNotice slug={rinkSlug} message={rink.error.message} checking={rink.isFetching} onCheck={() => void rink.refetch()} />;
    }
    return (
      <div className="mx-auto max-w-3xl px-4 py-8">
        <Alert>{rink.error.message}</Alert>
      </div>
    );
  }
  const summary = rink.data;
  const links = [
    { to: '', label: 'Overview', show: true },
    { to: 'counter', label: 'Counter', show: can(summary, 'ticket', 'read') },
    { to: 'stations', label: 'Stations', show: can(summary, 'station', 'read') },
    { to: 'services', label: 'Services', show: can(summary, 'service', 'manage') },
    { to: 'products', label: 'Products', show: can(summary, 'product', 'read') },
    { to: 'leagues', label: 'Leagues', show: can(summary, 'league', 'read') },
    { to: 'billing', label: 'Billing', show: can(summary, 'billing', 'read') },
    { to: 'reports', label: 'Reports', show: reportsFor(summary).length > 0 },
    { to: 'staff', label: 'Staff', show: can(summary, 'member', 'read') },
    { to: 'settings', label: 'Settings', show: can(summary, 'rink', 'update') },
  ].filter((l) => l.show);
  return (
    <div className="mx-auto max-w-6xl px-4 py-6">
      <nav aria-label={`${summary.name} sections`} className="mb-6 flex flex-wrap gap-1 border-b border-rule">
        {links.map((l) => (
          <NavLink
            key={l.to}
            to={l.to}
            end={l.to === ''}
            className={({ isActive }) =>
              `flex min-h-11 items-center border-b-4 px-4 text-sm font-semibold ${isActive ? 'border-steel text-ink' : 'border-transparent text-ink-soft hover:text-ink'}`
            }
          >
            {l.label}
          </NavLink>
        ))}
      </nav>
      <PlanBanner rink={summary} />
      <PendingWrites rinkSlug={summary.slug} />
      <Outlet context={summary} />
    </div>
  );
}
