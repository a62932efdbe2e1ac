import type { ThroughputReport } from '@rinkwright/core';
import { formatCount } from '../../../lib/format';
import { HourHeatMap } from './charts/hour-heat-map';
import { DayBars } from './charts/day-bars';
import { STEEL } from './charts/chart-frame';
import { Figures, type FigureSpec } from './figures';
import { WEEKDAYS, formatDay, formatDecimal, formatMinutes, formatPeriod, formatShare } from './numbers';
import { Nothing, ReportSection, type TableSource } from './report-section';

type Totals = ThroughputReport['totals'];
type HourRow = ThroughputReport['tables']['byHour'][number];

const HOUR_RENDER = {
  weekday: (row: HourRow) => `${row.weekday} · ${WEEKDAYS[row.weekday - 1] ?? ''}`,
};

function figures(t: Totals, then: Totals | undefined): FigureSpec[] {
  const p = <K extends keyof Totals>(key: K) => (then ? then[key] : undefined);
  return [
    { label: 'Pairs', value: t.pairs, format: formatCount, previous: p('pairs') },
    { label: 'Staffed hours', value: t.staffedHours, format: formatCount, previous: p('staffedHours') },
    { label: 'Pairs per staffed hour', value: t.pairsPerStaffedHour, format: formatDecimal, previous: p('pairsPerStaffedHour'), missing: 'No staffed hours' },
    { label: 'Tickets ready', value: t.ticketsReady, format: formatCount, previous: p('ticketsReady') },
    { label: 'Median turnaround', value: t.medianTurnaroundMinutes, format: formatMinutes, previous: p('medianTurnaroundMinutes'), missing: 'No tickets ready' },
    { label: '90th percentile turnaround', value: t.p90TurnaroundMinutes, format: formatMinutes, previous: p('p90TurnaroundMinutes'), missing: 'No tickets ready', note: t.p90TurnaroundMinutes === null ? undefined : 'Nine tickets in ten were ready within this time.' },
    { label: 'Ready by the promised time', value: t.promisedHitRate, format: formatShare, previous: p('promisedHitRate'), share: true, missing: 'No promised times' },
  ];
}

function daySummary(report: ThroughputReport): string {
  const days = report.tables.byDay;
  const busiest = days.reduce<(typeof days)[number] | null>((best, d) => (best === null || d.pairs > best.pairs ? d : best), null);
  const working = days.filter((d) => d.pairs > 0).length;
  return `${formatCount(report.totals.pairs)} pairs over ${formatCount(days.length)} days (${formatPeriod(report.period)}), on ${formatCount(working)} of them${
    busiest && busiest.pairs > 0 ? `; the busiest was ${formatDay(busiest.day)} with ${formatCount(busiest.pairs)}` : ''
  }.`;
}

function hourSummary(rows: HourRow[]): string {
  const busiest = rows.reduce<HourRow | null>((best, r) => (best === null || r.pairs > best.pairs ? r : best), null);
  if (!busiest) return 'No pairs in this period.';
  return `The busiest hour of the week was ${WEEKDAYS[busiest.weekday - 1] ?? ''} from ${busiest.hour}:00, with ${formatCount(busiest.pairs)} pairs in this period.`;
}

export function ThroughputView({ report, source }: { report: ThroughputReport; source: TableSource }) {
  const empty = report.totals.pairs === 0;
  return (
    <div className="space-y-6">
      <Figures specs={figures(report.totals, report.compare?.totals)} compare={report.compare?.period} />
      <ReportSection
        source={source}
        report="throughput"
        table="byDay"
        rows={report.tables.byDay}
        empty="No days in this period."
        folded
        chart={
          empty ? (
            <Nothing>No pairs in this period.</Nothing>
          ) : (
            <DayBars
              days={report.tables.byDay.map((d) => ({ day: d.day, up: d.pairs }))}
              up={{ label: 'Pairs', fill: STEEL }}
              title="Pairs by day"
              summary={daySummary(report)}
              yLabel="Pairs"
              formatValue={formatCount}
              whole
            />
          )
        }
      />
      <ReportSection
        source={source}
        report="throughput"
        table="byHour"
        rows={report.tables.byHour.filter((r) => r.pairs > 0)}
        empty="No hours with pairs in this period."
        folded
        render={HOUR_RENDER}
        chart={empty ? <Nothing>No busy hours to show: no pairs in this period.</Nothing> : <HourHeatMap byHour={report.tables.byHour} title="Pairs by weekday and hour" summary={hourSummary(report.tables.byHour)} />}
      />
      <div className="grid items-start gap-6 lg:grid-cols-2">
        <ReportSection source={source} report="throughput" table="byStation" rows={report.tables.byStation} empty="No pairs at any station in this period." />
        <ReportSection source={source} report="throughput" table="byTechnician" rows={report.tables.byTechnician} empty="No pairs by any technician in this period." />
      </div>
    </div>
  );
}
