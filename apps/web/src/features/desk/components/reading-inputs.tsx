import type { ReadingInput, UnitPreference } from '@rinkwright/core';
import { parseReading, readingUnitLabel } from '../../../lib/units';

export type ReadingMode = 'level' | 'tilt';

export interface ReadingDraft {
  left: string;
  right: string;
}

/** The typed readings as the API takes them; blank blades are left out. Returns an error text for a bad one. */
export function readingsOf(draft: ReadingDraft, mode: ReadingMode, unit: UnitPreference): { readings: ReadingInput[]; error?: string } {
  const readings: ReadingInput[] = [];
  for (const blade of ['left', 'right'] as const) {
    const text = draft[blade].trim();
    if (!text) continue;
    if (mode === 'tilt') {
      const deg = Number(text.replace(',', '.').replace('\u2212', '-'));
      if (!Number.isFinite(deg) || Math.abs(deg) > 20) return { readings, error: `The ${blade} tilt must be an angle in degrees` };
      readings.push({ blade, tiltDeg: deg });
    } else {
      const nm = parseReading(text, unit);
      if (nm === null) return { readings, error: `The ${blade} reading must be a number in ${readingUnitLabel(unit)}` };
      readings.push({ blade, readingNm: nm });
    }
  }
  return { readings };
}

export function ReadingInputs({ draft, onChange, mode, unit, idPrefix, onEnter }: { draft: ReadingDraft; onChange: (d: ReadingDraft) => void; mode: ReadingMode; unit: UnitPreference; idPrefix: string; onEnter?: () => void }) {
  const unitLabel = mode === 'tilt' ? '°' : readingUnitLabel(unit);
  return (
    <>
      {(['left', 'right'] as const).map((blade) => (
        <label key={blade} className="block text-sm font-semibold">
          {blade === 'left' ? 'Left' : 'Right'} {mode === 'tilt' ? 'tilt' : 'reading'} ({unitLabel})
          <input
            id={`${idPrefix}-${blade}`}
            className="mt-1 block min-h-11 w-full rounded-lg border border-rule bg-white px-3 text-lg tabular-nums"
            inputMode="decimal"
            value={draft[blade]}
            onChange={(e) => onChange({ ...draft, [blade]: e.target.value })}
            onKeyDown={(e) => {
              if (e.key === 'Enter' && onEnter) {
                e.preventDefault();
                onEnter();
              }
            }}
          />
        </label>
      ))}
    </>
  );
}
