import { useState } from 'react';
import type { EntryRow, MembershipRow, PaymentRow, RinkSummary } from '@rinkwright/core';
import { Button } from '../../../components/ui/button';
import { Alert, Loading } from '../../../components/ui/feedback';
import { formatDate, formatDateTime, formatMoney } from '../../../lib/format';
import { can } from '../../../lib/rink-context';
import { useCancelMembership } from '../api/cancel-membership';
import { useLedger } from '../api/get-ledger';
import { RefundDialog } from './refund-dialog';
import { ENTRY_KIND_WORDS, ENTRY_SOURCE_WORDS, MEMBERSHIP_STATE_WORDS, PAYMENT_STATE_WORDS, signed } from './words';

const th = 'px-3 py-2 font-semibold text-ink-soft';
const td = 'px-3 py-2 align-middle';

function Entries({ rink, entries, currency }: { rink: RinkSummary; entries: EntryRow[]; currency: string }) {
  const byId = new Map(entries.map((e) => [e.id, e]));
  return (
    <div className="overflow-x-auto">
      <table className="w-full border-collapse text-left text-sm">
        <caption className="sr-only">Ledger entries, newest first</caption>
        <thead>
          <tr className="border-b border-rule">
            <th scope="col" className={th}>When</th>
            <th scope="col" className={th}>Entry</th>
            <th scope="col" className={`${th} text-right`}>Credits</th>
            <th scope="col" className={`${th} text-right`}>Value</th>
            <th scope="col" className={th}>Source</th>
            <th scope="col" className={th}>Reason</th>
            <th scope="col" className={th}>By</th>
          </tr>
        </thead>
        <tbody>
          {entries.map((e) => {
            const reversed = e.reversesId ? byId.get(e.reversesId) : undefined;
            return (
              <tr key={e.id} className="border-b border-rule/60 last:border-0">
                <td className={`${td} tabular-nums`}>{formatDateTime(e.createdAt, rink.timeZone)}</td>
                <td className={td}>
                  {ENTRY_KIND_WORDS[e.kind]}
                  {e.reversesId ? (
                    <span className="block text-ink-soft">
                      reverses {reversed ? `${ENTRY_KIND_WORDS[reversed.kind].toLowerCase()} of ${formatDateTime(reversed.createdAt, rink.timeZone)} (${signed(reversed.credits)})` : 'an earlier entry'}
                    </span>
                  ) : null}
                </td>
                <td className={`${td} text-right font-semibold tabular-nums`}>{signed(e.credits)}</td>
                <td className={`${td} text-right tabular-nums`}>{formatMoney(e.valueMinor, currency)}</td>
                <td className={td}>{ENTRY_SOURCE_WORDS[e.source]}</td>
                <td className={td}>{e.reason ?? '—'}</td>
                <td className={td}>{e.actor ?? '—'}</td>
              </tr>
            );
          })}
          {entries.length === 0 ? (
            <tr>
              <td colSpan={7} className="px-3 py-6 text-center text-ink-soft">
                No ledger entries yet.
              </td>
            </tr>
          ) : null}
        </tbody>
      </table>
    </div>
  );
}

function Payments({ rink, customerId, payments }: { rink: RinkSummary; customerId: string; payments: PaymentRow[] }) {
  const [refunding, setRefunding] = useState<PaymentRow | null>(null);
  const [note, setNote] = useState('');
  const canRefund = can(rink, 'sale', 'refund');
  return (
    <div className="space-y-3">
      {note ? <Alert tone="success">{note}</Alert> : null}
      <ul className="divide-y divide-rule">
        {payments.map((p) => (
          <li key={p.id} className="py-2">
            <div className="flex flex-wrap items-center justify-between gap-3">
              <span>
                <span className="font-semibold">{p.productName}</span> · {p.channel === 'counter' ? 'at the counter' : 'online'} · {PAYMENT_STATE_WORDS[p.state]}
                <span className="block text-sm text-ink-soft tabular-nums">
                  {formatMoney(p.amountMinor, p.currency)}
                  {p.refundedMinor > 0 ? ` · ${formatMoney(p.refundedMinor, p.currency)} refunded` : ''} · {formatDateTime(p.paidAt ?? p.createdAt, rink.timeZone)}
                </span>
              </span>
              {canRefund && (p.state === 'paid' || p.state === 'partially_refunded') ? (
                <Button
                  tone="danger"
                  aria-label={`Refund ${p.productName} of ${formatDateTime(p.paidAt ?? p.createdAt, rink.timeZone)}`}
                  onClick={() => {
                    setNote('');
                    setRefunding(p);
                  }}
                >
                  Refund
                </Button>
              ) : null}
            </div>
            {p.refunds.length > 0 ? (
              <ul className="mt-1 space-y-1 pl-4 text-sm">
                {p.refunds.map((r) => (
                  <li key={r.id} className="tabular-nums">
                    Refund {formatMoney(r.amountMinor, p.currency)}, {r.credits} credit{r.credits === 1 ? '' : 's'} removed · {formatDateTime(r.createdAt, rink.timeZone)}
                    {r.reason ? ` · ${r.reason}` : ''}
                  </li>
                ))}
              </ul>
            ) : null}
          </li>
        ))}
        {payments.length === 0 ? <li className="py-2 text-ink-soft">No payments yet.</li> : null}
      </ul>
      {refunding ? (
        <RefundDialog
          slug={rink.slug}
          customerId={customerId}
          payment={refunding}
          onClose={(done) => {
            setRefunding(null);
            if (done) setNote(done);
          }}
        />
      ) : null}
    </div>
  );
}

function Memberships({ rink, customerId, memberships }: { rink: RinkSummary; customerId: string; memberships: MembershipRow[] }) {
  const cancel = useCancelMembership(rink.slug, customerId);
  const [problem, setProblem] = useState('');
  const canCancel = can(rink, 'sale', 'refund');
  async function cancelIt(m: MembershipRow, when: 'now' | 'period_end') {
    setProblem('');
    try {
      await cancel.mutateAsync({ membershipId: m.id, when });
    } catch (error) {
      setProblem(error instanceof Error ? error.message : 'Not canceled');
    }
  }
  if (memberships.length === 0) return <p className="text-ink-soft">No memberships.</p>;
  return (
    <div className="space-y-3">
      <Alert>{problem}</Alert>
      <ul className="divide-y divide-rule">
        {memberships.map((m) => (
          <li key={m.id} className="flex flex-wrap items-center justify-between gap-3 py-2">
            <span>
              <span className="font-semibold">{m.productName}</span> · {MEMBERSHIP_STATE_WORDS[m.state]}
              <span className="block text-sm text-ink-soft tabular-nums">
                {m.creditsPerPeriod} credits per {m.interval ?? 'period'}
                {m.periodEnd ? ` · period ends ${formatDate(m.periodEnd, rink.timeZone)}` : ''}
                {m.cancelAtPeriodEnd ? ' · cancels at period end' : ''}
                {m.graceUntil ? ` · grace until ${formatDate(m.graceUntil, rink.timeZone)}` : ''}
              </span>
            </span>
            {canCancel && m.state !== 'canceled' ? (
              <span className="flex flex-wrap gap-2">
                {!m.cancelAtPeriodEnd ? (
                  <Button tone="secondary" busy={cancel.isPending} onClick={() => void cancelIt(m, 'period_end')}>
                    Cancel at period end
                  </Button>
                ) : null}
                <Button tone="danger" busy={cancel.isPending} onClick={() => void cancelIt(m, 'now')}>
                  Cancel now
                </Button>
              </span>
            ) : null}
          </li>
        ))}
      </ul>
    </div>
  );
}

/** The customer's ledger: every entry, every payment with its refunds, and their memberships. */
export function CreditHistory({ rink, customerId }: { rink: RinkSummary; customerId: string }) {
  const ledger = useLedger(rink.slug, customerId);
  if (ledger.isPending) return <Loading label="Reading the ledger…" />;
  if (ledger.isError) return <Alert>{ledger.error.message}</Alert>;
  const { entries, payments, memberships } = ledger.data;
  return (
    <div className="space-y-6">
      <section aria-label="Memberships">
        <h3 className="mb-2 font-bold">Memberships</h3>
        <Memberships rink={rink} customerId={customerId} memberships={memberships} />
      </section>
      <section aria-label="Payments">
        <h3 className="mb-2 font-bold">Payments</h3>
        <Payments rink={rink} customerId={customerId} payments={payments} />
      </section>
      <section aria-label="Ledger entries">
        <h3 className="mb-2 font-bold">Ledger</h3>
        <Entries rink={rink} entries={entries} currency={payments[0]?.currency ?? rink.currency} />
      </section>
    </div>
  );
}
