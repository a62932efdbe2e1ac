import type { ColumnDef } from '@tanstack/react-table';
import { useMemo, type ReactNode } from 'react';
import { REPORT_TABLES, type ColumnFormat, type ReportColumn, type ReportName, type ReportQuery } from '@rinkwright/core';
import { buttonClass } from '../../../components/ui/button';
import { DataTable } from '../../../components/ui/data-table';
import { reportCsvHref, type ReportSource } from '../api/keys';
import { columnLabel, formatCell, type CellContext } from './numbers';

type TableName<R extends ReportName> = keyof (typeof REPORT_TABLES)[R] & string;

const NO_RENDERERS = {};
const NUMERIC: ReadonlySet<ColumnFormat> = new Set(['int', 'decimal', 'share', 'minor', 'nm']);

export interface TableSource {
  reports: ReportSource;
  query: ReportQuery;
  cells: CellContext;
}

/**
 * One table of a report, optionally under its chart: the headers are the shared column labels, the same ones the
 * CSV export writes, and the download carries the screen's filters. A chart's table can start folded away (it is
 * the chart's text alternative, and a long one), but it is always there.
 */
export function ReportSection<R extends ReportName, Row extends object>({
  source,
  report,
  table,
  rows,
  empty,
  chart,
  folded = false,
  render = NO_RENDERERS,
  intro,
}: {
  source: TableSource;
  report: R;
  table: TableName<R>;
  rows: Row[];
  empty: string;
  chart?: ReactNode;
  folded?: boolean;
  render?: Partial<Record<string, (row: Row) => ReactNode>>;
  intro?: ReactNode;
}) {
  const spec = REPORT_TABLES[report][table] as { title: string; columns: readonly ReportColumn[] };
  const { cells } = source;
  const columns = useMemo<ColumnDef<Row, unknown>[]>(
    () =>
      spec.columns.map((column) => {
        const numeric = NUMERIC.has(column.format);
        const custom = render[column.key];
        const value = (row: Row) => (row as Record<string, unknown>)[column.key];
        return {
          id: column.key,
          accessorFn: (row) => value(row) ?? undefined,
          sortUndefined: 'last',
          header: () => (numeric ? <span className="block text-right">{columnLabel(column, cells)}</span> : columnLabel(column, cells)),
          // A renderer answering undefined leaves the cell to the column's own format.
          cell: ({ row }) => <span className={numeric ? 'block text-right tabular-nums' : 'tabular-nums'}>{custom?.(row.original) ?? formatCell(value(row.original), column.format, cells)}</span>,
        } satisfies ColumnDef<Row, unknown>;
      }),
    [spec, render, cells],
  );
  const href = reportCsvHref(source.reports, report, table, source.query);
  const tableView = <DataTable data={rows} columns={columns} caption={spec.title} empty={empty} />;
  return (
    <section className="rounded-xl border border-rule bg-white p-5 shadow-sm" aria-label={spec.title}>
      <div className="mb-4 flex flex-wrap items-center justify-between gap-3">
        <h2 className="text-lg font-bold">{spec.title}</h2>
        <a href={href} download className={buttonClass('secondary')}>
          Download CSV<span className="sr-only">: {spec.title}</span>
        </a>
      </div>
      {intro}
      {chart}
      {folded ? (
        <details className="mt-4">
          <summary className="flex min-h-11 cursor-pointer items-center text-sm font-semibold text-steel">The same figures as a table</summary>
          {tableView}
        </details>
      ) : (
        tableView
      )}
    </section>
  );
}

/** What a chart says instead of drawing bars of zero. */
export function Nothing({ children }: { children: ReactNode }) {
  return <p className="py-6 text-center font-semibold text-ink-soft">{children}</p>;
}
