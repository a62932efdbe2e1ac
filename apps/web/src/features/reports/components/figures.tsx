import type { ReactNode } from 'react';
import { formatPeriod, formatShare, signedText } from './numbers';

export interface FigureSpec {
  label: string;
  /** A band's mark, shown before its label. */
  mark?: ReactNode;
  value: number | null;
  format: (n: number) => string;
  /** The same figure in the comparison period, when one is chosen. */
  previous?: number | null | undefined;
  /** Shares change by percentage points; a relative change of a share would read as nonsense. */
  share?: boolean;
  /** What a missing figure means ("no tickets ready"), shown instead of a bare dash. */
  missing?: string;
  note?: ReactNode;
}

const points = new Intl.NumberFormat(undefined, { maximumFractionDigits: 1 });

function change(spec: FigureSpec): string | null {
  const { value, previous } = spec;
  if (previous === undefined) return null;
  if (value === null || previous === null) return 'no change to show';
  const diff = value - previous;
  if (diff === 0) return 'no change';
  if (spec.share) return `${signedText(diff * 100, (n) => points.format(n))} points`;
  const relative = previous === 0 ? '' : ` (${signedText(diff / Math.abs(previous), formatShare)})`;
  return `${signedText(diff, spec.format)}${relative}`;
}

/** A figure card: the figure, and with a comparison its value then and the change, in words as well as arrows. */
export function Figure({ spec }: { spec: FigureSpec }) {
  const delta = change(spec);
  const up = spec.value !== null && spec.previous != null && spec.value > spec.previous;
  const down = spec.value !== null && spec.previous != null && spec.value < spec.previous;
  return (
    <div className="rounded-lg bg-glacier px-4 py-3">
      <dt className="flex items-center gap-1 text-sm font-medium text-ink-soft">
        {spec.mark}
        {spec.label}
      </dt>
      <dd className="mt-1 text-2xl font-bold tabular-nums">{spec.value === null ? <span className="text-base font-semibold text-ink-soft">{spec.missing ?? 'None'}</span> : spec.format(spec.value)}</dd>
      {spec.previous !== undefined ? (
        <dd className="mt-1 text-sm text-ink-soft tabular-nums">
          Then {spec.previous === null ? '—' : spec.format(spec.previous)}
          {delta ? (
            <>
              {' · '}
              <span aria-hidden="true">{up ? '▲ ' : down ? '▼ ' : ''}</span>
              {delta}
            </>
          ) : null}
        </dd>
      ) : null}
      {spec.note ? <dd className="mt-1 text-xs text-ink-soft">{spec.note}</dd> : null}
    </div>
  );
}

export function Figures({ specs, compare }: { specs: FigureSpec[]; compare: { from: string; to: string } | null | undefined }) {
  return (
    <div>
      {compare ? <p className="mb-2 text-sm text-ink-soft">“Then” is {formatPeriod(compare)}.</p> : null}
      <dl className="grid gap-3 sm:grid-cols-2 lg:grid-cols-4">
        {specs.map((spec) => (
          <Figure key={spec.label} spec={spec} />
        ))}
      </dl>
    </div>
  );
}
