import { DateTime } from 'luxon';

// The rink's local calendar: reports count by the rink's own days and hours, whatever the server's zone, and a
// day that changes to or from summer time is 23 or 25 hours long.

export interface LocalClock {
  /** The local day (YYYY-MM-DD) and hour (0–23) of an instant. */
  of(at: Date): { day: string; hour: number };
  /** The instant the local day starts. */
  startOf(day: string): Date;
}

export function localClock(zone: string): LocalClock {
  const format = new Intl.DateTimeFormat('en-CA', { timeZone: zone, year: 'numeric', month: '2-digit', day: '2-digit', hour: '2-digit', hourCycle: 'h23' });
  return {
    of(at) {
      const parts: Record<string, string> = {};
      for (const p of format.formatToParts(at)) parts[p.type] = p.value;
      return { day: `${parts.year}-${parts.month}-${parts.day}`, hour: Number(parts.hour) };
    },
    startOf(day) {
      return DateTime.fromISO(day, { zone }).startOf('day').toJSDate();
    },
  };
}

export const nextDay = (day: string) => DateTime.fromISO(day, { zone: 'UTC' }).plus({ days: 1 }).toISODate()!;

/** Sorted days grouped into runs of consecutive days. */
export function consecutiveRuns(days: Iterable<string>): { first: string; last: string }[] {
  const sorted = [...new Set(days)].sort();
  const runs: { first: string; last: string }[] = [];
  for (const day of sorted) {
    const run = runs[runs.length - 1];
    if (run && nextDay(run.last) === day) run.last = day;
    else runs.push({ first: day, last: day });
  }
  return runs;
}
