import { useState } from 'react';
import { useParams } from 'react-router';
import type { PublicProduct } from '@rinkwright/core';
import { Button } from '../../../components/ui/button';
import { Alert, Loading } from '../../../components/ui/feedback';
import { Card } from '../../../components/ui/layout';
import { NotFound } from '../../../components/ui/not-found';
import { ApiError } from '../../../lib/api-client';
import { usePublicRink } from '../api/get-public-rink';
import { CheckoutForm } from '../components/checkout-form';
import { formatMoney } from '../../../lib/format';
import { productTerms } from '../components/product-terms';

const GROUPS: { kind: PublicProduct['kind']; title: string }[] = [
  { kind: 'punch_card', title: 'Punch cards' },
  { kind: 'membership', title: 'Memberships' },
  { kind: 'single', title: 'Single sharpenings' },
];

function ProductRow({ product, selling, onBuy }: { product: PublicProduct; selling: boolean; onBuy: () => void }) {
  return (
    <li className="flex flex-wrap items-center justify-between gap-3 py-3">
      <div className="min-w-0">
        <p className="font-bold">{product.name}</p>
        <p className="text-sm text-ink-soft tabular-nums">{productTerms(product)}</p>
        {product.description ? <p className="mt-1 text-sm">{product.description}</p> : null}
      </div>
      {/* On a phone the price and its button share their own full-width line, so every button lines up at the right. */}
      <div className="flex w-full items-center justify-between gap-3 sm:w-auto">
        <span className="text-lg font-bold tabular-nums">
          {formatMoney(product.price.amountMinor, product.price.currency)}
          {product.kind === 'membership' ? <span className="text-sm font-medium text-ink-soft"> / {product.interval === 'year' ? 'year' : 'month'}</span> : null}
        </span>
        {selling ? (
          <Button className="min-w-20" onClick={onBuy}>
            {product.kind === 'membership' ? 'Join' : 'Buy'}
            <span className="sr-only"> {product.name}</span>
          </Button>
        ) : null}
      </div>
    </li>
  );
}

export function Component() {
  const { slug = '' } = useParams();
  const page = usePublicRink(slug);
  const [buying, setBuying] = useState<PublicProduct | null>(null);

  if (page.isPending) return <Loading />;
  if (page.isError) {
    return page.error instanceof ApiError && page.error.status === 404 ? <NotFound message="No rink has this address." /> : <Alert>{page.error.message}</Alert>;
  }
  const { rink, products, selling } = page.data;
  return (
    <div>
      <section className="bg-ink text-frost">
        <div className="mx-auto max-w-4xl px-4 py-10">
          <p className="text-sm font-bold uppercase tracking-widest text-glacier">Skate sharpening</p>
          <h1 className="mt-2 text-3xl font-extrabold tracking-tight sm:text-4xl">{rink.name}</h1>
          <p className="mt-3 text-glacier">Prepaid sharpening credits. Credits are redeemed at the counter, one per standard sharpening.</p>
        </div>
      </section>
      <div className="mx-auto max-w-4xl space-y-6 px-4 py-8">
        {!selling ? <Alert tone="info">{rink.name} is not selling online yet. Ask at the sharpening counter.</Alert> : null}
        {buying ? (
          <Card title="Buy" className="max-w-lg">
            <CheckoutForm key={buying.id} slug={rink.slug} product={buying} onCancel={() => setBuying(null)} />
          </Card>
        ) : null}
        {products.length === 0 ? <p className="text-ink-soft">Nothing is offered online at the moment.</p> : null}
        {GROUPS.map(({ kind, title }) => {
          const own = products.filter((p) => p.kind === kind);
          if (own.length === 0) return null;
          return (
            <Card key={kind} title={title}>
              <ul className="divide-y divide-rule">
                {own.map((p) => (
                  <ProductRow
                    key={p.id}
                    product={p}
                    selling={selling}
                    onBuy={() => setBuying(p)}
                  />
                ))}
              </ul>
            </Card>
          );
        })}
      </div>
    </div>
  );
}
