import type { ColumnDef } from '@tanstack/react-table';
import { useMemo, useRef, useState } from 'react';
import { PRODUCT_KIND_LABELS, type ProductRow } from '@rinkwright/core';
import { Button } from '../../../components/ui/button';
import { DataTable } from '../../../components/ui/data-table';
import { Alert, Loading } from '../../../components/ui/feedback';
import { Card, PageHeader } from '../../../components/ui/layout';
import { NotFound } from '../../../components/ui/not-found';
import { formatDate, formatMoney } from '../../../lib/format';
import { can, useRink } from '../../../lib/rink-context';
import { useCreateProduct } from '../api/create-product';
import { useProducts } from '../api/get-products';
import { useUpdateProduct } from '../api/update-product';
import { CreditSummaryPanel } from '../components/credit-summary';
import { ProductForm } from '../components/product-form';
import { validityWords } from '../components/words';

function PriceHistory({ product, timeZone }: { product: ProductRow; timeZone: string }) {
  return (
    <section aria-label="Price history" className="mt-6">
      <h3 className="mb-2 font-bold">Price history</h3>
      <ul className="divide-y divide-rule text-sm">
        {product.priceHistory.map((p) => (
          <li key={p.id} className="flex justify-between gap-3 py-2 tabular-nums">
            <span className="font-semibold">{formatMoney(p.amountMinor, p.currency)}</span>
            <span className="text-ink-soft">
              from {formatDate(p.createdAt, timeZone)}
              {p.retiredAt ? ` to ${formatDate(p.retiredAt, timeZone)}` : ' · current'}
            </span>
          </li>
        ))}
      </ul>
    </section>
  );
}

export function Component() {
  const rink = useRink();
  const products = useProducts(rink.slug);
  const create = useCreateProduct(rink.slug);
  const update = useUpdateProduct(rink.slug);
  const manage = can(rink, 'product', 'manage');
  const [editing, setEditing] = useState<ProductRow | null>(null);
  const [note, setNote] = useState<{ tone: 'error' | 'success'; text: string } | null>(null);
  const formCard = useRef<HTMLDivElement>(null);

  const columns = useMemo<ColumnDef<ProductRow, unknown>[]>(() => {
    async function setActive(p: ProductRow, active: boolean) {
      setNote(null);
      try {
        await update.mutateAsync({ productId: p.id, change: { active } });
        setNote({ tone: 'success', text: active ? `${p.name} is on sale again.` : `${p.name} is no longer sold; credits already sold stay valid.` });
      } catch (error) {
        setNote({ tone: 'error', text: error instanceof Error ? error.message : 'Not saved' });
      }
    }
    const base: ColumnDef<ProductRow, unknown>[] = [
      { accessorKey: 'kind', header: 'Kind', cell: ({ row }) => PRODUCT_KIND_LABELS[row.original.kind] },
      { accessorKey: 'name', header: 'Product', cell: ({ row }) => <span className="font-semibold">{row.original.name}</span> },
      { accessorKey: 'credits', header: () => <span className="block text-right">Credits</span>, cell: ({ row }) => <span className="block text-right tabular-nums">{row.original.credits}</span> },
      {
        id: 'price',
        accessorFn: (p) => p.price.amountMinor,
        header: () => <span className="block text-right">Price</span>,
        cell: ({ row }) => <span className="block text-right tabular-nums">{formatMoney(row.original.price.amountMinor, row.original.price.currency)}</span>,
      },
      { id: 'validity', header: 'Validity', enableSorting: false, cell: ({ row }) => validityWords(row.original) },
      { accessorKey: 'listed', header: 'Listed', cell: ({ row }) => (row.original.listed ? 'Yes' : 'No') },
      { accessorKey: 'active', header: 'On sale', cell: ({ row }) => (row.original.active ? 'Yes' : <span className="text-ink-soft">No (stopped)</span>) },
      { accessorKey: 'synced', header: 'On payout account', cell: ({ row }) => (row.original.synced ? 'Yes' : <span className="text-ink-soft">No</span>) },
    ];
    if (!manage) return base;
    return [
      ...base,
      {
        id: 'actions',
        header: () => <span className="sr-only">Actions</span>,
        enableSorting: false,
        cell: ({ row }) => (
          <span className="flex gap-1">
            <Button
              tone="secondary"
              aria-label={`Change ${row.original.name}`}
              onClick={() => {
                setNote(null);
                setEditing(row.original);
                formCard.current?.scrollIntoView({ behavior: 'smooth', block: 'start' });
              }}
            >
              Change
            </Button>
            <Button tone="quiet" aria-label={`${row.original.active ? 'Stop selling' : 'Resume selling'} ${row.original.name}`} onClick={() => void setActive(row.original, !row.original.active)}>
              {row.original.active ? 'Stop selling' : 'Resume selling'}
            </Button>
          </span>
        ),
      },
    ];
  }, [manage, update]);

  if (!can(rink, 'product', 'read')) return <NotFound />;
  const current = editing ? (products.data?.products.find((p) => p.id === editing.id) ?? editing) : null;

  return (
    <div className="space-y-6">
      <PageHeader title="Products" subtitle={`Punch cards, memberships, league packs and single sharpenings, priced in ${rink.currency}.`} />
      {note ? <Alert tone={note.tone}>{note.text}</Alert> : null}
      {/* Side by side only where the table keeps room for its nine columns; on a tablet the form sits below it. */}
      <div className={manage ? 'grid items-start gap-6 xl:grid-cols-[minmax(0,1fr)_26rem]' : ''}>
        <Card title="What the rink sells">
          {products.isPending ? (
            <Loading />
          ) : products.isError ? (
            <Alert>{products.error.message}</Alert>
          ) : (
            <DataTable data={products.data.products} columns={columns} caption="Products of the rink" empty="No products yet: add a punch card first." />
          )}
        </Card>
        {manage ? (
          <div ref={formCard} className="scroll-mt-4">
            {current ? (
              <Card title={`Change ${current.name}`}>
                <ProductForm
                  key={current.id}
                  product={current}
                  currency={rink.currency}
                  save={(input) => update.mutateAsync({ productId: current.id, change: { input } })}
                  onDone={(saved) => {
                    setEditing(null);
                    setNote({ tone: 'success', text: `${saved.name} saved.` });
                  }}
                />
                <Button tone="quiet" className="mt-2" onClick={() => setEditing(null)}>
                  Cancel
                </Button>
                <PriceHistory product={current} timeZone={rink.timeZone} />
              </Card>
            ) : (
              <Card title="Add a product">
                <ProductForm key="new" product={null} currency={rink.currency} save={(input) => create.mutateAsync(input)} />
              </Card>
            )}
          </div>
        ) : null}
      </div>
      {manage ? (
        <Card title="Credits owed to skaters">
          <CreditSummaryPanel slug={rink.slug} rinkCurrency={rink.currency} />
        </Card>
      ) : null}
    </div>
  );
}
