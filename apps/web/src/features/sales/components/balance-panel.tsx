import type { ColumnDef } from '@tanstack/react-table';
import { useMemo, useState } from 'react';
import type { LotRow, RinkSummary } from '@rinkwright/core';
import { Button } from '../../../components/ui/button';
import { DataTable } from '../../../components/ui/data-table';
import { Alert, Loading } from '../../../components/ui/feedback';
import { formatCount, formatDate, formatMoney } from '../../../lib/format';
import { can } from '../../../lib/rink-context';
import { useBalance } from '../api/get-balance';
import { useRedeemCredit } from '../api/redeem-credit';
import { LOT_ORIGIN_WORDS } from './words';

function whyNot(lot: LotRow): string {
  if (lot.redeemable) return 'Yes';
  // A lot at zero may have been redeemed, refunded or adjusted away: the ledger below says which.
  if (lot.remaining === 0) return 'No: none left';
  if (lot.expiresAt && new Date(lot.expiresAt) <= new Date()) return 'No: expired';
  return 'No: membership payment failed and its grace ran out';
}

/** The skater's balance in one big number, the lots it is made of, and the redeem button. */
export function BalancePanel({ rink, customerId, customerName }: { rink: RinkSummary; customerId: string; customerName: string }) {
  const balance = useBalance(rink.slug, customerId);
  const redeem = useRedeemCredit(rink.slug, customerId);
  // A note that states a balance is shown only while that balance stands; a later sale or refund makes it stale.
  const [note, setNote] = useState<{ tone: 'error' | 'success' | 'info'; text: string; balance?: number } | null>(null);
  const currency = balance.data?.currency ?? rink.currency;

  const columns = useMemo<ColumnDef<LotRow, unknown>[]>(
    () => [
      { accessorKey: 'origin', header: 'Origin', cell: ({ row }) => LOT_ORIGIN_WORDS[row.original.origin] },
      { accessorKey: 'productName', header: 'Product', cell: ({ row }) => row.original.productName ?? '—' },
      {
        id: 'remaining',
        accessorFn: (l) => l.remaining,
        header: () => <span className="block text-right">Left / credits</span>,
        cell: ({ row }) => (
          <span className="block text-right tabular-nums">
            {row.original.remaining} / {row.original.credits}
          </span>
        ),
      },
      { accessorKey: 'expiresAt', header: 'Expires', cell: ({ row }) => (row.original.expiresAt ? formatDate(row.original.expiresAt, rink.timeZone) : 'No expiry') },
      {
        accessorKey: 'remainingValueMinor',
        header: () => <span className="block text-right">Value left</span>,
        cell: ({ row }) => <span className="block text-right tabular-nums">{formatMoney(row.original.remainingValueMinor, currency)}</span>,
      },
      { id: 'redeemable', header: 'Redeemable', enableSorting: false, cell: ({ row }) => <span className={row.original.redeemable ? '' : 'text-ink-soft'}>{whyNot(row.original)}</span> },
    ],
    [currency, rink.timeZone],
  );

  async function redeemOne() {
    setNote(null);
    try {
      const outcome = await redeem.mutateAsync(`Redeem one credit for ${customerName}`);
      setNote(
        outcome.queued
          ? { tone: 'info', text: 'Saved on this tablet: the credit is redeemed as soon as the connection is back.' }
          : { tone: 'success', text: `One credit redeemed. ${formatCount(outcome.result.balance)} left.`, balance: outcome.result.balance },
      );
    } catch (error) {
      // The API says why (no credits, or a membership whose grace ran out and whose credits wait for its payment).
      setNote({ tone: 'error', text: error instanceof Error ? error.message : 'Not redeemed' });
    }
  }

  if (balance.isPending) return <Loading label="Reading the credits…" />;
  if (balance.isError) return <Alert>{balance.error.message}</Alert>;
  const b = balance.data;
  return (
    <div className="space-y-4">
      <div className="flex flex-wrap items-end justify-between gap-4">
        <dl>
          <dt className="text-sm font-medium text-ink-soft">Credits to use</dt>
          <dd className="text-5xl font-extrabold tabular-nums" data-testid="credit-balance">
            {formatCount(b.credits)}
          </dd>
          <dd className="text-sm text-ink-soft tabular-nums">worth {formatMoney(b.valueMinor, b.currency)}</dd>
        </dl>
        {can(rink, 'credit', 'redeem') ? (
          <Button busy={redeem.isPending} onClick={() => void redeemOne()}>
            {redeem.isPending ? 'Redeeming…' : 'Redeem one credit'}
          </Button>
        ) : null}
      </div>
      {note && (note.balance === undefined || note.balance === b.credits) ? <Alert tone={note.tone}>{note.text}</Alert> : null}
      <DataTable data={b.lots} columns={columns} caption="Credit lots, the one that expires first is used first" empty="No credit lots yet." />
    </div>
  );
}
