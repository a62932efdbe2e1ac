import { Link } from 'react-router';
import { Alert, Loading } from '../../../components/ui/feedback';
import { Card, PageHeader } from '../../../components/ui/layout';
import { formatDate } from '../../../lib/format';
import { useMe } from '../../../lib/session';
import { usePortalHome } from '../api/get-portal-home';
import { MembershipStatus } from '../components/membership-status';

function EmptyState({ verified }: { verified: boolean }) {
  return (
    <Card>
      <div className="max-w-2xl space-y-3">
        <p className="font-semibold">No rink has linked your account yet.</p>
        <p className="text-ink-soft">
          A rink links your account when your verified e-mail address matches the one the rink has for you: give the counter this address, or buy credits
          with it on the rink’s own page.
        </p>
        {verified ? null : <Alert tone="info">Your e-mail address is not verified yet: open the link we sent you, and your rinks show here.</Alert>}
        <p className="text-ink-soft">
          A rink’s page has an address of the form <span className="font-mono font-semibold">{window.location.origin}/r/&lt;rink&gt;</span>; the counter can give
          you theirs.
        </p>
      </div>
    </Card>
  );
}

export function Component() {
  const { data: me } = useMe();
  const home = usePortalHome();
  return (
    <div className="mx-auto max-w-5xl px-4 py-8">
      <PageHeader title="My skates" subtitle="Your credits, memberships and sharpenings at each rink." />
      {home.isPending ? (
        <Loading />
      ) : home.isError ? (
        <Alert>{home.error.message}</Alert>
      ) : home.data.rinks.length === 0 ? (
        <EmptyState verified={me?.user.emailVerified ?? false} />
      ) : (
        <ul className="grid gap-6 md:grid-cols-2">
          {home.data.rinks.map((r) => (
            <li key={r.rink.slug}>
              <Card title={r.rink.name} className="h-full">
                <div className="flex flex-wrap items-end gap-6">
                  <div>
                    <p className="text-sm font-medium text-ink-soft">Credits</p>
                    <p className="text-5xl font-extrabold tabular-nums">{r.credits}</p>
                  </div>
                  <p className="text-sm text-ink-soft tabular-nums">
                    {r.nextExpiry ? `Next expiry ${formatDate(r.nextExpiry, r.rink.timeZone)}` : r.credits > 0 ? 'No expiry date' : null}
                  </p>
                </div>
                {r.memberships.length > 0 ? (
                  <ul className="mt-4 space-y-3 border-t border-rule pt-4">
                    {r.memberships.map((m) => (
                      <li key={m.id}>
                        <MembershipStatus membership={m} timeZone={r.rink.timeZone} />
                      </li>
                    ))}
                  </ul>
                ) : null}
                <Link to={`/portal/${encodeURIComponent(r.rink.slug)}`} className="mt-4 flex min-h-11 items-center font-semibold text-steel underline">
                  History, sharpenings and member code<span className="sr-only"> at {r.rink.name}</span>
                </Link>
              </Card>
            </li>
          ))}
        </ul>
      )}
    </div>
  );
}
