import { describe, expect, it } from 'vitest';
import { DEFAULT_DESK_SETTINGS } from '../../lib/desk-settings';
import { assessStation, type StationHistory } from './quality';

// The effect of each leveling adjustment, read off the readings around it (effectWindows in @rinkwright/core): the
// mean of up to ten first readings before it, back to the previous adjustment, against up to ten after it, up to the
// next one. The expected means are worked by hand below.

const station: StationHistory['station'] = {
  id: 'st-1',
  name: 'Station One',
  status: 'active',
  rpm: 3450,
  adjustUnit: 'turns',
  adjustStepMilli: 125,
  ownTrueNm: null,
  ownFairNm: null,
  precision: false,
  wheel: null,
  queue: { waiting: 0, onStation: 0 },
  driftAlert: false,
};

const hour = (h: number) => new Date(Date.UTC(2026, 10, 2, 0, h * 60));

describe('the effect of leveling adjustments', () => {
  it('averages the first readings between each adjustment and its neighbours', () => {
    // First readings of 1,000 nm × the hour, hours 1–12; a re-run at 7:12 does not belong to the series.
    const readings: StationHistory['readings'] = Array.from({ length: 12 }, (_, i) => ({ takenAt: hour(i + 1), readingNm: 1000 * (i + 1), kind: 'sharpening' as const, attempt: 1 }));
    readings.splice(7, 0, { takenAt: hour(7.2), readingNm: 999_000, kind: 'sharpening', attempt: 2 });
    const detail = assessStation({
      station,
      settings: DEFAULT_DESK_SETTINGS,
      readings,
      // The second adjustment falls exactly on the 8:00 reading, which is then neither before nor after it.
      adjustments: [
        { at: hour(8), amountMilli: -250, note: null, by: 'Tech' },
        { at: hour(6.5), amountMilli: 500, note: null, by: 'Tech' },
      ],
      wheelEvents: [],
      now: hour(13),
    });
    // Newest first. 8:00: before only 7 (back to 6:30) → 7,000; after 9–12 → 10,500.
    // 6:30: before 1–6 → 3,500; after only 7 (8:00 is the next adjustment's own time) → 7,000.
    expect(detail.adjustments.map((a) => [a.at, a.beforeNm, a.afterNm])).toEqual([
      [hour(8).toISOString(), 7000, 10_500],
      [hour(6.5).toISOString(), 3500, 7000],
    ]);
  });

  it('has no before or after where there are no readings on that side', () => {
    const detail = assessStation({
      station,
      settings: DEFAULT_DESK_SETTINGS,
      readings: [{ takenAt: hour(2), readingNm: 3000, kind: 'check', attempt: 1 }],
      adjustments: [{ at: hour(1), amountMilli: 250, note: 'first', by: 'Tech' }],
      wheelEvents: [],
      now: hour(3),
    });
    expect(detail.adjustments.map((a) => [a.beforeNm, a.afterNm])).toEqual([[null, 3000]]);
  });
});
