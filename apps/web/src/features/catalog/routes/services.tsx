import type { ColumnDef } from '@tanstack/react-table';
import { useMemo, useRef, useState } from 'react';
import type { ServiceRow } from '@rinkwright/core';
import { Button } from '../../../components/ui/button';
import { DataTable } from '../../../components/ui/data-table';
import { Alert, Loading } from '../../../components/ui/feedback';
import { Card, PageHeader } from '../../../components/ui/layout';
import { NotFound } from '../../../components/ui/not-found';
import { useServices } from '../../../lib/queries/services';
import { can, useRink } from '../../../lib/rink-context';
import { useCreateService } from '../api/create-service';
import { useUpdateService } from '../api/update-service';
import { formatMoney } from '../../../lib/format';
import { KIND_LABEL, ServiceForm } from '../components/service-form';

export function Component() {
  const rink = useRink();
  const services = useServices(rink.slug);
  const create = useCreateService(rink.slug);
  const update = useUpdateService(rink.slug);
  const [editing, setEditing] = useState<ServiceRow | null>(null);
  const [note, setNote] = useState('');
  const formCard = useRef<HTMLDivElement>(null);

  const columns = useMemo<ColumnDef<ServiceRow, unknown>[]>(
    () => [
      { accessorKey: 'name', header: 'Service', cell: ({ row }) => <span className="font-semibold">{row.original.name}</span> },
      { accessorKey: 'kind', header: 'Kind', cell: ({ row }) => KIND_LABEL[row.original.kind] },
      {
        accessorKey: 'priceMinor',
        header: () => <span className="block text-right">Price</span>,
        cell: ({ row }) => <span className="block text-right tabular-nums">{formatMoney(row.original.priceMinor, rink.currency)}</span>,
      },
      {
        accessorKey: 'active',
        header: 'Offered',
        cell: ({ row }) => (row.original.active ? 'Yes' : <span className="text-ink-soft">No (stopped)</span>),
      },
      {
        id: 'actions',
        header: () => <span className="sr-only">Actions</span>,
        enableSorting: false,
        cell: ({ row }) => (
          <Button
            tone="secondary"
            aria-label={`Change ${row.original.name}`}
            onClick={() => {
              setNote('');
              setEditing(row.original);
              formCard.current?.scrollIntoView({ behavior: 'smooth', block: 'start' });
            }}
          >
            Change
          </Button>
        ),
      },
    ],
    [rink.currency],
  );

  if (!can(rink, 'service', 'manage')) return <NotFound />;

  return (
    <div className="space-y-6">
      <PageHeader title="Services" subtitle={`What the counter sells per pair, with prices in ${rink.currency}.`} />
      {note ? <Alert tone="success">{note}</Alert> : null}
      <div className="grid items-start gap-6 lg:grid-cols-[1fr_24rem]">
        <Card title="Services and prices">
          {services.isPending ? (
            <Loading />
          ) : services.isError ? (
            <Alert>{services.error.message}</Alert>
          ) : (
            <DataTable data={services.data.services} columns={columns} caption="Services of the rink" empty="No services yet: add the standard sharpening first." />
          )}
        </Card>
        <div ref={formCard} className="scroll-mt-4">
          {editing ? (
            <Card title={`Change ${editing.name}`}>
              <ServiceForm
                key={editing.id}
                service={editing}
                currency={rink.currency}
                save={(input) => update.mutateAsync({ serviceId: editing.id, input })}
                onDone={(saved) => {
                  setEditing(null);
                  setNote(`${saved.name} saved.`);
                }}
              />
              <Button tone="quiet" className="mt-2" onClick={() => setEditing(null)}>
                Cancel
              </Button>
            </Card>
          ) : (
            <Card title="Add a service">
              <ServiceForm key="new" service={null} currency={rink.currency} save={(input) => create.mutateAsync(input)} />
            </Card>
          )}
        </div>
      </div>
    </div>
  );
}
