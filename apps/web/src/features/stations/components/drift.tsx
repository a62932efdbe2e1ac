import { DRIFT_DEFAULTS, RUN_RULES, type StationDetail, type UnitPreference } from '@rinkwright/core';
import { formatDateTime } from '../../../lib/format';
import { readingText } from './typed';

// The drift watch says why it raised an alert in its own terms; these turn each reason into a sentence a
// technician can act on, with the reading it points at.

const CHART_WORDS: Record<string, string> = {
  individuals: 'A reading beyond the individuals chart’s limits',
  moving_range: 'A jump from one reading to the next beyond the moving-range limit',
  ewma: 'The EWMA has crossed its limit: the readings are moving steadily away from level',
};

function reasonText(reason: StationDetail['drift']['reasons'][number]): string {
  if (reason.chart === 'run_rule') {
    const rule = RUN_RULES.find((r) => r.id === reason.rule);
    return rule ? `Run rule ${rule.number}: ${rule.description.charAt(0).toLowerCase()}${rule.description.slice(1)}` : 'A run of readings to one side of the centre line';
  }
  return CHART_WORDS[reason.chart] ?? 'The drift watch flagged a reading';
}

/** "reading 120", "readings 116, 118–120": which readings broke a rule, as short as it can be said. */
function readingList(indices: number[]): string {
  const sorted = [...new Set(indices)].sort((a, b) => a - b).map((i) => i + 1);
  const runs: string[] = [];
  for (let k = 0; k < sorted.length; ) {
    let end = k;
    while (end + 1 < sorted.length && sorted[end + 1] === sorted[end]! + 1) end++;
    runs.push(end === k ? String(sorted[k]) : `${sorted[k]}\u2013${sorted[end]}`);
    k = end + 1;
  }
  return `${sorted.length === 1 ? 'reading' : 'readings'} ${runs.join(', ')}`;
}

/** One line per rule broken, with the readings that broke it: the same few readings usually break several. */
export function driftReasons(detail: StationDetail) {
  const byText = new Map<string, number[]>();
  for (const reason of detail.drift.reasons) byText.set(reasonText(reason), [...(byText.get(reasonText(reason)) ?? []), reason.index]);
  return [...byText.entries()].map(([text, indices]) => ({ text, readings: readingList(indices), latest: Math.max(...indices) }));
}

export function DriftBanner({ detail, unit, timeZone }: { detail: StationDetail; unit: UnitPreference; timeZone: string }) {
  if (!detail.drift.alert) return null;
  const reasons = driftReasons(detail);
  const latestIndex = Math.max(...reasons.map((r) => r.latest));
  const latest = detail.readings[latestIndex];
  return (
    <section role="alert" aria-labelledby="drift-alert-title" className="rounded-xl border-2 border-brick bg-red-50 px-5 py-4">
      <h2 id="drift-alert-title" className="flex items-center gap-2 text-lg font-extrabold text-brick">
        <svg width="22" height="22" viewBox="0 0 16 16" aria-hidden="true">
          <path d="M8 1.5 L15 14.5 L1 14.5 Z" fill="none" stroke="currentColor" strokeWidth="1.8" strokeLinejoin="round" />
          <path d="M8 6 V10 M8 11.6 V12.4" stroke="currentColor" strokeWidth="1.8" strokeLinecap="round" />
        </svg>
        Drift alert: this station is drifting out of level
      </h2>
      {latest ? (
        <p className="mt-1 text-sm font-semibold tabular-nums">
          Latest flagged: reading {latestIndex + 1}, {readingText(latest.readingNm, unit)} on {formatDateTime(latest.takenAt, timeZone)}.
        </p>
      ) : null}
      <ul className="mt-2 list-disc space-y-0.5 pl-5 text-sm text-ink">
        {reasons.map((r) => (
          <li key={r.text}>
            {r.text} <span className="text-ink-soft tabular-nums">({r.readings})</span>
          </li>
        ))}
      </ul>
      <p className="mt-3 text-sm font-semibold">Take a check reading, then follow the leveling advice below and log the adjustment you make.</p>
    </section>
  );
}

export function DriftStatus({ detail }: { detail: StationDetail }) {
  const { drift, readings } = detail;
  if (drift.status === 'not_enough_data') {
    return <p className="text-sm text-ink-soft">Watching starts at {DRIFT_DEFAULTS.minReadings} readings; this station has {readings.length} so far.</p>;
  }
  return drift.alert ? (
    <p className="text-sm font-semibold text-brick">Drift alert raised by the latest readings (see above).</p>
  ) : (
    <p className="text-sm">In control: nothing in the last five readings breaks the chart limits or the run rules.</p>
  );
}
