import { useEffect, useState } from 'react';
import type { PublicProduct } from '@rinkwright/core';
import { Button } from '../../../components/ui/button';
import { Alert } from '../../../components/ui/feedback';
import { useStartPortalCheckout } from '../api/start-checkout';
import { formatMoney } from '../../../lib/format';
import { productTerms } from './words';

/** Punch cards and memberships the skater can buy for themselves; payment happens on the payment service's page. */
export function BuyList({ slug, products }: { slug: string; products: PublicProduct[] }) {
  const start = useStartPortalCheckout(slug);
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

  if (products.length === 0) return <p className="text-ink-soft">This rink sells nothing online at the moment.</p>;
  return (
    <div className="space-y-3">
      <Alert>{problem}</Alert>
      <ul className="divide-y divide-rule">
        {products.map((p) => (
          <li key={p.id} className="flex flex-wrap items-center justify-between gap-3 py-3">
            <div>
              <p className="font-bold">{p.name}</p>
              <p className="text-sm text-ink-soft tabular-nums">{productTerms(p)}</p>
            </div>
            <div className="flex items-center gap-3">
              <span className="font-bold tabular-nums">{formatMoney(p.price.amountMinor, p.price.currency)}</span>
              <Button onClick={() => void buy(p.id)} busy={leaving === p.id} disabled={leaving !== null}>
                {p.kind === 'membership' ? 'Join' : 'Buy'}
                <span className="sr-only"> {p.name}</span>
              </Button>
            </div>
          </li>
        ))}
      </ul>
      <p className="text-sm text-ink-soft">Credits are redeemed at the counter, one per standard sharpening.</p>
    </div>
  );
}
