import { describe, expect, it } from 'vitest';
import { medianMinutesPerPair, promiseTime, type PromiseTimeInput } from './queue';

const now = new Date('2025-02-01T17:02:00Z');
const at = (minutes: number) => new Date(now.getTime() + minutes * 60_000);

function promise(overrides: Partial<PromiseTimeInput>) {
  return promiseTime({
    now,
    queue: [],
    stations: [{ id: 'a', medianMinutesPerPair: 7.5 }],
    defaultMinutesPerPair: 8,
    newPairs: 1,
    ...overrides,
  });
}

describe('medianMinutesPerPair', () => {
  it('takes the median of the usable durations', () => {
    expect(medianMinutesPerPair([8, 6, 30, 7])).toBe(7.5);
    expect(medianMinutesPerPair([8, 6, 30])).toBe(8);
    expect(medianMinutesPerPair([0, -3, Number.NaN, 9])).toBe(9);
    expect(medianMinutesPerPair([])).toBeNull();
  });
});

describe('promiseTime', () => {
  it('promises a free station\u2019s time for the new pairs, rounded up to five minutes', () => {
    const result = promise({ newPairs: 2 });
    expect(result?.readyAt).toEqual(at(15));
    expect(result?.promisedAt).toEqual(new Date('2025-02-01T17:20:00Z'));
    expect(result?.startsAt).toEqual(now);
    expect(promise({ newPairs: 2, roundUpToMinutes: 1 })?.promisedAt).toEqual(at(15));
  });

  it('gives each queued ticket to the station that frees first, and the new one likewise', () => {
    const stations = [
      { id: 'slow', medianMinutesPerPair: 10 },
      { id: 'fast', medianMinutesPerPair: 5 },
    ];
    // By hand: both free at 0; ticket 1 (3 pairs) to slow, the first listed, until 30; ticket 2 (1 pair) to fast
    // until 5; the new ticket (2 pairs) to fast from 5 to 15.
    const result = promise({ stations, queue: [{ pairs: 3 }, { pairs: 1 }], newPairs: 2 });
    expect(result).toMatchObject({ stationId: 'fast', startsAt: at(5), readyAt: at(15), minutesPerPair: 5 });
  });

  it('keeps all pairs of a ticket on one station', () => {
    const stations = [
      { id: 'a', medianMinutesPerPair: 6 },
      { id: 'b', medianMinutesPerPair: 6 },
    ];
    // Split over both stations four pairs would take 12 minutes; on one they take 24.
    expect(promise({ stations, newPairs: 4 })?.readyAt).toEqual(at(24));
  });

  it('waits for a station that is busy, and ignores a busy time already past', () => {
    const stations = [
      { id: 'a', medianMinutesPerPair: 5, busyUntil: at(12) },
      { id: 'b', medianMinutesPerPair: 5, busyUntil: at(7) },
    ];
    expect(promise({ stations })).toMatchObject({ stationId: 'b', startsAt: at(7), readyAt: at(12) });
    expect(promise({ stations: [{ id: 'a', medianMinutesPerPair: 5, busyUntil: at(-30) }] })?.startsAt).toEqual(now);
  });

  it('uses the rink\u2019s default for a station without history', () => {
    expect(promise({ stations: [{ id: 'new', medianMinutesPerPair: null }], newPairs: 2 })).toMatchObject({ minutesPerPair: 8, readyAt: at(16) });
  });

  it('holds a ticket promised to a station for that station', () => {
    const stations = [
      { id: 'a', medianMinutesPerPair: 5 },
      { id: 'b', medianMinutesPerPair: 5 },
    ];
    // Both waiting tickets belong to b, so a is free for the new ticket now.
    const result = promise({ stations, queue: [{ pairs: 2, stationId: 'b' }, { pairs: 2, stationId: 'b' }] });
    expect(result).toMatchObject({ stationId: 'a', startsAt: now });
    // Unpinned, they would spread over both and the new ticket would wait 10 minutes.
    expect(promise({ stations, queue: [{ pairs: 2 }, { pairs: 2 }] })?.startsAt).toEqual(at(10));
  });

  it('promises nothing without an active station', () => {
    expect(promise({ stations: [] })).toBeNull();
  });

  it('refuses inputs that are not a queue', () => {
    expect(() => promise({ newPairs: 0 })).toThrow(RangeError);
    expect(() => promise({ defaultMinutesPerPair: 0 })).toThrow(RangeError);
    expect(() => promise({ queue: [{ pairs: 1.5 }] })).toThrow(RangeError);
  });
});
