import { useQueryClient } from '@tanstack/react-query';
import { useEffect, useState } from 'react';
import { Alert } from '../../../components/ui/feedback';
import { useCheckoutStatus } from '../api/get-checkout-status';
import { portalKeys } from '../api/keys';
import { formatMoney } from '../../../lib/format';
import { credits } from './words';

const GIVE_UP_MS = 60_000;

/** After the payment page sends the skater back here, wait for the confirmation and then show the new balance. */
export function CheckoutReturn({ slug, sessionId }: { slug: string; sessionId: string }) {
  const client = useQueryClient();
  const [waitedTooLong, setWaitedTooLong] = useState(false);
  useEffect(() => {
    const timer = window.setTimeout(() => setWaitedTooLong(true), GIVE_UP_MS);
    return () => window.clearTimeout(timer);
  }, []);
  const status = useCheckoutStatus(slug, sessionId, !waitedTooLong);
  const state = status.data?.state;
  useEffect(() => {
    if (state !== 'paid') return;
    void client.invalidateQueries({ queryKey: portalKeys.rink(slug) });
    void client.invalidateQueries({ queryKey: portalKeys.home() });
  }, [client, slug, state]);

  if (status.isError) return <Alert>{status.error.message}</Alert>;
  if (state === 'paid' && status.data) {
    return (
      <Alert tone="success">
        {credits(status.data.credits)} added — {status.data.productName} — {formatMoney(status.data.amountMinor, status.data.currency)}
      </Alert>
    );
  }
  if (state === 'failed') return <Alert>The payment did not go through, and no credits were added.</Alert>;
  return <Alert tone="info">{waitedTooLong ? 'Still waiting for the payment service; your credits appear as soon as it confirms.' : 'Confirming your payment…'}</Alert>;
}
