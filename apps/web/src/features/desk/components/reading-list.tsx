import type { LevelBands, ReadingRow, UnitPreference } from '@rinkwright/core';
import { LevelScale } from '../../../components/ui/level-reading';
import { formatDateTime } from '../../../lib/format';

/** Each blade's readings in the order taken: the first, then each re-run; none is ever overwritten. */
export function ReadingList({ readings, bands, unit, timeZone }: { readings: ReadingRow[]; bands: LevelBands | null; unit: UnitPreference; timeZone: string }) {
  if (readings.length === 0) return <p className="text-sm text-ink-soft">No level reading.</p>;
  return (
    <ul className="grid gap-3 sm:grid-cols-2">
      {(['left', 'right'] as const).map((blade) => {
        const own = readings.filter((r) => r.blade === blade).sort((a, b) => a.attempt - b.attempt);
        if (own.length === 0) return null;
        return (
          <li key={blade} className="space-y-2">
            <p className="text-sm font-bold">{blade === 'left' ? 'Left skate' : 'Right skate'}</p>
            {own.map((r) => (
              <div key={r.id} className="rounded-lg bg-frost p-2">
                <p className="mb-1 text-xs text-ink-soft">
                  {r.attempt === 1 ? 'First reading' : `Re-run ${r.attempt - 1}`} · {r.takenBy} · {formatDateTime(r.takenAt, timeZone)}
                  {r.tiltMillideg !== null ? ` · from a tilt of ${(r.tiltMillideg / 1000).toFixed(3)}°` : ''}
                </p>
                {bands ? <LevelScale readingNm={r.readingNm} bands={bands} unit={unit} /> : null}
              </div>
            ))}
          </li>
        );
      })}
    </ul>
  );
}
