import { useId, type ReactNode } from 'react';

export const INK = 'var(--color-ink)';
export const INK_SOFT = 'var(--color-ink-soft)';
export const RULE = 'var(--color-rule)';
export const STEEL = 'var(--color-steel)';

export const tickLabel = { fill: INK_SOFT, fontSize: 12, fontFamily: 'inherit' } as const;
export const axisLabel = { fill: INK, fontSize: 13, fontWeight: 600, fontFamily: 'inherit', textAnchor: 'middle' } as const;

/**
 * An SVG chart that scales to its column and reads as one image to a screen reader: its title and a sentence that
 * sums it up. The figures themselves are in the table beside every chart.
 */
export function ChartFrame({ width, height, title, summary, children }: { width: number; height: number; title: string; summary: string; children: ReactNode }) {
  const id = useId();
  return (
    <svg viewBox={`0 0 ${width} ${height}`} className="block h-auto w-full" role="img" aria-labelledby={`${id}-title ${id}-desc`}>
      <title id={`${id}-title`}>{title}</title>
      <desc id={`${id}-desc`}>{summary}</desc>
      {children}
    </svg>
  );
}

export function Swatch({ fill, stroke, pattern }: { fill: string; stroke?: string; pattern?: boolean }) {
  return (
    <svg width="18" height="14" viewBox="0 0 18 14" aria-hidden="true" className="inline-block shrink-0">
      <rect x="1" y="1" width="16" height="12" rx="2" fill={fill} stroke={stroke} strokeWidth={stroke ? 1.5 : 0} />
      {pattern ? <path d="M1 13 L13 1 M7 13 L17 3" stroke="white" strokeWidth="2" /> : null}
    </svg>
  );
}

export function Legend({ items }: { items: { key: string; swatch: ReactNode; label: ReactNode }[] }) {
  return (
    <ul className="mt-2 flex flex-wrap gap-x-5 gap-y-1 text-sm">
      {items.map((item) => (
        <li key={item.key} className="inline-flex items-center gap-2">
          {item.swatch}
          {item.label}
        </li>
      ))}
    </ul>
  );
}
