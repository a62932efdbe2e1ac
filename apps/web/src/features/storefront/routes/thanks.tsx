import { useEffect, useState } from 'react';
import { Link, useParams, useSearchParams } from 'react-router';
import { LinkButton } from '../../../components/ui/button';
import { Alert } from '../../../components/ui/feedback';
import { NarrowPage } from '../../../components/ui/layout';
import { useMe } from '../../../lib/session';
import { useCheckoutStatus } from '../api/get-checkout-status';
import { formatMoney } from '../../../lib/format';

// The payment service confirms by webhook, which may land a moment after the skater is sent back here.
const GIVE_UP_MS = 60_000;

export function Component() {
  const { slug = '' } = useParams();
  const [params] = useSearchParams();
  const sessionId = params.get('session') ?? '';
  const { data: me } = useMe();
  const [waitedTooLong, setWaitedTooLong] = useState(false);
  useEffect(() => {
    const timer = window.setTimeout(() => setWaitedTooLong(true), GIVE_UP_MS);
    return () => window.clearTimeout(timer);
  }, []);
  const status = useCheckoutStatus(slug, sessionId, !waitedTooLong);
  const state = status.data?.state;

  return (
    <NarrowPage
      title={state === 'paid' ? 'Thank you' : state === 'failed' ? 'The payment did not go through' : 'Confirming your payment'}
      footer={
        <Link className="font-semibold text-steel underline" to={`/r/${encodeURIComponent(slug)}`}>
          Back to the rink’s page
        </Link>
      }
    >
      <div className="space-y-4" aria-live="polite">
        {sessionId === '' ? (
          <Alert>This address has no checkout in it. If you paid, your credits appear in your account at the rink once the payment service confirms.</Alert>
        ) : status.isError ? (
          <Alert>{status.error.message}</Alert>
        ) : state === 'paid' && status.data ? (
          <>
            <p className="text-2xl font-extrabold tabular-nums">
              {status.data.credits} {status.data.credits === 1 ? 'credit' : 'credits'} added
            </p>
            <p className="tabular-nums">
              {status.data.productName} — {formatMoney(status.data.amountMinor, status.data.currency)}
            </p>
            <p className="text-sm text-ink-soft">Credits are redeemed at the counter, one per standard sharpening. A receipt is on its way by e-mail.</p>
          </>
        ) : state === 'failed' && status.data ? (
          <Alert>Your payment for {status.data.productName} was not taken, and no credits were added. You can try again from the rink’s page.</Alert>
        ) : waitedTooLong ? (
          <Alert tone="info">Still waiting for the payment service; your credits appear as soon as it confirms.</Alert>
        ) : (
          <p role="status" className="text-ink-soft">
            Waiting for the payment service to confirm…
          </p>
        )}
        {state === 'paid' || waitedTooLong ? (
          me ? (
            <LinkButton to="/portal" className="w-full">
              See your credits in My skates
            </LinkButton>
          ) : (
            <div className="space-y-2">
              <p className="text-sm">Create an account with the same e-mail address (or sign in) to see your credits, history and readings.</p>
              <div className="flex flex-wrap gap-2">
                <LinkButton to={`/sign-up?next=${encodeURIComponent('/portal')}`}>Create an account</LinkButton>
                <LinkButton to={`/sign-in?next=${encodeURIComponent('/portal')}`} tone="secondary">
                  Sign in
                </LinkButton>
              </div>
            </div>
          )
        ) : null}
      </div>
    </NarrowPage>
  );
}
