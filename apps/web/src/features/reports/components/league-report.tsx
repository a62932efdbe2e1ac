import type { LeagueReport } from '@rinkwright/core';
import { formatCount } from '../../../lib/format';
import { AllocationBars } from './charts/allocation-bars';
import { Legend, STEEL, Swatch } from './charts/chart-frame';
import { formatPeriod } from './numbers';
import { ReportSection, type TableSource } from './report-section';

type TeamRow = LeagueReport['tables']['teams'][number];

function summary(rows: TeamRow[]): string {
  const over = rows.filter((r) => r.used > r.allocated);
  const allocated = rows.reduce((n, r) => n + r.allocated, 0);
  const used = rows.reduce((n, r) => n + r.used, 0);
  return `${formatCount(rows.length)} ${rows.length === 1 ? 'team' : 'teams'} used ${formatCount(used)} of the ${formatCount(allocated)} credits allocated to them${
    over.length > 0 ? `; ${over.map((r) => r.team).join(', ')} used more than allocated` : ''
  }.`;
}

export function LeagueView({ report, source }: { report: LeagueReport; source: TableSource }) {
  const teams = report.tables.teams;
  const usedInPeriod = teams.reduce((n, r) => n + r.usedInPeriod, 0);
  return (
    <div className="space-y-6">
      <dl className="grid gap-3 sm:grid-cols-2 lg:grid-cols-4">
        {[
          { label: 'Teams', value: formatCount(teams.length) },
          { label: 'Credits allocated', value: formatCount(teams.reduce((n, r) => n + r.allocated, 0)) },
          { label: 'Used in this period', value: formatCount(usedInPeriod) },
          { label: 'Remaining', value: formatCount(teams.reduce((n, r) => n + r.remaining, 0)) },
        ].map((f) => (
          <div key={f.label} className="rounded-lg bg-glacier px-4 py-3">
            <dt className="text-sm font-medium text-ink-soft">{f.label}</dt>
            <dd className="mt-1 text-2xl font-bold tabular-nums">{f.value}</dd>
          </div>
        ))}
      </dl>
      <ReportSection
        source={source}
        report="leagues"
        table="teams"
        rows={teams}
        empty="No teams have allocations yet."
        intro={<p className="mb-3 text-sm text-ink-soft">Allocated, used in all and remaining are all-time figures; “used in period” counts {formatPeriod(report.period)}.</p>}
        chart={
          teams.length === 0 ? null : (
            <div className="mb-4">
              <AllocationBars
                rows={teams.map((t) => ({ key: t.teamId, team: t.team, league: t.league, allocated: t.allocated, used: t.used }))}
                title="Credits used against credits allocated, by team"
                summary={summary(teams)}
              />
              <Legend
                items={[
                  { key: 'allocated', swatch: <Swatch fill="var(--color-glacier)" stroke="var(--color-ink-soft)" />, label: 'Allocated (the outlined track)' },
                  { key: 'used', swatch: <Swatch fill={STEEL} />, label: 'Used in all (the filled bar inside it)' },
                ]}
              />
            </div>
          )
        }
      />
    </div>
  );
}
