import { median } from './stats';

// Promised time: when a new ticket will be ready, from the tickets ahead of it and the stations' recent speed.

const MINUTE_MS = 60_000;

/** Median of per-pair durations in minutes, ignoring anything that is not a positive finite number; null if none. */
export function medianMinutesPerPair(durationsMinutes: readonly number[]): number | null {
  return median(durationsMinutes.filter((d) => Number.isFinite(d) && d > 0));
}

export interface QueueStation {
  id: string;
  /** The station's recent median; null until it has history, when the rink's default stands in. */
  medianMinutesPerPair: number | null;
  /** When the pair now on the station is expected to be done; absent or past means free now. */
  busyUntil?: Date | null;
}

export interface QueuedTicket {
  pairs: number;
  /**
   * A ticket already promised to one station waits for that station; otherwise, or when that station is not among
   * the active ones, it takes whichever frees first.
   */
  stationId?: string | null;
}

export interface PromiseTimeInput {
  now: Date;
  /** Tickets waiting ahead of the new one, first come first served. */
  queue: readonly QueuedTicket[];
  /** The active stations only: a station in maintenance takes no work. */
  stations: readonly QueueStation[];
  defaultMinutesPerPair: number;
  newPairs: number;
  /**
   * The promise is rounded up to this many minutes, so the counter never promises a time it has to take back. The
   * rounding is on UTC minutes, which agrees with the local clock in every zone whose offset is a multiple of it
   * (all of today's zones for 5 or 15).
   */
  roundUpToMinutes?: number;
}

export interface PromisedTime {
  /** The simulated finish, to the millisecond. */
  readyAt: Date;
  /** readyAt rounded up to roundUpToMinutes (default 5): the time told to the skater. */
  promisedAt: Date;
  stationId: string;
  startsAt: Date;
  minutesPerPair: number;
}

/**
 * A first-come-first-served simulation: each ticket, in queue order, goes to the station that frees first (ties to
 * the earlier station in the list, so the answer is reproducible), and all pairs of one ticket stay on that station,
 * because a ticket is handed back as one bag and splitting it would only move its ready time to the slower half.
 * Null when no station is active: there is then no honest time to promise.
 */
export function promiseTime(input: PromiseTimeInput): PromisedTime | null {
  const { now, defaultMinutesPerPair } = input;
  const roundTo = input.roundUpToMinutes ?? 5;
  if (!Number.isFinite(now.getTime())) throw new RangeError('now must be a valid date');
  if (!(Number.isFinite(defaultMinutesPerPair) && defaultMinutesPerPair > 0)) {
    throw new RangeError('The default minutes per pair must be a positive number');
  }
  if (!(Number.isInteger(input.newPairs) && input.newPairs >= 1)) throw new RangeError('A ticket has at least one pair');
  if (!(Number.isInteger(roundTo) && roundTo >= 1)) throw new RangeError('Rounding is to a whole number of minutes');
  for (const t of input.queue) {
    if (!(Number.isInteger(t.pairs) && t.pairs >= 0)) throw new RangeError('A queued ticket has a whole number of pairs');
  }
  if (input.stations.length === 0) return null;

  const stations = input.stations.map((s) => {
    const own = s.medianMinutesPerPair;
    const busy = s.busyUntil?.getTime();
    return {
      id: s.id,
      minutesPerPair: own !== null && Number.isFinite(own) && own > 0 ? own : defaultMinutesPerPair,
      freeAt: busy !== undefined && Number.isFinite(busy) ? Math.max(now.getTime(), busy) : now.getTime(),
    };
  });
  type Simulated = (typeof stations)[number];
  const firstFree = (): Simulated =>
    stations.reduce((best, s) => (s.freeAt < best.freeAt ? s : best), stations[0] as Simulated);

  for (const ticket of input.queue) {
    const station = stations.find((s) => s.id === ticket.stationId) ?? firstFree();
    station.freeAt += ticket.pairs * station.minutesPerPair * MINUTE_MS;
  }
  const station = firstFree();
  const startsAt = station.freeAt;
  const readyAt = startsAt + input.newPairs * station.minutesPerPair * MINUTE_MS;
  const step = roundTo * MINUTE_MS;
  return {
    readyAt: new Date(readyAt),
    promisedAt: new Date(Math.ceil(readyAt / step) * step),
    stationId: station.id,
    startsAt: new Date(startsAt),
    minutesPerPair: station.minutesPerPair,
  };
}
