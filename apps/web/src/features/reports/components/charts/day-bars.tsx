import { AxisBottom, AxisLeft } from '@visx/axis';
import { Group } from '@visx/group';
import { scaleBand, scaleLinear } from '@visx/scale';
import { Bar } from '@visx/shape';
import { ChartFrame, INK_SOFT, RULE, axisLabel, tickLabel } from './chart-frame';

export interface DaySeries {
  label: string;
  fill: string;
  /** Hatched as well as coloured, so the two series differ in greyscale too. */
  hatched?: boolean;
}

const W = 880;
const H = 300;
const M = { r: 16, t: 16, b: 60 };

const dayTick = new Intl.DateTimeFormat(undefined, { month: 'short', day: 'numeric', timeZone: 'UTC' });
const dayTickText = (day: string) => dayTick.format(new Date(`${day}T00:00:00Z`));

/**
 * Bars by day: one series above the zero line and, optionally, one below it (refunds under sales), so the two are
 * told apart by where they stand, not only by their colour.
 */
export function DayBars({
  days,
  up,
  down,
  title,
  summary,
  yLabel,
  formatValue,
  whole = false,
}: {
  days: { day: string; up: number; down?: number }[];
  up: DaySeries;
  down?: DaySeries;
  title: string;
  summary: string;
  yLabel: string;
  formatValue: (n: number) => string;
  /** Counts: only whole ticks, so a quiet month does not print 0.5 pairs. */
  whole?: boolean;
}) {
  const plotH = H - M.t - M.b;
  const top = Math.max(1, ...days.map((d) => d.up));
  const bottom = down ? Math.max(0, ...days.map((d) => d.down ?? 0)) : 0;
  const y = scaleLinear<number>({ domain: [-bottom, top], range: [plotH, 0], nice: true });
  const yTicks = y.ticks(5).filter((t) => !whole || Number.isInteger(t));
  // Room for the longest tick label (about 7 units a character at 12 px) and the axis label beyond it: the axis
  // puts the label's baseline tick length (8) + labelOffset from the line, and its letters reach about 12 further.
  const labelOffset = Math.max(...yTicks.map((t) => formatValue(Math.abs(t)).length)) * 7 + 16;
  const left = 8 + labelOffset + 12 + 8;
  const plotW = W - left - M.r;
  const x = scaleBand<string>({ domain: days.map((d) => d.day), range: [0, plotW], padding: days.length > 60 ? 0.1 : 0.25 });
  const every = Math.max(1, Math.ceil(days.length / 10));
  const tickDays = days.filter((_, i) => i % every === 0).map((d) => d.day);
  const patternId = `hatch-${title.replace(/\W/g, '')}`;
  const zero = y(0);
  const bandWidth = x.bandwidth();
  return (
    <ChartFrame width={W} height={H} title={title} summary={summary}>
      {down?.hatched ? (
        <defs>
          <pattern id={patternId} width="6" height="6" patternUnits="userSpaceOnUse" patternTransform="rotate(45)">
            <rect width="6" height="6" fill={down.fill} />
            <line x1="0" y1="0" x2="0" y2="6" stroke="white" strokeWidth="2" />
          </pattern>
        </defs>
      ) : null}
      <Group left={left} top={M.t}>
        {yTicks.map((t) => (
          <line key={t} x1={0} x2={plotW} y1={y(t)} y2={y(t)} stroke={RULE} strokeWidth={1} />
        ))}
        {days.map((d) => {
          const barX = x(d.day) ?? 0;
          return (
            <g key={d.day}>
              {d.up > 0 ? <Bar x={barX} y={y(d.up)} width={bandWidth} height={zero - y(d.up)} fill={up.fill} /> : null}
              {down && (d.down ?? 0) > 0 ? <Bar x={barX} y={zero} width={bandWidth} height={y(-(d.down ?? 0)) - zero} fill={down.hatched ? `url(#${patternId})` : down.fill} /> : null}
            </g>
          );
        })}
        <line x1={0} x2={plotW} y1={zero} y2={zero} stroke={INK_SOFT} strokeWidth={1.5} />
        <AxisLeft
          scale={y}
          tickValues={yTicks}
          tickFormat={(v) => formatValue(Math.abs(Number(v)))}
          stroke={INK_SOFT}
          tickStroke={INK_SOFT}
          tickLabelProps={{ ...tickLabel, textAnchor: 'end', dx: -4, dy: 4 }}
          label={yLabel}
          labelOffset={labelOffset}
          labelProps={axisLabel}
        />
        <AxisBottom
          top={plotH}
          scale={x}
          tickValues={tickDays}
          tickFormat={dayTickText}
          stroke={INK_SOFT}
          tickStroke={INK_SOFT}
          tickLabelProps={{ ...tickLabel, textAnchor: 'middle' }}
          label="Day"
          labelOffset={18}
          labelProps={axisLabel}
        />
      </Group>
    </ChartFrame>
  );
}
