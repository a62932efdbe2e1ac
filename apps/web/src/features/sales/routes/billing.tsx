import { useEffect, useRef, useState } from 'react';
import { useSearchParams } from 'react-router';
import type { BillingResponse } from '@rinkwright/core';
import { Button } from '../../../components/ui/button';
import { Alert, Loading } from '../../../components/ui/feedback';
import { Card, PageHeader, Stat } from '../../../components/ui/layout';
import { NotFound } from '../../../components/ui/not-found';
import { formatMoney } from '../../../lib/format';
import { can, useRink } from '../../../lib/rink-context';
import { useBilling } from '../api/get-billing';
import { useRefreshPayoutAccount } from '../api/refresh-payout-account';
import { useStartOnboarding } from '../api/start-onboarding';
import { useStartPlan } from '../api/start-plan';
import { feePercent, planWords } from '../components/plan-words';
import { TestClock } from '../components/test-clock';

const payoutWords = (p: BillingResponse['payout']) =>
  !p.connected ? 'Not connected: the rink cannot sell online or by card yet.' : p.chargesEnabled ? 'Connected and taking payments.' : 'Connected, but the payment service still needs details before it can take payments.';

/** The browser leaves for the payment service's page, and comes back here when the person is done. */
function useGoTo() {
  const [problem, setProblem] = useState('');
  const go = async (start: () => Promise<{ url: string }>) => {
    setProblem('');
    try {
      const { url } = await start();
      window.location.assign(url);
    } catch (error) {
      setProblem(error instanceof Error ? error.message : 'The payment service did not answer');
    }
  };
  return { go, problem };
}

export function Component() {
  const rink = useRink();
  const manage = can(rink, 'billing', 'manage');
  const billing = useBilling(rink.slug, can(rink, 'billing', 'read'));
  const onboarding = useStartOnboarding(rink.slug);
  const plan = useStartPlan(rink.slug);
  const refresh = useRefreshPayoutAccount(rink.slug);
  const payoutNav = useGoTo();
  const planNav = useGoTo();
  const [params, setParams] = useSearchParams();
  const [returned, setReturned] = useState<{ tone: 'error' | 'success' | 'info'; text: string } | null>(null);
  const asked = useRef(false);

  // Back from onboarding: the account's state is read again once, then the marker leaves the address.
  useEffect(() => {
    if (asked.current) return;
    if (params.get('onboarded') === '1' && manage) {
      asked.current = true;
      refresh.mutate(undefined, {
        onSuccess: (b) => setReturned({ tone: b.payout.chargesEnabled ? 'success' : 'info', text: `Back from the payment service. ${payoutWords(b.payout)}` }),
        onError: (error) => setReturned({ tone: 'error', text: error.message }),
      });
      setParams({}, { replace: true });
    } else if (params.get('plan') === 'started') {
      asked.current = true;
      setReturned({ tone: 'info', text: 'Checkout finished. The plan shows as active as soon as the payment service confirms the payment.' });
      setParams({}, { replace: true });
    }
  }, [params, setParams, manage, refresh]);

  if (!can(rink, 'billing', 'read')) return <NotFound />;
  return (
    <div className="space-y-6">
      <PageHeader title="Billing" subtitle="The rink's payout account, where sales are paid out, and its Rinkwright plan." />
      {returned ? <Alert tone={returned.tone}>{returned.text}</Alert> : null}
      {billing.isPending ? (
        <Loading />
      ) : billing.isError ? (
        <Alert>{billing.error.message}</Alert>
      ) : (
        <>
          <Card title="Payout account">
            <p className="mb-3">{payoutWords(billing.data.payout)}</p>
            {billing.data.payout.accountId ? <p className="mb-3 text-sm text-ink-soft">Account {billing.data.payout.accountId}</p> : null}
            <Alert>{payoutNav.problem}</Alert>
            {manage && !billing.data.payout.chargesEnabled ? (
              <Button busy={onboarding.isPending || refresh.isPending} onClick={() => void payoutNav.go(() => onboarding.mutateAsync())}>
                {billing.data.payout.connected ? 'Finish connecting' : 'Connect payout account'}
              </Button>
            ) : null}
            {!manage && !billing.data.payout.chargesEnabled ? <p className="text-sm text-ink-soft">The rink's owner connects the payout account.</p> : null}
          </Card>
          <Card title="Rinkwright plan">
            <p className="mb-4 text-lg font-bold" data-testid="plan-state">
              {planWords(billing.data.plan, rink.timeZone)}
            </p>
            <dl className="mb-4 grid gap-3 sm:grid-cols-2 lg:grid-cols-4">
              <Stat label="Stations billed" value={billing.data.plan.stations} />
              <Stat label="Active stations" value={billing.data.plan.activeStations} />
              <Stat label="Per station per month" value={formatMoney(billing.data.plan.pricePerStationMinor, billing.data.plan.currency)} />
              <Stat label="Fee on sales" value={feePercent(billing.data.plan.feeBps)} />
            </dl>
            <Alert>{planNav.problem}</Alert>
            {manage && ['none', 'canceled', 'read_only', 'past_due'].includes(billing.data.plan.state) ? (
              <Button busy={plan.isPending} onClick={() => void planNav.go(() => plan.mutateAsync())}>
                {billing.data.plan.state === 'past_due' || billing.data.plan.state === 'read_only' ? 'Pay the plan with another card' : 'Start plan'}
              </Button>
            ) : null}
          </Card>
          {billing.data.testMode && manage ? (
            <Card title="Test clock">
              <TestClock slug={rink.slug} />
            </Card>
          ) : null}
        </>
      )}
    </div>
  );
}
