import type { ColumnDef } from '@tanstack/react-table';
import { useId, useMemo } from 'react';
import { DRIFT_DEFAULTS, nmToHundredthsMm, nmToThousandths, type LevelBand, type StationDetail, type UnitPreference } from '@rinkwright/core';
import { DataTable } from '../../../components/ui/data-table';
import { formatDateTime } from '../../../lib/format';
import { readingUnitLabel } from '../../../lib/units';
import { BandName } from './band-name';
import { limitText, readingText } from './typed';

// The drift watch drawn as a technician reads it: every reading where it sits against the band zones, marked by
// its band's colour and shape (so the chart reads the same in greyscale), with the individuals chart's centre line
// and limits and the EWMA with its own. The same numbers are in a table under the chart for screen readers.

const W = 880;
const H = 360;
const M = { l: 60, r: 92, t: 16, b: 66 };
const PLOT_W = W - M.l - M.r;
const PLOT_H = H - M.t - M.b;

const BAND_COLOR: Record<LevelBand, string> = { true: 'var(--color-band-true)', fair: 'var(--color-band-fair)', off: 'var(--color-band-off)' };
const BAND_WORD: Record<LevelBand, string> = { true: 'true', fair: 'fair', off: 'off' };
const ZONE_OPACITY: Record<LevelBand, number> = { true: 0.13, fair: 0.13, off: 0.08 };
const LIMIT_STROKE = 'var(--color-ink-soft)';
const EWMA_STROKE = 'var(--color-steel-dark)';

type Reading = StationDetail['readings'][number];

function niceStep(range: number): number {
  const raw = range / 6;
  const power = 10 ** Math.floor(Math.log10(raw));
  const step = [1, 2, 2.5, 5, 10].find((m) => m * power >= raw) ?? 10;
  return step * power;
}

const signed = (v: number, decimals: number) => {
  const text = Math.abs(v).toFixed(decimals);
  return Number(text) === 0 ? text : `${v < 0 ? '\u2212' : '+'}${text}`;
};

/** The shapes of BandIcon, drawn in the chart's own coordinates. */
function Marker({ band, cx, cy, r }: { band: LevelBand; cx: number; cy: number; r: number }) {
  const color = BAND_COLOR[band];
  if (band === 'true') return <circle cx={cx} cy={cy} r={r} fill={color} />;
  if (band === 'fair')
    return (
      <g>
        <circle cx={cx} cy={cy} r={r - 0.75} fill="white" stroke={color} strokeWidth="1.5" />
        <path d={`M${cx} ${cy - r + 0.75} A${r - 0.75} ${r - 0.75} 0 0 0 ${cx} ${cy + r - 0.75} Z`} fill={color} />
      </g>
    );
  const h = r * 1.15;
  return <path d={`M${cx} ${cy - h} L${cx + h} ${cy + h * 0.8} L${cx - h} ${cy + h * 0.8} Z`} fill="white" stroke={color} strokeWidth="1.6" strokeLinejoin="round" />;
}

function LineSwatch({ stroke, dash, width = 2 }: { stroke: string; dash?: string; width?: number }) {
  return (
    <svg width="28" height="10" viewBox="0 0 28 10" aria-hidden="true" className="inline-block shrink-0">
      <line x1="0" y1="5" x2="28" y2="5" stroke={stroke} strokeWidth={width} strokeDasharray={dash} />
    </svg>
  );
}

export function ReadingChart({ detail, unit, timeZone }: { detail: StationDetail; unit: UnitPreference; timeZone: string }) {
  const titleId = useId();
  const descId = useId();
  // useId's characters are not all valid in a url(#…) reference.
  const clipId = `plot-${useId().replace(/[^\w-]/g, '')}`;
  const { readings, drift, bands } = detail;
  const toUnit = (nm: number) => (unit === 'in' ? nmToThousandths(nm) : nmToHundredthsMm(nm));
  const unitLabel = readingUnitLabel(unit);
  const unitWords = unit === 'in' ? 'thou' : 'hundredths mm';
  const n = readings.length;
  const watching = drift.status === 'watching' && drift.mean !== null && drift.ucl !== null && drift.lcl !== null;
  const flagged = new Set(drift.reasons.map((r) => r.index));

  const values = readings.map((r) => toUnit(r.readingNm));
  const ewma = drift.ewma.map(toUnit);
  const trueU = toUnit(bands.trueNm);
  const fairU = toUnit(bands.fairNm);
  const lines = watching
    ? {
        mean: toUnit(drift.mean as number),
        ucl: toUnit(drift.ucl as number),
        lcl: toUnit(drift.lcl as number),
        ewmaUcl: drift.ewmaUcl === null ? null : toUnit(drift.ewmaUcl),
        ewmaLcl: drift.ewmaLcl === null ? null : toUnit(drift.ewmaLcl),
      }
    : null;

  const extent = [...values, ...ewma, fairU * 1.25, -fairU * 1.25, ...(lines ? [lines.ucl, lines.lcl, lines.ewmaUcl ?? 0, lines.ewmaLcl ?? 0] : [])];
  const rawLo = Math.min(...extent);
  const rawHi = Math.max(...extent);
  const step = niceStep(rawHi - rawLo || 1);
  const lo = Math.floor(rawLo / step) * step;
  const hi = Math.ceil(rawHi / step) * step;
  const decimals = [0, 1, 2, 3].find((d) => Math.abs(Math.round(step * 10 ** d) - step * 10 ** d) < 1e-9) ?? 3;
  const yTicks: number[] = [];
  for (let v = lo; v <= hi + step / 1000; v += step) yTicks.push(Number(v.toFixed(6)));

  const r = n > 150 ? 3.5 : n > 60 ? 4.5 : 6;
  // Inset so that the first and last markers (and their alert rings) sit wholly inside the plot.
  const inset = r + 6;
  const x = (i: number) => M.l + inset + (n <= 1 ? (PLOT_W - 2 * inset) / 2 : (i / (n - 1)) * (PLOT_W - 2 * inset));
  const y = (v: number) => M.t + ((hi - v) / (hi - lo)) * PLOT_H;
  const clampY = (v: number) => Math.max(M.t, Math.min(M.t + PLOT_H, y(v)));

  // Ticks carry the reading's number and, where it changes from the tick before, its day (or its time when
  // the readings span less than two days), so a burst of check readings does not print one date six times.
  const spanMs = n > 1 ? new Date(readings[n - 1]!.takenAt).getTime() - new Date(readings[0]!.takenAt).getTime() : 0;
  const tickWhen = new Intl.DateTimeFormat(undefined, spanMs < 2 * 86_400_000 ? { hour: 'numeric', minute: '2-digit', timeZone } : { month: 'short', day: 'numeric', timeZone });
  const tickCount = Math.min(7, n);
  const xTicks = n === 0 ? [] : [...new Set(Array.from({ length: tickCount }, (_, k) => (tickCount <= 1 ? 0 : Math.round((k * (n - 1)) / (tickCount - 1)))))];
  const tickLabels = xTicks.map((i, k) => {
    const when = tickWhen.format(new Date(readings[i]!.takenAt));
    const before = k > 0 ? tickWhen.format(new Date(readings[xTicks[k - 1]!]!.takenAt)) : null;
    return { i, number: `No. ${i + 1}`, when: when === before ? '' : when };
  });

  // Labels at the right-hand end of each line, nudged apart so that close limits stay legible.
  const endLabels = lines
    ? [
        { v: lines.ucl, text: 'UCL', color: LIMIT_STROKE },
        { v: lines.mean, text: 'Centre', color: LIMIT_STROKE },
        { v: lines.lcl, text: 'LCL', color: LIMIT_STROKE },
        ...(lines.ewmaUcl !== null ? [{ v: lines.ewmaUcl, text: 'EWMA UCL', color: EWMA_STROKE }] : []),
        ...(lines.ewmaLcl !== null ? [{ v: lines.ewmaLcl, text: 'EWMA LCL', color: EWMA_STROKE }] : []),
      ]
        .map((l) => ({ ...l, at: y(l.v) }))
        .sort((a, b) => a.at - b.at)
        .reduce<{ v: number; text: string; color: string; at: number }[]>((placed, l) => {
          const previous = placed[placed.length - 1];
          placed.push(previous && l.at - previous.at < 13 ? { ...l, at: previous.at + 13 } : l);
          return placed;
        }, [])
    : [];

  const latest = readings[n - 1];
  const summary =
    n === 0
      ? 'No readings yet.'
      : [
          `${n} reading${n === 1 ? '' : 's'} from ${formatDateTime(readings[0]!.takenAt, timeZone)} to ${formatDateTime(latest!.takenAt, timeZone)}.`,
          `Latest ${readingText(latest!.readingNm, unit)}, ${BAND_WORD[latest!.band]}.`,
          `Bands: true up to ±${limitText(bands.trueNm, unit)}, fair up to ±${limitText(bands.fairNm, unit)}.`,
          lines
            ? `Centre line ${signed(lines.mean, 2)}, individuals limits ${signed(lines.lcl, 2)} to ${signed(lines.ucl, 2)} ${unitWords}; latest EWMA ${signed(ewma[ewma.length - 1] ?? 0, 2)} ${unitWords}${
                lines.ewmaUcl !== null && lines.ewmaLcl !== null ? ` against limits ${signed(lines.ewmaLcl, 2)} to ${signed(lines.ewmaUcl, 2)}` : ''
              }.`
            : `The drift watch draws its limits from ${DRIFT_DEFAULTS.minReadings} readings.`,
          drift.alert ? 'Drift alert raised.' : '',
        ]
          .filter(Boolean)
          .join(' ');

  const zones: { band: LevelBand; from: number; to: number }[] = [
    { band: 'off', from: fairU, to: hi },
    { band: 'fair', from: trueU, to: fairU },
    { band: 'true', from: -trueU, to: trueU },
    { band: 'fair', from: -fairU, to: -trueU },
    { band: 'off', from: lo, to: -fairU },
  ];
  const polyline = (series: number[]) => series.map((v, i) => `${x(i).toFixed(1)},${y(v).toFixed(1)}`).join(' ');
  const hLine = (v: number, stroke: string, dash?: string, width = 1.5) => (
    <line x1={M.l} x2={M.l + PLOT_W} y1={y(v)} y2={y(v)} stroke={stroke} strokeWidth={width} strokeDasharray={dash} />
  );

  if (n === 0) {
    return <p className="rounded-lg bg-glacier px-4 py-6 text-center text-sm text-ink-soft">No readings yet. Log a check reading to start the chart.</p>;
  }

  return (
    <figure>
      <svg viewBox={`0 0 ${W} ${H}`} className="h-auto w-full" role="img" aria-labelledby={`${titleId} ${descId}`}>
        <title id={titleId}>Level readings and the drift watch</title>
        <desc id={descId}>{summary}</desc>
        <defs>
          <clipPath id={clipId}>
            <rect x={M.l} y={M.t} width={PLOT_W} height={PLOT_H} />
          </clipPath>
        </defs>
        {/* One fill per strip, never stacked, so each zone keeps its own tint. */}
        {zones.map((z) => (
          <rect key={`${z.band}-${z.from}`} x={M.l} y={clampY(z.to)} width={PLOT_W} height={Math.max(0, clampY(z.from) - clampY(z.to))} fill={BAND_COLOR[z.band]} opacity={ZONE_OPACITY[z.band]} />
        ))}
        {yTicks.map((v) => (
          <g key={v}>
            <line x1={M.l} x2={M.l + PLOT_W} y1={y(v)} y2={y(v)} stroke="var(--color-rule)" strokeWidth={v === 0 ? 1.5 : 0.75} />
            <text x={M.l - 8} y={y(v)} dy="0.35em" textAnchor="end" fontSize="12" fill="var(--color-ink-soft)" style={{ fontVariantNumeric: 'tabular-nums' }}>
              {signed(v, decimals)}
            </text>
          </g>
        ))}
        <text transform={`translate(16 ${M.t + PLOT_H / 2}) rotate(-90)`} textAnchor="middle" fontSize="12" fontWeight="600" fill="var(--color-ink)">
          Level reading ({unitLabel}) · + right edge high
        </text>
        {tickLabels.map((t) => (
          <g key={t.i}>
            <line x1={x(t.i)} x2={x(t.i)} y1={M.t + PLOT_H} y2={M.t + PLOT_H + 5} stroke="var(--color-ink-soft)" />
            <text x={x(t.i)} y={M.t + PLOT_H + 17} textAnchor="middle" fontSize="11.5" fill="var(--color-ink-soft)" style={{ fontVariantNumeric: 'tabular-nums' }}>
              {t.number}
            </text>
            {t.when ? (
              <text x={x(t.i)} y={M.t + PLOT_H + 31} textAnchor="middle" fontSize="11.5" fill="var(--color-ink-soft)">
                {t.when}
              </text>
            ) : null}
          </g>
        ))}
        <text x={M.l + PLOT_W / 2} y={H - 6} textAnchor="middle" fontSize="12" fontWeight="600" fill="var(--color-ink)">
          Readings in the order taken, oldest on the left
        </text>
        <line x1={M.l} x2={M.l} y1={M.t} y2={M.t + PLOT_H} stroke="var(--color-ink-soft)" />
        <line x1={M.l} x2={M.l + PLOT_W} y1={M.t + PLOT_H} y2={M.t + PLOT_H} stroke="var(--color-ink-soft)" />
        <g clipPath={`url(#${clipId})`}>
          {lines ? (
            <>
              {hLine(lines.mean, LIMIT_STROKE)}
              {hLine(lines.ucl, LIMIT_STROKE, '6 4')}
              {hLine(lines.lcl, LIMIT_STROKE, '6 4')}
              {lines.ewmaUcl !== null ? hLine(lines.ewmaUcl, EWMA_STROKE, '2 3') : null}
              {lines.ewmaLcl !== null ? hLine(lines.ewmaLcl, EWMA_STROKE, '2 3') : null}
              {ewma.length > 1 ? <polyline points={polyline(ewma)} fill="none" stroke={EWMA_STROKE} strokeWidth="2.5" strokeLinejoin="round" /> : null}
            </>
          ) : null}
        </g>
        {readings.map((reading, i) => (
          <g key={`${reading.takenAt}-${i}`}>
            {flagged.has(i) ? <circle cx={x(i)} cy={clampY(values[i]!)} r={r + 4} fill="none" stroke="var(--color-ink)" strokeWidth="1.5" /> : null}
            <Marker band={reading.band} cx={x(i)} cy={clampY(values[i]!)} r={r} />
          </g>
        ))}
        {endLabels.map((l) => (
          <text key={l.text} x={M.l + PLOT_W + 6} y={l.at} dy="0.35em" fontSize="11.5" fontWeight="600" fill={l.color}>
            {l.text}
          </text>
        ))}
      </svg>
      <figcaption className="mt-3 space-y-2 text-sm">
        <ul className="flex flex-wrap gap-x-5 gap-y-1" aria-label="Legend">
          {(['true', 'fair', 'off'] as const).map((b) => (
            <li key={b} className="inline-flex items-center gap-1">
              <BandName band={b} />
              <span className="text-ink-soft tabular-nums">
                {b === 'true' ? `up to ±${limitText(bands.trueNm, unit)}` : b === 'fair' ? `up to ±${limitText(bands.fairNm, unit)}` : `beyond ±${limitText(bands.fairNm, unit)}`}
              </span>
            </li>
          ))}
        </ul>
        {lines ? (
          <ul className="flex flex-wrap gap-x-5 gap-y-1 text-ink-soft tabular-nums">
            <li className="inline-flex items-center gap-2">
              <LineSwatch stroke={LIMIT_STROKE} /> Centre line {signed(lines.mean, 2)}
            </li>
            <li className="inline-flex items-center gap-2">
              <LineSwatch stroke={LIMIT_STROKE} dash="6 4" /> Individuals limits {signed(lines.lcl, 2)} / {signed(lines.ucl, 2)}
            </li>
            <li className="inline-flex items-center gap-2">
              <LineSwatch stroke={EWMA_STROKE} width={3} /> EWMA
            </li>
            {lines.ewmaUcl !== null && lines.ewmaLcl !== null ? (
              <li className="inline-flex items-center gap-2">
                <LineSwatch stroke={EWMA_STROKE} dash="2 3" /> EWMA limits {signed(lines.ewmaLcl, 2)} / {signed(lines.ewmaUcl, 2)}
              </li>
            ) : null}
            {flagged.size > 0 ? (
              <li className="inline-flex items-center gap-2">
                <svg width="18" height="18" viewBox="0 0 18 18" aria-hidden="true">
                  <circle cx="9" cy="9" r="7.5" fill="none" stroke="var(--color-ink)" strokeWidth="1.5" />
                </svg>
                Ringed: raised the drift alert
              </li>
            ) : null}
            <li>All in {unitWords}</li>
          </ul>
        ) : (
          <p className="text-ink-soft">
            The drift watch draws its centre line and limits once the station has {DRIFT_DEFAULTS.minReadings} readings ({n} so far).
          </p>
        )}
      </figcaption>
      <ReadingsTable readings={readings} ewma={ewma} unit={unit} timeZone={timeZone} />
    </figure>
  );
}

function ReadingsTable({ readings, ewma, unit, timeZone }: { readings: Reading[]; ewma: number[]; unit: UnitPreference; timeZone: string }) {
  type Row = Reading & { n: number; ewma: number | undefined };
  const rows = useMemo<Row[]>(() => readings.map((r, i) => ({ ...r, n: i + 1, ewma: ewma[i] })).reverse(), [readings, ewma]);
  const columns = useMemo<ColumnDef<Row, unknown>[]>(
    () => [
      { accessorKey: 'n', header: 'No.', cell: ({ row }) => <span className="tabular-nums">{row.original.n}</span> },
      { accessorKey: 'takenAt', header: 'Taken', cell: ({ row }) => formatDateTime(row.original.takenAt, timeZone) },
      { accessorKey: 'kind', header: 'Kind', cell: ({ row }) => (row.original.kind === 'check' ? 'Check reading' : 'Sharpening') },
      { accessorKey: 'readingNm', header: `Reading (${readingUnitLabel(unit)})`, cell: ({ row }) => <span className="font-semibold tabular-nums">{readingText(row.original.readingNm, unit)}</span> },
      {
        accessorKey: 'band',
        header: 'Band',
        cell: ({ row }) => <BandName band={row.original.band} />,
      },
      {
        accessorKey: 'ewma',
        header: 'EWMA',
        enableSorting: false,
        cell: ({ row }) => <span className="tabular-nums text-ink-soft">{row.original.ewma === undefined ? '—' : signed(row.original.ewma, 2)}</span>,
      },
    ],
    [unit, timeZone],
  );
  return (
    <details className="mt-4 rounded-lg border border-rule">
      <summary className="flex min-h-11 cursor-pointer items-center px-4 text-sm font-semibold text-steel-dark">Show the readings as a table ({readings.length}, newest first)</summary>
      <div className="max-h-96 overflow-y-auto border-t border-rule" tabIndex={0} role="region" aria-label="Readings table">
        <DataTable data={rows} columns={columns} caption="Level readings of this station, newest first" empty="No readings." />
      </div>
    </details>
  );
}
