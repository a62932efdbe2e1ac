import type { ColumnDef } from '@tanstack/react-table';
import { useMemo } from 'react';
import type { StationDetail, UnitPreference } from '@rinkwright/core';
import { DataTable } from '../../../components/ui/data-table';
import { formatDateTime } from '../../../lib/format';
import { showLength } from '../../../lib/units';

type Row = StationDetail['wheelEvents'][number];
const KIND: Record<Row['kind'], string> = { mount: 'Mounted', dressing: 'Dressed', removal: 'Removed' };

export function WheelLog({ events, unit, timeZone }: { events: Row[]; unit: UnitPreference; timeZone: string }) {
  const columns = useMemo<ColumnDef<Row, unknown>[]>(
    () => [
      { accessorKey: 'at', header: 'When', cell: ({ row }) => formatDateTime(row.original.at, timeZone) },
      { accessorKey: 'kind', header: 'What', cell: ({ row }) => <span className="font-semibold">{KIND[row.original.kind]}</span> },
      { accessorKey: 'hollowNm', header: 'Hollow', cell: ({ row }) => <span className="tabular-nums">{showLength(row.original.hollowNm, unit, 'hollow')}</span> },
      { accessorKey: 'diameterNm', header: 'Diameter', cell: ({ row }) => <span className="tabular-nums">{showLength(row.original.diameterNm, unit, 'diameter')}</span> },
      { accessorKey: 'note', header: 'Note', enableSorting: false, cell: ({ row }) => row.original.note ?? '' },
    ],
    [unit, timeZone],
  );
  // A wheel dressed every fortnight fills a long log; it scrolls in its own box, reachable by keyboard.
  return (
    <div className="max-h-96 overflow-y-auto" tabIndex={0} role="region" aria-label="Wheel log entries">
      <DataTable data={events} columns={columns} caption="Wheel log of the mounted wheel, newest first" empty="Nothing logged for the mounted wheel." />
    </div>
  );
}
