import { useMemo, type ReactNode } from 'react';
import { NavLink, useSearchParams } from 'react-router';
import type { ReportName, ReportQuery, UnitPreference } from '@rinkwright/core';
import { Alert, Loading } from '../../../components/ui/feedback';
import { PageHeader } from '../../../components/ui/layout';
import { ApiError } from '../../../lib/api-client';
import type { ReportSource } from '../api/keys';
import { useLeagueReport } from '../api/get-league-report';
import { useMoneyReport } from '../api/get-money-report';
import { useQualityReport } from '../api/get-quality-report';
import { useReportFilters, type ReportFilterChoices } from '../api/get-report-filters';
import { useThroughputReport } from '../api/get-throughput-report';
import { FilterForm, type FilterProblems } from './filter-form';
import { REPORT_BLURB, REPORT_LABEL, parseFilters, searchFromValues, valuesFromSearch, type FilterValues } from './filters';
import { LeagueView } from './league-report';
import { MoneyView } from './money-report';
import { formatPeriod, type CellContext } from './numbers';
import { QualityView } from './quality-report';
import type { TableSource } from './report-section';
import { ThroughputView } from './throughput-report';

type Filters = (problems: FilterProblems | null) => ReactNode;

interface BodyProps {
  reports: ReportSource;
  cells: CellContext;
  query: ReportQuery;
  filters: Filters;
}

/** A refusal of the filters (400) goes onto the form's fields; anything else is said above the report. */
function refusal(error: Error): FilterProblems | null {
  return error instanceof ApiError && error.status === 400 ? { message: error.message, fields: error.fields ?? {} } : null;
}

/** The form, then the report as its query stands: loading, refused, failed, or shown (dimmed while the next loads). */
function Frame<T>({ q, filters, children }: { q: { data: T | undefined; error: Error | null; isFetching: boolean; isPlaceholderData: boolean }; filters: Filters; children: (data: T) => ReactNode }) {
  const refused = q.error ? refusal(q.error) : null;
  const updating = q.isPlaceholderData && q.isFetching;
  return (
    <>
      {filters(refused)}
      {q.error && !refused ? <Alert>{q.error.message}</Alert> : null}
      {refused ? null : q.data === undefined ? (
        q.error ? null : <Loading label="Working out the report…" />
      ) : (
        <div aria-busy={updating || undefined} className={updating ? 'opacity-60 transition-opacity' : undefined} data-testid="report-body">
          {updating ? (
            <p role="status" className="sr-only">
              Updating the report…
            </p>
          ) : null}
          {children(q.data)}
        </div>
      )}
    </>
  );
}

function useTableSource({ reports, cells, query }: BodyProps): TableSource {
  return useMemo(() => ({ reports, query, cells }), [reports, query, cells]);
}

function Throughput(props: BodyProps) {
  const q = useThroughputReport(props.reports, props.query);
  const source = useTableSource(props);
  return (
    <Frame q={q} filters={props.filters}>
      {(data) => <ThroughputView report={data} source={source} />}
    </Frame>
  );
}

function Quality(props: BodyProps) {
  const q = useQualityReport(props.reports, props.query);
  const source = useTableSource(props);
  return (
    <Frame q={q} filters={props.filters}>
      {(data) => <QualityView report={data} source={source} unit={props.cells.unit} />}
    </Frame>
  );
}

function Money(props: BodyProps) {
  const q = useMoneyReport(props.reports, props.query);
  const source = useTableSource(props);
  return (
    <Frame q={q} filters={props.filters}>
      {(data) => <MoneyView report={data} source={source} />}
    </Frame>
  );
}

function Leagues(props: BodyProps) {
  const q = useLeagueReport(props.reports, props.query);
  const source = useTableSource(props);
  return (
    <Frame q={q} filters={props.filters}>
      {(data) => <LeagueView report={data} source={source} />}
    </Frame>
  );
}

const BODY: Record<ReportName, (props: BodyProps) => ReactNode> = { throughput: Throughput, quality: Quality, money: Money, leagues: Leagues };

function describe(query: ReportQuery, choices: ReportFilterChoices): string {
  const station = query.stationId ? choices.stations.find((s) => s.id === query.stationId)?.name : undefined;
  const technician = query.technicianId ? choices.technicians.find((t) => t.id === query.technicianId)?.name : undefined;
  const compare = query.compareFrom && query.compareTo ? `, compared with ${formatPeriod({ from: query.compareFrom, to: query.compareTo })}` : '';
  return `${formatPeriod(query)}${station ? `, ${station}` : ''}${technician ? `, ${technician}` : ''}${compare}.`;
}

export interface ReportPageProps {
  reports: ReportSource;
  report: ReportName;
  /** The reports the reader may open, in the order of the links between them. */
  allowed: ReportName[];
  /** How readings are written. */
  unit: UnitPreference;
  /** The page's heading for a report's label. */
  title: (label: string) => string;
}

function LoadedReportPage({ reports, report, allowed, unit, title, choices }: ReportPageProps & { choices: ReportFilterChoices }) {
  const [params, setParams] = useSearchParams();
  // Money and times are written in the rink's own currency and time zone, which the filter choices carry.
  const cells = useMemo<CellContext>(() => ({ currency: choices.currency, unit, timeZone: choices.timeZone }), [choices.currency, choices.timeZone, unit]);
  const values = valuesFromSearch(params, choices.today);
  const parsed = parseFilters(values, report);
  const apply = (next: FilterValues) => setParams(searchFromValues(next));
  const search = params.toString();
  const filters: Filters = (problems) => (
    // A new address (a link, Back, another tab) starts the form again from what the address says.
    <FilterForm key={`${report}?${search}`} report={report} choices={choices} values={values} problems={problems} onApply={apply} />
  );
  const Body = BODY[report];
  return (
    <div className="space-y-6">
      <PageHeader title={title(REPORT_LABEL[report])} subtitle={parsed.ok ? `${REPORT_BLURB[report]} ${describe(parsed.query, choices)}` : REPORT_BLURB[report]} />
      {allowed.length > 1 ? (
        <nav aria-label="Reports" className="-mt-2 flex flex-wrap gap-2">
          {allowed.map((name) => (
            <NavLink
              key={name}
              to={{ pathname: `${reports.pages}/${name}`, search }}
              className={({ isActive }) =>
                `inline-flex min-h-11 items-center rounded-full border px-4 text-sm font-semibold ${isActive ? 'border-steel bg-steel text-white' : 'border-rule bg-white text-ink hover:bg-glacier'}`
              }
            >
              {REPORT_LABEL[name]}
            </NavLink>
          ))}
        </nav>
      ) : null}
      {parsed.ok ? <Body reports={reports} cells={cells} query={parsed.query} filters={filters} /> : filters({ message: 'These filters cannot make a report.', fields: parsed.fields })}
    </div>
  );
}

/** One report screen, read from the given source: the filters in the address, the form, the figures, the tables. */
export function ReportPage(props: ReportPageProps) {
  const choices = useReportFilters(props.reports);
  if (choices.isPending) return <Loading label="Opening the reports…" />;
  if (choices.isError) return <Alert>{choices.error.message}</Alert>;
  return <LoadedReportPage {...props} choices={choices.data} />;
}
