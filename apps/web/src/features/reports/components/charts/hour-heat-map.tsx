import { AxisBottom, AxisLeft } from '@visx/axis';
import { Group } from '@visx/group';
import { HeatmapRect } from '@visx/heatmap';
import { scaleBand } from '@visx/scale';
import { formatCount } from '../../../../lib/format';
import { WEEKDAYS } from '../numbers';
import { ChartFrame, INK_SOFT, axisLabel, tickLabel } from './chart-frame';

// Five strengths of the palette's dark steel. Stepped rather than continuous so that the number printed in each
// cell keeps AA contrast (WCAG 2.1, 1.4.3; ratios worked out for each step): ink on the four light steps (5.5:1 or
// more), white on the darkest (6.6:1). A continuous scale would pass through shades where neither reaches 4.5:1.
const CELL = 'var(--color-steel-dark)';
const STEPS = [
  { opacity: 0.15, text: 'var(--color-ink)' },
  { opacity: 0.3, text: 'var(--color-ink)' },
  { opacity: 0.45, text: 'var(--color-ink)' },
  { opacity: 0.6, text: 'var(--color-ink)' },
  { opacity: 0.95, text: 'white' },
] as const;

const W = 880;
const M = { l: 124, r: 8, t: 8, b: 58 };
const ROW = 36;

interface Cell {
  weekday: number;
  pairs: number;
}
interface Column {
  hour: number;
  cells: Cell[];
}

const stepOf = (pairs: number, max: number) => STEPS[Math.min(STEPS.length - 1, Math.floor(((pairs - 1) / Math.max(1, max)) * STEPS.length))] ?? STEPS[0];
const hourText = (hour: number) => String(hour).padStart(2, '0');

/** Pairs by weekday (rows) and hour (columns), the count written in every busy cell. */
export function HourHeatMap({ byHour, title, summary }: { byHour: { weekday: number; hour: number; pairs: number }[]; title: string; summary: string }) {
  const busy = byHour.filter((c) => c.pairs > 0);
  // Only the hours the counter worked: a rink closed at night gets wide cells instead of eight empty columns.
  const first = Math.min(...busy.map((c) => c.hour));
  const last = Math.max(...busy.map((c) => c.hour));
  const hours = Array.from({ length: last - first + 1 }, (_, i) => first + i);
  const max = Math.max(1, ...busy.map((c) => c.pairs));
  const count = new Map(byHour.map((c) => [`${c.weekday}:${c.hour}`, c.pairs]));
  const data: Column[] = hours.map((hour) => ({ hour, cells: WEEKDAYS.map((_, i) => ({ weekday: i + 1, pairs: count.get(`${i + 1}:${hour}`) ?? 0 })) }));

  const plotW = W - M.l - M.r;
  const plotH = ROW * 7;
  const colW = plotW / hours.length;
  const xBand = scaleBand<number>({ domain: hours, range: [0, plotW] });
  const yBand = scaleBand<string>({ domain: [...WEEKDAYS], range: [0, plotH] });
  return (
    <div>
      <ChartFrame width={W} height={plotH + M.t + M.b} title={title} summary={summary}>
        <Group left={M.l} top={M.t}>
          <HeatmapRect<Column, Cell> data={data} bins={(c) => c.cells} count={(c) => c.pairs} xScale={(i) => i * colW} yScale={(j) => j * ROW} binWidth={colW} binHeight={ROW} gap={2}>
            {(columns) =>
              columns.map((column) =>
                column.map((cell) => {
                  const pairs = cell.bin.pairs;
                  const step = pairs > 0 ? stepOf(pairs, max) : null;
                  return (
                    <g key={`${cell.column}-${cell.row}`}>
                      {step ? (
                        <rect x={cell.x} y={cell.y} width={cell.width} height={cell.height} rx={3} fill={CELL} fillOpacity={step.opacity} />
                      ) : (
                        <rect x={cell.x + 0.5} y={cell.y + 0.5} width={cell.width - 1} height={cell.height - 1} rx={3} fill="var(--color-frost)" stroke="var(--color-rule)" />
                      )}
                      {pairs > 0 ? (
                        <text x={cell.x + cell.width / 2} y={cell.y + cell.height / 2 + 4} textAnchor="middle" fontSize={colW < 34 ? 10 : 12} fontWeight={600} fill={step?.text}>
                          {formatCount(pairs)}
                        </text>
                      ) : null}
                    </g>
                  );
                }),
              )
            }
          </HeatmapRect>
          <AxisLeft
            scale={yBand}
            hideAxisLine
            hideTicks
            tickLabelProps={{ ...tickLabel, textAnchor: 'end', dx: -6, dy: 4 }}
            label="Weekday"
            labelOffset={84}
            labelProps={axisLabel}
          />
          <AxisBottom
            top={plotH}
            scale={xBand}
            hideAxisLine
            tickFormat={hourText}
            stroke={INK_SOFT}
            tickStroke={INK_SOFT}
            tickLabelProps={{ ...tickLabel, textAnchor: 'middle' }}
            label="Hour of the day (rink time)"
            labelOffset={16}
            labelProps={axisLabel}
          />
        </Group>
      </ChartFrame>
      <div className="mt-2 flex flex-wrap items-center gap-2 text-sm text-ink-soft" aria-hidden="true">
        <span>Fewer pairs</span>
        {STEPS.map((s) => (
          <span key={s.opacity} className="inline-block h-4 w-8 rounded-sm bg-steel-dark" style={{ opacity: s.opacity }} />
        ))}
        <span>More pairs (up to {formatCount(max)} in an hour). Each cell shows its number of pairs; a blank cell had none.</span>
      </div>
    </div>
  );
}
