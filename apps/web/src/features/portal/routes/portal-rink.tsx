import { Link, useParams, useSearchParams } from 'react-router';
import type { PortalRinkDetail } from '@rinkwright/core';
import { LinkButton } from '../../../components/ui/button';
import { Alert, Loading } from '../../../components/ui/feedback';
import { Card, PageHeader } from '../../../components/ui/layout';
import { MemberQr } from '../../../components/ui/member-qr';
import { ApiError } from '../../../lib/api-client';
import { formatDate, formatDateTime, formatMoney } from '../../../lib/format';
import { showLength } from '../../../lib/units';
import { usePortalRink } from '../api/get-portal-rink';
import { BuyList } from '../components/buy-list';
import { CheckoutReturn } from '../components/checkout-return';
import { MembershipActions } from '../components/membership-actions';
import { PreferencesForm } from '../components/preferences-form';
import { SharpeningList } from '../components/sharpening-list';
import { Dotted } from '../components/dotted';
import { ShowMoreButton, useShowMore } from '../components/show-more';
import { credits, ENTRY_WORDS, LOT_DATE_WORDS, LOT_ORIGIN_WORDS, PAYMENT_WORDS, signed, SOURCE_WORDS } from '../components/words';

type Entry = PortalRinkDetail['entries'][number];

function Balance({ detail }: { detail: PortalRinkDetail }) {
  const { balance, rink } = detail;
  const lots = balance.lots.filter((l) => l.remaining > 0);
  return (
    <Card title="Credits">
      <p className="text-6xl font-extrabold tabular-nums">{balance.credits}</p>
      <p className="mt-1 text-sm text-ink-soft tabular-nums">
        <Dotted parts={[`Worth ${formatMoney(balance.valueMinor, balance.currency)}`, ...(detail.nextExpiry ? [`next expiry ${formatDate(detail.nextExpiry, rink.timeZone)}`] : [])]} />
      </p>
      {lots.length > 0 ? (
        <ul className="mt-4 divide-y divide-rule border-t border-rule">
          {lots.map((l) => (
            <li key={l.id} className="flex flex-wrap items-baseline justify-between gap-x-4 gap-y-1 py-2 text-sm">
              <span>
                <span className="font-semibold">{l.productName ?? LOT_ORIGIN_WORDS[l.origin]}</span>
                <span className="text-ink-soft tabular-nums">
                  {' · '}
                  <span className="whitespace-nowrap">
                    {LOT_DATE_WORDS[l.origin]} {formatDate(l.createdAt, rink.timeZone)}
                  </span>
                </span>
                {l.redeemable ? null : <span className="block font-semibold text-brick">Not usable now</span>}
              </span>
              <span className="tabular-nums">
                <Dotted
                  parts={[
                    `${l.remaining} of ${l.credits} left`,
                    `worth ${formatMoney(l.remainingValueMinor, balance.currency)}`,
                    l.expiresAt ? `expires ${formatDate(l.expiresAt, rink.timeZone)}` : 'no expiry date',
                  ]}
                />
              </span>
            </li>
          ))}
        </ul>
      ) : null}
    </Card>
  );
}

const FIRST_ENTRIES = 10;

/** A list rather than a table: on a phone the date, what happened and the credits still fit on one card's width. */
function History({ entries, timeZone }: { entries: Entry[]; timeZone: string }) {
  const more = useShowMore(entries, FIRST_ENTRIES);
  if (entries.length === 0) return <p className="text-ink-soft">No credits bought or used yet.</p>;
  return (
    <div className="space-y-3">
      <ul className="divide-y divide-rule">
        {more.shown.map((e) => (
          <li key={e.id} className="flex items-center justify-between gap-4 py-2">
            <div className="min-w-0 text-sm">
              <p>
                <span className="font-semibold">{ENTRY_WORDS[e.kind]}</span>
                <span className="text-ink-soft"> · {e.reason ?? SOURCE_WORDS[e.source]}</span>
              </p>
              <p className="text-ink-soft tabular-nums">
                <time dateTime={e.createdAt}>{formatDateTime(e.createdAt, timeZone)}</time>
              </p>
            </div>
            <span className="shrink-0 text-lg font-bold tabular-nums">
              {signed(e.credits)}
              <span className="sr-only"> {Math.abs(e.credits) === 1 ? 'credit' : 'credits'}</span>
            </span>
          </li>
        ))}
      </ul>
      <ShowMoreButton open={more.open} hidden={more.hidden} first={FIRST_ENTRIES} noun={['entry', 'entries']} onToggle={more.toggle} />
    </div>
  );
}

function Payments({ detail }: { detail: PortalRinkDetail }) {
  const tz = detail.rink.timeZone;
  if (detail.payments.length === 0) return <p className="text-ink-soft">No payments yet.</p>;
  return (
    <ul className="divide-y divide-rule">
      {detail.payments.map((p) => (
        <li key={p.id} className="py-2 text-sm">
          <div className="flex flex-wrap items-baseline justify-between gap-2">
            <span>
              <span className="font-semibold">{p.productName}</span>
              <span className="text-ink-soft tabular-nums">
                {' · '}
                <Dotted parts={[formatDate(p.paidAt ?? p.createdAt, tz), p.channel === 'online' ? 'online' : 'at the counter']} />
              </span>
            </span>
            <span className="tabular-nums">
              <Dotted parts={[formatMoney(p.amountMinor, p.currency), PAYMENT_WORDS[p.state]]} />
            </span>
          </div>
          {p.refunds.length > 0 ? (
            <ul className="mt-1 ml-4 space-y-1">
              {p.refunds.map((r) => (
                <li key={r.id} className="tabular-nums">
                  Refund {formatMoney(r.amountMinor, p.currency)} ({credits(r.credits)}) · {formatDate(r.createdAt, tz)}
                  {r.reason ? <span className="text-ink-soft"> · {r.reason}</span> : null}
                </li>
              ))}
            </ul>
          ) : null}
        </li>
      ))}
    </ul>
  );
}

/** The page exists; what is missing is the skater's record at this rink, so say that and where to go next. */
function NotLinked({ slug }: { slug: string }) {
  return (
    <div className="mx-auto max-w-lg px-4 py-16">
      <h1 className="text-2xl font-extrabold tracking-tight">You have no record at this rink yet</h1>
      <p className="mt-3 text-ink-soft">
        A rink links your account when your verified e-mail address matches the one the rink has for you. Give the counter this address, or buy credits with
        it on the rink’s own page.
      </p>
      <div className="mt-6 flex flex-wrap gap-2">
        <LinkButton to={`/r/${encodeURIComponent(slug)}`}>The rink’s page</LinkButton>
        <LinkButton to="/portal" tone="secondary">
          Back to My skates
        </LinkButton>
      </div>
    </div>
  );
}

export function Component() {
  const { slug = '' } = useParams();
  const [params] = useSearchParams();
  const sessionId = params.get('session');
  const query = usePortalRink(slug);

  if (query.isPending) return <Loading />;
  if (query.isError) {
    return query.error instanceof ApiError && query.error.status === 404 ? (
      <NotLinked slug={slug} />
    ) : (
      <div className="mx-auto max-w-5xl px-4 py-8">
        <Alert>{query.error.message}</Alert>
      </div>
    );
  }
  const detail = query.data;
  const { rink, customer } = detail;
  const unit = rink.unitPreference;
  return (
    <div className="mx-auto max-w-5xl space-y-6 px-4 py-8">
      <PageHeader
        title={rink.name}
        subtitle={
          <>
            {customer.name} ·{' '}
            <Link className="font-semibold text-steel underline" to="/portal">
              Back to My skates
            </Link>
          </>
        }
      />
      {sessionId ? <CheckoutReturn slug={slug} sessionId={sessionId} /> : null}
      <div className="grid items-start gap-6 md:grid-cols-[1fr_18rem]">
        <Balance detail={detail} />
        <Card title="Member code">
          <div className="flex flex-col items-center gap-2 text-center">
            <MemberQr code={customer.memberCode} size={160} />
            <p className="text-sm font-semibold">Show this at the counter.</p>
          </div>
        </Card>
      </div>
      {detail.memberships.length > 0 ? (
        <Card title="Memberships">
          <ul className="divide-y divide-rule">
            {detail.memberships.map((m) => (
              <li key={m.id} className="py-3 first:pt-0 last:pb-0">
                <MembershipActions slug={slug} membership={m} timeZone={rink.timeZone} />
              </li>
            ))}
          </ul>
        </Card>
      ) : null}
      <Card title="Buy credits">
        <BuyList slug={slug} products={detail.products} memberships={detail.memberships} />
      </Card>
      <Card title="Sharpenings">
        <p className="mb-4 rounded-lg border-l-4 border-amber bg-amber-50 px-3 py-2 text-sm font-medium">
          Freshly sharpened blades are sharp: carry skates with guards on and supervise children.
        </p>
        <SharpeningList sharpenings={detail.sharpenings} bands={detail.bands} unit={unit} timeZone={rink.timeZone} />
      </Card>
      <Card title="Skate profiles">
        {detail.profiles.length === 0 ? (
          <p className="text-ink-soft">The counter has no skate profile for you yet.</p>
        ) : (
          <ul className="divide-y divide-rule">
            {detail.profiles.map((p) => (
              <li key={p.id} className="py-2">
                <span className="font-semibold">{p.label}</span>
                <span className="tabular-nums">
                  {' · '}
                  <Dotted parts={[`blade ${showLength(p.bladeWidthNm, unit, 'width')}`, `hollow ${showLength(p.preferredHollowNm, unit, 'hollow')}`]} />
                </span>
                {p.notes ? <span className="block text-sm text-ink-soft">{p.notes}</span> : null}
              </li>
            ))}
          </ul>
        )}
      </Card>
      <Card title="Credit history">
        <History entries={detail.entries} timeZone={rink.timeZone} />
      </Card>
      <Card title="Payments">
        <Payments detail={detail} />
      </Card>
      <Card title="E-mail from this rink">
        <PreferencesForm slug={slug} preferences={detail.preferences} />
      </Card>
    </div>
  );
}
