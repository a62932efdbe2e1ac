import { Link } from 'react-router';
import { ROLE_LABELS } from '@rinkwright/core';
import { LinkButton } from '../../../components/ui/button';
import { MemberQr } from '../../../components/ui/member-qr';
import { Card, PageHeader } from '../../../components/ui/layout';
import { useMe } from '../../../lib/session';

export function Component() {
  const { data: me } = useMe();
  if (!me) return null;
  return (
    <div className="mx-auto max-w-4xl px-4 py-8">
      <PageHeader
        title={`Hello, ${me.user.name}`}
        subtitle={me.rinks.length > 0 ? 'Choose a rink to work in.' : 'Your rinks, and the rinks where you skate.'}
        actions={
          <LinkButton to="/rinks/new" tone={me.rinks.length > 0 ? 'primary' : 'secondary'}>
            Set up a new rink
          </LinkButton>
        }
      />
      <div className="grid gap-6 md:grid-cols-2">
        <Card title="Rinks you work at">
          {me.rinks.length === 0 ? (
            <p className="text-ink-soft">You are not on the staff of any rink yet. Set one up, or ask a rink's manager for an invitation.</p>
          ) : (
            <ul className="divide-y divide-rule">
              {me.rinks.map((r) => (
                <li key={r.slug}>
                  <Link to={`/rinks/${r.slug}`} className="flex min-h-14 items-center justify-between gap-3 py-2 hover:text-steel">
                    <span className="font-semibold">{r.name}</span>
                    <span className="rounded-full bg-glacier px-3 py-1 text-xs font-semibold">{ROLE_LABELS[r.role]}</span>
                  </Link>
                </li>
              ))}
            </ul>
          )}
        </Card>
        <Card title="Where you skate">
          {me.customerOf.length === 0 ? (
            <p className="text-ink-soft">No rink has you as a customer with this e-mail yet. When a rink adds you, it shows here.</p>
          ) : (
            <ul className="divide-y divide-rule">
              {me.customerOf.map((c) => (
                <li key={c.slug} className="flex min-h-14 items-center justify-between gap-3 py-2">
                  <span className="font-semibold">{c.name}</span>
                  <span className="flex items-center gap-3 text-sm">
                    Member code
                    <MemberQr code={c.memberCode} size={88} />
                  </span>
                </li>
              ))}
            </ul>
          )}
          <Link to="/portal" className="mt-3 flex min-h-11 items-center font-semibold text-steel underline">My skates: credits, history and readings</Link>
        </Card>
      </div>
    </div>
  );
}
