import type { ColumnDef } from '@tanstack/react-table';
import { DataTable } from '../../../components/ui/data-table';
import { Alert, Loading } from '../../../components/ui/feedback';
import { Card, PageHeader } from '../../../components/ui/layout';
import { NotFound } from '../../../components/ui/not-found';
import type { PlatformRinkRow } from '@rinkwright/core';
import { formatDate } from '../../../lib/format';
import { useMe } from '../../../lib/session';
import { usePlatformRinks } from '../api/get-platform-rinks';

const columns: ColumnDef<PlatformRinkRow, unknown>[] = [
  { accessorKey: 'name', header: 'Rink', cell: ({ row }) => <span className="font-semibold">{row.original.name}</span> },
  { accessorKey: 'slug', header: 'Address', cell: ({ row }) => <span className="font-mono">/r/{row.original.slug}</span> },
  { accessorKey: 'members', header: 'Staff', cell: ({ row }) => <span className="tabular-nums">{row.original.members}</span> },
  { accessorKey: 'customers', header: 'Customers', cell: ({ row }) => <span className="tabular-nums">{row.original.customers}</span> },
  { accessorKey: 'timeZone', header: 'Time zone' },
  { accessorKey: 'currency', header: 'Currency' },
  { accessorKey: 'createdAt', header: 'Joined', cell: ({ row }) => formatDate(row.original.createdAt) },
];

export function Component() {
  const me = useMe();
  const rinks = usePlatformRinks();
  if (me.data && !me.data.user.platformAdmin) return <NotFound />;
  return (
    <div className="mx-auto max-w-6xl px-4 py-8">
      <PageHeader title="Platform: rinks" subtitle="Every rink that uses Rinkwright." />
      <Card>
        {rinks.isPending ? <Loading /> : rinks.isError ? <Alert>{rinks.error.message}</Alert> : <DataTable data={rinks.data.rinks} columns={columns} caption="Rinks on the platform" empty="No rinks yet." />}
      </Card>
    </div>
  );
}
