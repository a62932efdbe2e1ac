import { useMemo, type ReactNode } from 'react';
import { NavLink, useParams, useSearchParams } from 'react-router';
import { REPORT_NAMES, type ReportName, type ReportQuery, type RinkSummary } from '@rinkwright/core';
import { Alert, Loading } from '../../../components/ui/feedback';
import { PageHeader } from '../../../components/ui/layout';
import { NotFound } from '../../../components/ui/not-found';
import { ApiError } from '../../../lib/api-client';
import { useRink } from '../../../lib/rink-context';
import { useLeagueReport } from '../api/get-league-report';
import { useMoneyReport } from '../api/get-money-report';
import { useQualityReport } from '../api/get-quality-report';
import { useReportFilters, type ReportFilterChoices } from '../api/get-report-filters';
import { useThroughputReport } from '../api/get-throughput-report';
import { FilterForm, type FilterProblems } from '../components/filter-form';
import { reportsFor } from '../components/access';
import { REPORT_BLURB, REPORT_LABEL, parseFilters, searchFromValues, valuesFromSearch, type FilterValues } from '../components/filters';
import { LeagueView } from '../components/league-report';
import { MoneyView } from '../components/money-report';
import { formatPeriod } from '../components/numbers';
import { QualityView } from '../components/quality-report';
import type { TableSource } from '../components/report-section';
import { ThroughputView } from '../components/throughput-report';

type Filters = (problems: FilterProblems | null) => ReactNode;

interface BodyProps {
  rink: RinkSummary;
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

function useSource(rink: RinkSummary, query: ReportQuery): TableSource {
  const cells = useMemo(() => ({ currency: rink.currency, unit: rink.unitPreference, timeZone: rink.timeZone }), [rink.currency, rink.unitPreference, rink.timeZone]);
  return { slug: rink.slug, query, cells };
}

function Throughput({ rink, query, filters }: BodyProps) {
  const q = useThroughputReport(rink.slug, query);
  const source = useSource(rink, query);
  return (
    <Frame q={q} filters={filters}>
      {(data) => <ThroughputView report={data} source={source} />}
    </Frame>
  );
}

function Quality({ rink, query, filters }: BodyProps) {
  const q = useQualityReport(rink.slug, query);
  const source = useSource(rink, query);
  return (
    <Frame q={q} filters={filters}>
      {(data) => <QualityView report={data} source={source} unit={rink.unitPreference} />}
    </Frame>
  );
}

function Money({ rink, query, filters }: BodyProps) {
  const q = useMoneyReport(rink.slug, query);
  const source = useSource(rink, query);
  return (
    <Frame q={q} filters={filters}>
      {(data) => <MoneyView report={data} source={source} />}
    </Frame>
  );
}

function Leagues({ rink, query, filters }: BodyProps) {
  const q = useLeagueReport(rink.slug, query);
  const source = useSource(rink, query);
  return (
    <Frame q={q} filters={filters}>
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

function ReportPage({ rink, report, allowed }: { rink: RinkSummary; report: ReportName; allowed: ReportName[] }) {
  const [params, setParams] = useSearchParams();
  const choices = useReportFilters(rink.slug);
  if (choices.isPending) return <Loading label="Opening the reports…" />;
  if (choices.isError) return <Alert>{choices.error.message}</Alert>;

  const values = valuesFromSearch(params, choices.data.today);
  const parsed = parseFilters(values, report);
  const apply = (next: FilterValues) => setParams(searchFromValues(next));
  const search = params.toString();
  const filters: Filters = (problems) => (
    // A new address (a link, Back, another tab) starts the form again from what the address says.
    <FilterForm key={`${report}?${search}`} report={report} choices={choices.data} values={values} problems={problems} onApply={apply} />
  );
  const Body = BODY[report];
  return (
    <div className="space-y-6">
      <PageHeader title={`Reports: ${REPORT_LABEL[report]}`} subtitle={parsed.ok ? `${REPORT_BLURB[report]} ${describe(parsed.query, choices.data)}` : REPORT_BLURB[report]} />
      {allowed.length > 1 ? (
        <nav aria-label="Reports" className="-mt-2 flex flex-wrap gap-2">
          {allowed.map((name) => (
            <NavLink
              key={name}
              to={{ pathname: `/rinks/${rink.slug}/reports/${name}`, search }}
              className={({ isActive }) =>
                `inline-flex min-h-11 items-center rounded-full border px-4 text-sm font-semibold ${isActive ? 'border-steel bg-steel text-white' : 'border-rule bg-white text-ink hover:bg-glacier'}`
              }
            >
              {REPORT_LABEL[name]}
            </NavLink>
          ))}
        </nav>
      ) : null}
      {parsed.ok ? <Body rink={rink} query={parsed.query} filters={filters} /> : filters({ message: 'These filters cannot make a report.', fields: parsed.fields })}
    </div>
  );
}

export function Component() {
  const rink = useRink();
  const { report: name } = useParams();
  const allowed = reportsFor(rink);
  const report = REPORT_NAMES.find((n) => n === name);
  if (!report || !allowed.includes(report)) return <NotFound />;
  return <ReportPage rink={rink} report={report} allowed={allowed} />;
}
