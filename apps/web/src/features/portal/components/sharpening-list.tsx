import { formatLength, type LevelBands, type PortalRinkDetail, type UnitPreference } from '@rinkwright/core';
import { LevelScale } from '../../../components/ui/level-reading';
import { formatDateTime } from '../../../lib/format';
import { showLength } from '../../../lib/units';
import { Dotted } from './dotted';
import { ShowMoreButton, useShowMore } from './show-more';

type Sharpening = PortalRinkDetail['sharpenings'][number];

const FIRST = 5;

/** What the numbers mean, in the rink's unit and with its own limits: a skater has never seen a level gauge. */
function readingsExplained(bands: LevelBands, unit: UnitPreference): string {
  const limit = (nm: number) => formatLength(nm, unit, 'reading').value.replace('+', '');
  const measure = formatLength(0, unit, 'reading').unit;
  return (
    `A level reading is how much higher one edge of the blade stands than the other after sharpening, in ${measure}. ` +
    `True is within ±${limit(bands.trueNm)}, Fair within ±${limit(bands.fairNm)}, and Off beyond that. If a blade was re-run, its new reading shows beside the first one.`
  );
}

/** Each blade's readings side by side in the order taken: a re-run never replaces the first reading. */
function Readings({ readings, bands, unit }: { readings: Sharpening['readings']; bands: LevelBands; unit: UnitPreference }) {
  if (readings.length === 0) return <p className="text-sm text-ink-soft">No level reading was taken.</p>;
  return (
    <div className="grid gap-3 sm:grid-cols-2">
      {(['left', 'right'] as const).map((blade) => {
        const own = readings.filter((r) => r.blade === blade).sort((a, b) => a.attempt - b.attempt);
        if (own.length === 0) return null;
        return (
          <div key={blade}>
            <p className="mb-1 text-sm font-bold">{blade === 'left' ? 'Left skate' : 'Right skate'}</p>
            <ul className="flex flex-wrap gap-2">
              {own.map((r) => (
                <li key={r.id} className="min-w-40 flex-1 rounded-lg bg-frost p-2">
                  <p className="mb-1 text-xs text-ink-soft tabular-nums">{r.attempt === 1 ? 'Attempt 1' : `Attempt ${r.attempt} (re-run)`}</p>
                  <LevelScale readingNm={r.readingNm} bands={bands} unit={unit} />
                </li>
              ))}
            </ul>
          </div>
        );
      })}
    </div>
  );
}

export function SharpeningList({ sharpenings, bands, unit, timeZone }: { sharpenings: Sharpening[]; bands: LevelBands; unit: UnitPreference; timeZone: string }) {
  const more = useShowMore(sharpenings, FIRST);
  if (sharpenings.length === 0) return <p className="text-ink-soft">No sharpening on record yet.</p>;
  return (
    <div className="space-y-4">
      <p className="text-sm text-ink-soft">{readingsExplained(bands, unit)}</p>
      <ul className="space-y-4">
        {more.shown.map((s) => (
          <li key={s.id} className="rounded-lg border border-rule p-3">
            <p className="font-semibold tabular-nums">
              <Dotted parts={[formatDateTime(s.doneAt, timeZone), `Ticket ${s.ticketNumber}`, s.pairLabel]} />
            </p>
            <p className="mb-2 text-sm tabular-nums">
              <Dotted
                parts={[
                  `${showLength(s.hollowNm, unit, 'hollow')} hollow`,
                  `${showLength(s.bladeWidthNm, unit, 'width')} blade`,
                  `${s.passes} ${s.passes === 1 ? 'pass' : 'passes'}`,
                  s.stationName,
                ]}
              />
            </p>
            <Readings readings={s.readings} bands={bands} unit={unit} />
          </li>
        ))}
      </ul>
      <ShowMoreButton open={more.open} hidden={more.hidden} first={FIRST} noun={['sharpening', 'sharpenings']} onToggle={more.toggle} />
    </div>
  );
}
