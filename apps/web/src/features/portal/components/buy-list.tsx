import { useEffect, useState } from 'react';
import type { MembershipRow, PublicProduct } from '@rinkwright/core';
import { Button } from '../../../components/ui/button';
import { Alert } from '../../../components/ui/feedback';
import { useSelling } from '../api/get-selling';
import { useStartPortalCheckout } from '../api/start-checkout';
import { formatMoney } from '../../../lib/format';
import { productTerms } from './words';

/** Punch cards and memberships the skater can buy for themselves; payment happens on the payment service's page. */
export function BuyList({ slug, products, memberships }: { slug: string; products: PublicProduct[]; memberships: MembershipRow[] }) {
  const start = useStartPortalCheckout(slug);
  const selling = useSelling(slug);
  const [problem, setProblem] = useState('');
  const [leaving, setLeaving] = useState<string | null>(null);
  useEffect(() => {
    // Coming back with the browser's Back button restores this page as it was left, busy button included.
    const restored = (event: PageTransitionEvent) => event.persisted && setLeaving(null);
    window.addEventListener('pageshow', restored);
    return () => window.removeEventListener('pageshow', restored);
  }, []);

  async function buy(productId: string) {
    setProblem('');
    setLeaving(productId);
    try {
      const { url } = await start.mutateAsync(productId);
      window.location.assign(url);
    } catch (error) {
      setLeaving(null);
      setProblem(error instanceof Error ? error.message : 'The checkout could not be started.');
    }
  }

  // A second subscription to the same membership would charge twice a month; the row names its product only by name.
  const member = (p: PublicProduct) => p.kind === 'membership' && memberships.some((m) => m.productName === p.name && m.state !== 'canceled');

  if (products.length === 0) return <p className="text-ink-soft">This rink sells nothing online at the moment.</p>;
  // Until the rink can take payments, a Buy button would only lead to an error; the prices still help at the counter.
  const online = selling.data !== false;
  return (
    <div className="space-y-3">
      <Alert>{problem}</Alert>
      {online ? null : <Alert tone="info">This rink does not sell online yet: these are bought at the sharpening counter.</Alert>}
      <ul className="divide-y divide-rule">
        {products.map((p) => (
          <li key={p.id} className="flex flex-wrap items-center justify-between gap-3 py-3">
            <div>
              <p className="font-bold">{p.name}</p>
              <p className="text-sm text-ink-soft tabular-nums">{productTerms(p)}</p>
            </div>
            {/* On a phone the price and its button share their own full-width line, so every button lines up at the right. */}
            <div className="flex w-full items-center justify-between gap-3 sm:w-auto">
              <span className="font-bold tabular-nums">
                {formatMoney(p.price.amountMinor, p.price.currency)}
                {p.kind === 'membership' ? <span className="text-sm font-medium text-ink-soft"> / {p.interval === 'year' ? 'year' : 'month'}</span> : null}
              </span>
              {!online ? null : member(p) ? (
                <span className="flex min-h-11 items-center text-sm font-semibold">You are a member</span>
              ) : (
                <Button className="min-w-20" onClick={() => void buy(p.id)} busy={leaving === p.id} disabled={leaving !== null}>
                  {p.kind === 'membership' ? 'Join' : 'Buy'}
                  <span className="sr-only"> {p.name}</span>
                </Button>
              )}
            </div>
          </li>
        ))}
      </ul>
      <p className="text-sm text-ink-soft">Credits are redeemed at the counter, one per standard sharpening.</p>
    </div>
  );
}
