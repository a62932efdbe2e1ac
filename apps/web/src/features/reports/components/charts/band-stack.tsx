import { AxisBottom } from '@visx/axis';
import { Group } from '@visx/group';
import { scaleLinear } from '@visx/scale';
import { Bar } from '@visx/shape';
import type { LevelBand } from '@rinkwright/core';
import { formatShare } from '../numbers';
import { ChartFrame, INK, INK_SOFT, RULE, axisLabel, tickLabel } from './chart-frame';

// Each band keeps its colour, its shape (filled circle, half-filled circle, hollow triangle) and its word with the
// share beside every bar: the chart reads the same in greyscale and to someone who cannot tell amber from brick.

export const BANDS: readonly LevelBand[] = ['true', 'fair', 'off'];
export const BAND_WORD: Record<LevelBand, string> = { true: 'True', fair: 'Fair', off: 'Off' };
const BAND_FILL: Record<LevelBand, string> = { true: 'var(--color-band-true)', fair: 'var(--color-band-fair)', off: 'var(--color-band-off)' };

export interface BandRow {
  station: string;
  trueShare: number | null;
  fairShare: number | null;
  offShare: number | null;
  firstReadings: number;
}

const W = 880;
const M = { l: 150, r: 8, t: 8, b: 52 };
const BAR_W = 400;
const ROW = 48;
const BAR_H = 22;

/** The band's mark in the chart's own coordinates, drawn as the level-reading icon draws it. */
function Mark({ band, x, y }: { band: LevelBand; x: number; y: number }) {
  const color = BAND_FILL[band];
  if (band === 'true') return <circle cx={x} cy={y} r={6} fill={color} />;
  if (band === 'fair')
    return (
      <g>
        <circle cx={x} cy={y} r={5.5} fill="white" stroke={color} strokeWidth={2} />
        <path d={`M${x} ${y - 5.5} A5.5 5.5 0 0 0 ${x} ${y + 5.5} Z`} fill={color} />
      </g>
    );
  return <path d={`M${x} ${y - 6} L${x + 6.5} ${y + 6} L${x - 6.5} ${y + 6} Z`} fill="white" stroke={color} strokeWidth={2} strokeLinejoin="round" />;
}

const shareOf = (row: BandRow, band: LevelBand) => (band === 'true' ? row.trueShare : band === 'fair' ? row.fairShare : row.offShare);

export function BandStack({ rows, title, summary }: { rows: BandRow[]; title: string; summary: string }) {
  const x = scaleLinear<number>({ domain: [0, 1], range: [0, BAR_W] });
  const plotH = rows.length * ROW;
  return (
    <ChartFrame width={W} height={plotH + M.t + M.b} title={title} summary={summary}>
      <Group left={M.l} top={M.t}>
        {[0, 0.25, 0.5, 0.75, 1].map((t) => (
          <line key={t} x1={x(t)} x2={x(t)} y1={0} y2={plotH} stroke={RULE} />
        ))}
        {rows.map((row, i) => {
          const cy = i * ROW + ROW / 2;
          let start = 0;
          return (
            <g key={row.station}>
              <text x={-12} y={cy + 5} textAnchor="end" fontSize={14} fontWeight={600} fill={INK}>
                {row.station}
              </text>
              {row.firstReadings === 0 ? (
                <text x={8} y={cy + 5} fontSize={13} fill={INK_SOFT}>
                  No first readings in this period
                </text>
              ) : (
                <>
                  {BANDS.map((band) => {
                    const share = shareOf(row, band) ?? 0;
                    const left = start;
                    start += share;
                    return share > 0 ? <Bar key={band} x={x(left)} y={cy - BAR_H / 2} width={Math.max(1, x(share))} height={BAR_H} fill={BAND_FILL[band]} stroke="white" strokeWidth={1} /> : null;
                  })}
                  {BANDS.map((band, k) => {
                    const at = BAR_W + 24 + k * 104;
                    return (
                      <g key={band}>
                        <Mark band={band} x={at} y={cy} />
                        <text x={at + 12} y={cy + 5} fontSize={13} fill={INK}>
                          <tspan fontWeight={700}>{BAND_WORD[band]}</tspan> {formatShare(shareOf(row, band) ?? 0)}
                        </text>
                      </g>
                    );
                  })}
                </>
              )}
            </g>
          );
        })}
        <AxisBottom
          top={plotH}
          scale={x}
          tickValues={[0, 0.25, 0.5, 0.75, 1]}
          tickFormat={(v) => formatShare(Number(v))}
          stroke={INK_SOFT}
          tickStroke={INK_SOFT}
          tickLabelProps={{ ...tickLabel, textAnchor: 'middle' }}
          label="Share of first readings"
          labelOffset={14}
          labelProps={axisLabel}
        />
      </Group>
    </ChartFrame>
  );
}
