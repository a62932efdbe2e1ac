import { AxisBottom } from '@visx/axis';
import { Group } from '@visx/group';
import { scaleLinear } from '@visx/scale';
import { Bar } from '@visx/shape';
import { formatCount } from '../../../../lib/format';
import { ChartFrame, INK, INK_SOFT, RULE, STEEL, axisLabel, tickLabel } from './chart-frame';

export interface AllocationRow {
  key: string;
  team: string;
  league: string;
  allocated: number;
  used: number;
}

const W = 880;
const M = { l: 200, r: 8, t: 8, b: 52 };
const BAR_W = 440;
const ROW = 52;
const BAR_H = 22;

/**
 * Each team's allocation as an outlined track and what its players used as the filled part of it. The words
 * beside each bar say the same, and a team that used more than it was given shows its bar past the track's end.
 */
export function AllocationBars({ rows, title, summary }: { rows: AllocationRow[]; title: string; summary: string }) {
  const top = Math.max(1, ...rows.map((r) => Math.max(r.allocated, r.used)));
  const x = scaleLinear<number>({ domain: [0, top], range: [0, BAR_W], nice: 5 });
  const plotH = rows.length * ROW;
  // Credits are whole: a small scale must not print 0.5 (or two ticks that both round to 1).
  const ticks = x.ticks(5).filter(Number.isInteger);
  return (
    <ChartFrame width={W} height={plotH + M.t + M.b} title={title} summary={summary}>
      <Group left={M.l} top={M.t}>
        {ticks.map((t) => (
          <line key={t} x1={x(t)} x2={x(t)} y1={0} y2={plotH} stroke={RULE} />
        ))}
        {rows.map((row, i) => {
          const cy = i * ROW + ROW / 2;
          return (
            <g key={row.key}>
              <text x={-12} y={cy - 2} textAnchor="end" fontSize={14} fontWeight={600} fill={INK}>
                {row.team}
              </text>
              <text x={-12} y={cy + 14} textAnchor="end" fontSize={12} fill={INK_SOFT}>
                {row.league}
              </text>
              <rect x={0} y={cy - BAR_H / 2} width={Math.max(1, x(row.allocated))} height={BAR_H} rx={3} fill="var(--color-glacier)" stroke={INK_SOFT} strokeWidth={1.5} />
              {row.used > 0 ? <Bar x={0} y={cy - BAR_H / 2 + 5} width={x(row.used)} height={BAR_H - 10} fill={STEEL} /> : null}
              <text x={BAR_W + 20} y={cy + 5} fontSize={13} fill={INK}>
                <tspan fontWeight={700}>{formatCount(row.used)}</tspan> used of {formatCount(row.allocated)} allocated
              </text>
            </g>
          );
        })}
        <AxisBottom
          top={plotH}
          scale={x}
          tickValues={ticks}
          tickFormat={(v) => formatCount(Number(v))}
          stroke={INK_SOFT}
          tickStroke={INK_SOFT}
          tickLabelProps={{ ...tickLabel, textAnchor: 'middle' }}
          label="Credits"
          labelOffset={14}
          labelProps={axisLabel}
        />
      </Group>
    </ChartFrame>
  );
}
