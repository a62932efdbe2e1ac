import { useState } from 'react';
import { Link } from 'react-router';
import type { CustomerRow } from '@rinkwright/core';
import { Button } from '../../../components/ui/button';
import { Card, PageHeader } from '../../../components/ui/layout';
import { NotFound } from '../../../components/ui/not-found';
import { useStations } from '../../../lib/queries/stations';
import { can, useRink } from '../../../lib/rink-context';
import { CustomerFinder } from '../components/customer-finder';
import { IntakeForm } from '../components/intake-form';
import { QueueBoard } from '../components/queue-board';

export function Component() {
  const rink = useRink();
  const stations = useStations(rink.slug);
  const [customer, setCustomer] = useState<CustomerRow | null>(null);
  const [stationId, setStationId] = useState('');
  if (!can(rink, 'ticket', 'read')) return <NotFound />;
  const list = stations.data?.stations ?? [];
  return (
    <div className="space-y-6">
      <PageHeader title="Counter" subtitle="Take skates in, and work the queue." />
      {list
        .filter((s) => s.driftAlert)
        .map((s) => (
          <div key={s.id} role="alert" className="flex flex-wrap items-center justify-between gap-3 rounded-lg border-l-4 border-brick bg-red-50 px-4 py-3">
            <p>
              <span className="font-bold">Drift alert on {s.name}:</span> its level readings are drifting away from level. Check it before the next pair.
            </p>
            <Link className="font-semibold text-steel underline" to={`/rinks/${rink.slug}/stations/${s.id}`}>
              See the leveling advice
            </Link>
          </div>
        ))}
      {can(rink, 'ticket', 'create') ? (
        <div className="grid gap-6 lg:grid-cols-[22rem_1fr]">
          <Card title="Skater">
            {customer ? (
              <div className="space-y-3">
                <p>
                  <Link className="text-lg font-bold text-steel underline" to={`/rinks/${rink.slug}/customers/${customer.id}`}>
                    {customer.name}
                  </Link>
                  <span className="block text-sm text-ink-soft">
                    Member code <span className="font-mono font-bold">{customer.memberCode}</span> · {customer.phone ?? customer.email ?? 'no contact'}
                  </span>
                </p>
                <Button tone="secondary" onClick={() => setCustomer(null)}>
                  Another skater
                </Button>
              </div>
            ) : (
              <CustomerFinder slug={rink.slug} onPick={setCustomer} />
            )}
          </Card>
          <Card title="Take skates in">
            {customer ? <IntakeForm key={customer.id} rink={rink} customer={customer} onDone={() => setCustomer(null)} /> : <p className="text-ink-soft">Find the skater first, or add a walk-up.</p>}
          </Card>
        </div>
      ) : null}
      <Card title="Queue">
        <label className="mb-4 flex items-center gap-2 text-sm font-semibold">
          Station
          <select className="min-h-11 rounded-lg border border-rule bg-white px-2" value={stationId} onChange={(e) => setStationId(e.target.value)}>
            <option value="">All stations</option>
            {list.map((s) => (
              <option key={s.id} value={s.id}>
                {s.name}
              </option>
            ))}
          </select>
        </label>
        <QueueBoard slug={rink.slug} timeZone={rink.timeZone} stations={list} stationId={stationId} />
      </Card>
    </div>
  );
}
