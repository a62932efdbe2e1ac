import type { StationRow, UnitPreference } from '@rinkwright/core';
import { LinkButton } from '../../../components/ui/button';
import { showLength } from '../../../lib/units';
import { STATUS_LABEL, wholeNumber } from './typed';

const STATUS_STYLE: Record<StationRow['status'], string> = {
  active: 'border-steel text-steel-dark',
  maintenance: 'border-amber text-ink',
  retired: 'border-rule text-ink-soft',
};

export function StatusBadge({ status }: { status: StationRow['status'] }) {
  return <span className={`inline-flex items-center rounded-full border-2 px-3 py-0.5 text-xs font-bold ${STATUS_STYLE[status]}`}>{STATUS_LABEL[status]}</span>;
}

/** Raised on the card too, so a drifting station is seen from the list. */
function DriftFlag() {
  return (
    <p className="mt-3 flex items-center gap-2 rounded-lg border-2 border-brick bg-red-50 px-3 py-2 text-sm font-bold text-brick">
      <svg width="18" height="18" viewBox="0 0 16 16" aria-hidden="true">
        <path d="M8 1.5 L15 14.5 L1 14.5 Z" fill="none" stroke="currentColor" strokeWidth="1.8" strokeLinejoin="round" />
        <path d="M8 6 V10 M8 11.6 V12.4" stroke="currentColor" strokeWidth="1.8" strokeLinecap="round" />
      </svg>
      Drift alert: see its readings
    </p>
  );
}

export function StationCard({ station, unit }: { station: StationRow; unit: UnitPreference }) {
  const wheel = station.wheel;
  return (
    <article aria-labelledby={`station-${station.id}`} className="flex w-full flex-col rounded-xl border border-rule bg-white p-5 shadow-sm">
      <div className="flex items-start justify-between gap-3">
        <h2 id={`station-${station.id}`} className="text-lg font-bold">
          {station.name}
        </h2>
        <StatusBadge status={station.status} />
      </div>
      {station.driftAlert ? <DriftFlag /> : null}
      <dl className="mt-3 grid grid-cols-[auto_1fr] gap-x-4 gap-y-1 text-sm">
        <dt className="font-semibold text-ink-soft">Wheel</dt>
        <dd>{wheel ? `${wheel.label}, grit ${wheel.grit}` : 'No wheel mounted'}</dd>
        {wheel ? (
          <>
            <dt className="font-semibold text-ink-soft">Hollow</dt>
            <dd className="tabular-nums">{wheel.hollowNm === null ? 'Not dressed yet' : showLength(wheel.hollowNm, unit, 'hollow')}</dd>
            <dt className="font-semibold text-ink-soft">Diameter</dt>
            <dd className="tabular-nums">
              {showLength(wheel.diameterNm, unit, 'diameter')} <span className="text-ink-soft">(minimum {showLength(wheel.minDiameterNm, unit, 'diameter')})</span>
            </dd>
            <dt className="font-semibold text-ink-soft">Passes</dt>
            <dd className="tabular-nums">{wholeNumber(wheel.passesSinceMount)} since mounting</dd>
          </>
        ) : null}
        <dt className="font-semibold text-ink-soft">Speed</dt>
        <dd className="tabular-nums">{wholeNumber(station.rpm)} RPM</dd>
      </dl>
      <dl className="mt-4 grid grid-cols-2 gap-2">
        <div className="rounded-lg bg-glacier px-3 py-2">
          <dt className="text-xs font-semibold text-ink-soft">Waiting</dt>
          <dd className="text-xl font-bold tabular-nums">{station.queue.waiting}</dd>
        </div>
        <div className="rounded-lg bg-glacier px-3 py-2">
          <dt className="text-xs font-semibold text-ink-soft">On station</dt>
          <dd className="text-xl font-bold tabular-nums">{station.queue.onStation}</dd>
        </div>
      </dl>
      <LinkButton to={station.id} tone="secondary" className="mt-4 self-start" aria-label={`Open ${station.name}: readings, drift watch and upkeep`}>
        Readings and upkeep
      </LinkButton>
    </article>
  );
}
