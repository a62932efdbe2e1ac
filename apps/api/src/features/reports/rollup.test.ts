import { describe, expect, it } from 'vitest';
import { ROLLUP_KEY } from '@rinkwright/db';
import type { WorkDayRow } from './repository';
import { withRollups } from './rollup';

const row = (day: string, stationId: string, technicianId: string, pairs: number, extra: Partial<WorkDayRow> = {}): WorkDayRow => ({
  day,
  stationId,
  technicianId,
  pairs,
  firstReadings: 2 * pairs,
  firstTrue: pairs,
  firstFair: pairs,
  firstOff: 0,
  reruns: 0,
  firstAbsNm: 1000 * pairs,
  staffedTotal: 1,
  staffedStation: 1,
  ...extra,
});

describe('withRollups', () => {
  // Two stations, two technicians, two days, worked out by hand: a rollup is the plain sum of its rows.
  const rows = [
    row('2026-11-02', 'st-a', 'tech-1', 3, { pairsH09: 2, pairsH10: 1 }),
    row('2026-11-02', 'st-b', 'tech-1', 2, { staffedTotal: 0, pairsH10: 2 }),
    row('2026-11-02', 'st-a', 'tech-2', 4, { pairsH14: 4 }),
    row('2026-11-03', 'st-b', 'tech-2', 5, { reruns: 1, pairsH18: 5 }),
  ];
  const all = withRollups(rows);
  const find = (day: string, stationId: string, technicianId: string) => all.find((r) => r.day === day && r.stationId === stationId && r.technicianId === technicianId);

  it('keeps the rows and adds one rollup per station, per technician and per day', () => {
    expect(all.slice(0, rows.length)).toEqual(rows);
    // Day 1: stations a, b; technicians 1, 2; the day. Day 2: station b, technician 2, the day.
    expect(all).toHaveLength(rows.length + 5 + 3);
  });

  it('sums every column, the hours included', () => {
    expect(find('2026-11-02', 'st-a', ROLLUP_KEY)).toMatchObject({ pairs: 7, firstReadings: 14, firstAbsNm: 7000, staffedTotal: 2, staffedStation: 2, pairsH09: 2, pairsH10: 1, pairsH14: 4 });
    expect(find('2026-11-02', ROLLUP_KEY, 'tech-1')).toMatchObject({ pairs: 5, staffedTotal: 1, staffedStation: 2, pairsH09: 2, pairsH10: 3 });
    expect(find('2026-11-02', ROLLUP_KEY, ROLLUP_KEY)).toMatchObject({ pairs: 9, firstTrue: 9, staffedTotal: 2, staffedStation: 3, pairsH09: 2, pairsH10: 3, pairsH14: 4 });
    expect(find('2026-11-03', ROLLUP_KEY, ROLLUP_KEY)).toMatchObject({ pairs: 5, reruns: 1, pairsH18: 5 });
    expect(find('2026-11-03', 'st-a', ROLLUP_KEY)).toBeUndefined();
  });

  it('refuses a row that already carries the rollup key', () => {
    expect(() => withRollups([row('2026-11-02', ROLLUP_KEY, 'tech-1', 1)])).toThrow(/rollup key/);
  });
});
