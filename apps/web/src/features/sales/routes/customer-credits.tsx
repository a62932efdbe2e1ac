import { useOutletContext } from 'react-router';
import type { RinkSummary } from '@rinkwright/core';
import { Card } from '../../../components/ui/layout';
import { can } from '../../../lib/rink-context';
import { AdjustForm } from '../components/adjust-form';
import { BalancePanel } from '../components/balance-panel';
import { CounterSaleForm } from '../components/counter-sale-form';
import { CreditHistory } from '../components/credit-history';

/** What the customer page hands to the panel nested in it (the router composes the two features). */
export interface CustomerOutlet {
  rink: RinkSummary;
  customer: { id: string; name: string };
}

/** The credits part of the customer page: balance and lots, redeem, adjust, sell, and the history with refunds. */
export function Component() {
  const { rink, customer } = useOutletContext<CustomerOutlet>();
  if (!can(rink, 'credit', 'read')) return null;
  return (
    <>
      <Card title="Credits">
        <BalancePanel rink={rink} customerId={customer.id} customerName={customer.name} />
      </Card>
      {can(rink, 'sale', 'create') || can(rink, 'credit', 'adjust') ? (
        <div className="grid items-start gap-6 lg:grid-cols-2">
          {can(rink, 'sale', 'create') ? (
            <Card title="Sell at the counter">
              <CounterSaleForm rink={rink} customerId={customer.id} />
            </Card>
          ) : null}
          {can(rink, 'credit', 'adjust') ? (
            <Card title="Adjust credits">
              <AdjustForm slug={rink.slug} customerId={customer.id} customerName={customer.name} />
            </Card>
          ) : null}
        </div>
      ) : null}
      <Card title="Credit history">
        <CreditHistory rink={rink} customerId={customer.id} />
      </Card>
    </>
  );
}
