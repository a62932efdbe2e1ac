import type { LevelBand, QualityReport, UnitPreference } from '@rinkwright/core';
import { BandIcon } from '../../../components/ui/level-reading';
import { formatCount } from '../../../lib/format';
import { BAND_WORD, BANDS, BandStack } from './charts/band-stack';
import { Figures, type FigureSpec } from './figures';
import { formatReading, formatReadingValue, formatShare } from './numbers';
import { Nothing, ReportSection, type TableSource } from './report-section';

type Totals = QualityReport['totals'];
type StationRow = QualityReport['tables']['byStation'][number];
type LevelingRow = QualityReport['tables']['leveling'][number];
type WheelRow = QualityReport['tables']['wheels'][number];

/** A band's share in its column (the column's header is the band's word): the band's mark, then the number. */
function BandShare({ band, share }: { band: LevelBand; share: number | null }) {
  return (
    <span className="inline-flex items-center justify-end gap-1">
      <BandIcon band={band} />
      {share === null ? '—' : formatShare(share)}
    </span>
  );
}

const SHARE_KEY = { true: 'trueShare', fair: 'fairShare', off: 'offShare' } as const satisfies Record<LevelBand, keyof Totals>;

const MINUS = '\u2212';
const signedMilli = (milli: number) => `${milli < 0 ? MINUS : milli > 0 ? '+' : ''}${formatCount(Math.abs(milli))}`;

function figures(t: Totals, then: Totals | undefined, unit: UnitPreference): FigureSpec[] {
  const p = <K extends keyof Totals>(key: K) => (then ? then[key] : undefined);
  return [
    { label: 'First readings', value: t.firstReadings, format: formatCount, previous: p('firstReadings') },
    ...BANDS.map((b) => ({
      label: `${BAND_WORD[b]} first readings`,
      mark: <BandIcon band={b} />,
      value: t[SHARE_KEY[b]],
      format: formatShare,
      previous: p(SHARE_KEY[b]),
      share: true,
      missing: 'No readings',
    })),
    { label: 'Re-run rate', value: t.reRunRate, format: formatShare, previous: p('reRunRate'), share: true, missing: 'No readings', note: 'Blades run again after their first reading.' },
    {
      label: 'Mean absolute reading',
      value: t.meanAbsReadingNm,
      format: (nm) => formatReading(nm, unit, true),
      previous: p('meanAbsReadingNm'),
      missing: 'No readings',
      note: 'How far first readings sit from level, either way.',
    },
  ];
}

function stackSummary(rows: StationRow[]): string {
  const read = rows.filter((r) => r.firstReadings > 0);
  if (read.length === 0) return 'No first readings in this period.';
  return read
    .map((r) => `${r.station}: ${BANDS.map((b) => `${BAND_WORD[b].toLowerCase()} ${formatShare(r[SHARE_KEY[b]] ?? 0)}`).join(', ')} of ${formatCount(r.firstReadings)} first readings`)
    .join('; ')
    .concat('.');
}

export function QualityView({ report, source, unit }: { report: QualityReport; source: TableSource; unit: UnitPreference }) {
  const empty = report.totals.firstReadings === 0;
  const stationRender = {
    trueShare: (r: StationRow) => <BandShare band="true" share={r.trueShare} />,
    fairShare: (r: StationRow) => <BandShare band="fair" share={r.fairShare} />,
    offShare: (r: StationRow) => <BandShare band="off" share={r.offShare} />,
    meanAbsReadingNm: (r: StationRow) => (r.meanAbsReadingNm === null ? undefined : formatReadingValue(r.meanAbsReadingNm, unit, true)),
  };
  const levelingRender = { amountMilli: (r: LevelingRow) => signedMilli(r.amountMilli) };
  const wheelRender = {
    removedAt: (r: WheelRow) => (r.removedAt === null ? 'Still mounted' : undefined),
    predictedPasses: (r: WheelRow) => (r.predictedPasses === null ? 'No wear measured yet' : undefined),
  };
  return (
    <div className="space-y-6">
      <Figures specs={figures(report.totals, report.compare?.totals, unit)} compare={report.compare?.period} />
      <ReportSection
        source={source}
        report="quality"
        table="byStation"
        rows={report.tables.byStation}
        empty="No stations with readings in this period."
        render={stationRender}
        chart={
          empty ? (
            <Nothing>No first readings in this period.</Nothing>
          ) : (
            <div className="mb-4">
              <BandStack rows={report.tables.byStation} title="First readings by band at each station" summary={stackSummary(report.tables.byStation)} />
            </div>
          )
        }
      />
      <ReportSection
        source={source}
        report="quality"
        table="leveling"
        rows={report.tables.leveling}
        empty="No leveling adjustments in this period."
        render={levelingRender}
        intro={<p className="mb-3 text-sm text-ink-soft">The mean signed first reading of the pairs just before and just after each adjustment: nearer zero after means the adjustment helped.</p>}
      />
      <ReportSection
        source={source}
        report="quality"
        table="wheels"
        rows={report.tables.wheels}
        empty="No wheels in service in this period."
        render={wheelRender}
        intro={<p className="mb-3 text-sm text-ink-soft">Pairs and passes each wheel has run, against the passes its measured wear says it will give in all before it reaches its minimum diameter.</p>}
      />
    </div>
  );
}
