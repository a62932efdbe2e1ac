import type { ColumnDef } from '@tanstack/react-table';
import { useMemo } from 'react';
import type { CreditSummary } from '@rinkwright/core';
import { DataTable } from '../../../components/ui/data-table';
import { Alert, Loading } from '../../../components/ui/feedback';
import { Stat } from '../../../components/ui/layout';
import { formatCount, formatMoney } from '../../../lib/format';
import { useCreditSummary } from '../api/get-credit-summary';

type ProductLine = CreditSummary['byProduct'][number];

/** Credits sold and not yet used are owed to skaters: what is outstanding, what it is worth, and the last 30 days. */
export function CreditSummaryPanel({ slug, rinkCurrency }: { slug: string; rinkCurrency: string }) {
  const summary = useCreditSummary(slug);
  const currency = summary.data?.currency ?? rinkCurrency;
  const columns = useMemo<ColumnDef<ProductLine, unknown>[]>(
    () => [
      { accessorKey: 'productName', header: 'Product' },
      { accessorKey: 'credits', header: () => <span className="block text-right">Credits</span>, cell: ({ row }) => <span className="block text-right tabular-nums">{formatCount(row.original.credits)}</span> },
      {
        accessorKey: 'valueMinor',
        header: () => <span className="block text-right">Value</span>,
        cell: ({ row }) => <span className="block text-right tabular-nums">{formatMoney(row.original.valueMinor, currency)}</span>,
      },
    ],
    [currency],
  );
  if (summary.isPending) return <Loading />;
  if (summary.isError) return <Alert>{summary.error.message}</Alert>;
  const s = summary.data;
  const d = s.last30Days;
  return (
    <div className="space-y-4">
      <p className="text-sm text-ink-soft">
        Credits sold and not yet used are still owed to skaters. Their value is deferred revenue until they are redeemed, expire (breakage) or are refunded.
      </p>
      <dl className="grid gap-3 sm:grid-cols-2">
        <Stat label="Outstanding credits" value={formatCount(s.outstandingCredits)} />
        <Stat label="Deferred revenue" value={formatMoney(s.deferredRevenueMinor, s.currency)} />
      </dl>
      <DataTable data={s.byProduct} columns={columns} caption="Outstanding credits by product" empty="No credits outstanding." />
      <h3 className="font-bold">Last 30 days</h3>
      <dl className="grid gap-3 sm:grid-cols-2 lg:grid-cols-4">
        <Stat label="Sold" value={formatMoney(d.soldMinor, s.currency)} />
        <Stat label="Credits redeemed" value={formatCount(d.redeemedCredits)} />
        <Stat label="Breakage (expired)" value={<>{formatCount(d.breakageCredits)} <span className="text-base font-semibold">· {formatMoney(d.breakageMinor, s.currency)}</span></>} />
        <Stat label="Refunded" value={formatMoney(d.refundedMinor, s.currency)} />
      </dl>
    </div>
  );
}
