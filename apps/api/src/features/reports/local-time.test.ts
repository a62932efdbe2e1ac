import { describe, expect, it } from 'vitest';
import { consecutiveRuns, localClock, nextDay } from './local-time';

describe('nextDay', () => {
  it('steps over month and year ends and the Gregorian leap day', () => {
    // Gregorian rule: 2028 is a leap year (divisible by 4), 2026 is not, 2100 is not (divisible by 100, not 400).
    expect(nextDay('2026-11-30')).toBe('2026-12-01');
    expect(nextDay('2026-12-31')).toBe('2027-01-01');
    expect(nextDay('2026-02-28')).toBe('2026-03-01');
    expect(nextDay('2028-02-28')).toBe('2028-02-29');
    expect(nextDay('2028-02-29')).toBe('2028-03-01');
    expect(nextDay('2100-02-28')).toBe('2100-03-01');
  });

  it('groups days into runs of consecutive days', () => {
    expect(consecutiveRuns(['2026-12-31', '2027-01-01', '2026-12-29', '2027-01-01'])).toEqual([
      { first: '2026-12-29', last: '2026-12-29' },
      { first: '2026-12-31', last: '2027-01-01' },
    ]);
  });
});

describe('localClock', () => {
  // IANA tz database, America/Toronto: UTC−5 in winter, UTC−4 from the second Sunday of March (2026-03-08, 02:00)
  // to the first Sunday of November (2026-11-01, 02:00), the US and Canadian rule since 2007.
  const clock = localClock('America/Toronto');
  const hours = (a: Date, b: Date) => (b.getTime() - a.getTime()) / 3_600_000;

  it('has 23 hours on the day summer time starts and 25 on the day it ends', () => {
    expect(hours(clock.startOf('2026-03-08'), clock.startOf('2026-03-09'))).toBe(23);
    expect(hours(clock.startOf('2026-11-01'), clock.startOf('2026-11-02'))).toBe(25);
    expect(hours(clock.startOf('2026-12-01'), clock.startOf('2026-12-02'))).toBe(24);
  });

  it('gives an instant its local day and hour', () => {
    expect(clock.startOf('2026-12-02').toISOString()).toBe('2026-12-02T05:00:00.000Z');
    expect(clock.of(new Date('2026-12-02T04:59:00Z'))).toEqual({ day: '2026-12-01', hour: 23 });
    expect(clock.of(new Date('2026-07-01T16:30:00Z'))).toEqual({ day: '2026-07-01', hour: 12 });
    // The same clock asked again, and a second clock of the same zone, agree (the formatter is shared).
    expect(localClock('America/Toronto').of(new Date('2026-07-01T16:30:00Z'))).toEqual({ day: '2026-07-01', hour: 12 });
    expect(localClock('Europe/Helsinki').of(new Date('2026-07-01T16:30:00Z'))).toEqual({ day: '2026-07-01', hour: 19 });
  });
});
