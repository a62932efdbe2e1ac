import type { ColumnDef } from '@tanstack/react-table';
import { useMemo } from 'react';
import { EFFECT_READINGS, type StationDetail, type UnitPreference } from '@rinkwright/core';
import { DataTable } from '../../../components/ui/data-table';
import { formatDateTime } from '../../../lib/format';
import { adjustText, readingText } from './typed';

type Row = StationDetail['adjustments'][number];

export function AdjustmentsLog({ detail, unit, timeZone }: { detail: StationDetail; unit: UnitPreference; timeZone: string }) {
  const adjustUnit = detail.station.adjustUnit;
  const columns = useMemo<ColumnDef<Row, unknown>[]>(() => {
    const mean = (nm: number | null) => (nm === null ? '—' : readingText(Math.round(nm), unit));
    return [
      { accessorKey: 'at', header: 'When', cell: ({ row }) => formatDateTime(row.original.at, timeZone) },
      { accessorKey: 'amountMilli', header: 'Adjustment', cell: ({ row }) => <span className="font-semibold tabular-nums">{adjustText(row.original.amountMilli, adjustUnit)}</span> },
      { accessorKey: 'beforeNm', header: 'Mean before', cell: ({ row }) => <span className="tabular-nums">{mean(row.original.beforeNm)}</span> },
      { accessorKey: 'afterNm', header: 'Mean after', cell: ({ row }) => <span className="tabular-nums">{mean(row.original.afterNm)}</span> },
      { accessorKey: 'by', header: 'By' },
      { accessorKey: 'note', header: 'Note', enableSorting: false, cell: ({ row }) => row.original.note ?? '' },
    ];
  }, [unit, timeZone, adjustUnit]);
  return (
    <>
      <DataTable data={detail.adjustments} columns={columns} caption="Leveling adjustments of this station, newest first" empty="No leveling adjustments logged yet." />
      <p className="mt-2 text-sm text-ink-soft">Means of up to {EFFECT_READINGS} first readings either side of each adjustment, none beyond the adjustments next to it; the leveling advice fits the station's response to them.</p>
    </>
  );
}
