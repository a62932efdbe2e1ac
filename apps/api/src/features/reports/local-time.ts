import { DateTime } from 'luxon';

// The rink's local calendar: reports count by the rink's own days and hours, whatever the server's zone, and a
// day that changes to or from summer time is 23 or 25 hours long.

export interface LocalClock {
  /** The local day (YYYY-MM-DD) and hour (0–23) of an instant. */
  of(at: Date): { day: string; hour: number };
  /** The instant the local day starts. */
  startOf(day: string): Date;
}

// Making a formatter loads the zone's rules (about a millisecond); a rink's zone is asked for on every report.
const formats = new Map<string, Intl.DateTimeFormat>();

function formatOf(zone: string): Intl.DateTimeFormat {
  let format = formats.get(zone);
  if (!format) formats.set(zone, (format = new Intl.DateTimeFormat('en-CA', { timeZone: zone, year: 'numeric', month: '2-digit', day: '2-digit', hour: '2-digit', hourCycle: 'h23' })));
  return format;
}

export function localClock(zone: string): LocalClock {
  const format = formatOf(zone);
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

/** The calendar day after a YYYY-MM-DD day (a calendar has no zone: counted in UTC, where every day is 24 hours). */
export const nextDay = (day: string) => new Date(Date.parse(`${day}T00:00:00Z`) + 86_400_000).toISOString().slice(0, 10);

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
