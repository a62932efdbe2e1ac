import { classifyLevel, type LevelBands } from './level';
import { assertFiniteValues, median } from './stats';

// Throughput and quality figures for reports. Each returns null where the figure has no data behind it, so that a
// report shows "no data" rather than a zero that reads as a result.

export { median, percentile } from './stats';

export interface QualityReading {
  /** 1 for a blade's first reading; a re-run of the blade records 2, then 3. */
  attempt: number;
  readingNm: number;
  /** The limits in force when the reading was taken; the report's default limits otherwise. */
  bands?: LevelBands;
}

/**
 * Share (0–1) of first readings that fell in the true band: how often a blade came off the station right the first
 * time. Re-run readings are left out, since counting a fixed blade as a success would hide the first miss.
 */
export function firstPassTrueShare(readings: readonly QualityReading[], bands: LevelBands): number | null {
  const first = readings.filter((r) => r.attempt === 1);
  if (first.length === 0) return null;
  const trueCount = first.filter((r) => classifyLevel(r.readingNm, r.bands ?? bands) === 'true').length;
  return trueCount / first.length;
}

/**
 * Share (0–1) of blades that were run again: blades with a second reading over blades with a first. A third attempt
 * is the same blade again, so it does not count twice.
 */
export function reRunRate(readings: readonly Pick<QualityReading, 'attempt'>[]): number | null {
  const first = readings.filter((r) => r.attempt === 1).length;
  if (first === 0) return null;
  return readings.filter((r) => r.attempt === 2).length / first;
}

/** Mean of |reading| in nm: how far from level a station works, whichever edge is high. */
export function meanAbsoluteReading(readingsNm: readonly number[]): number | null {
  assertFiniteValues(readingsNm, 'Readings');
  if (readingsNm.length === 0) return null;
  return readingsNm.reduce((sum, r) => sum + Math.abs(r), 0) / readingsNm.length;
}

/** Pairs per hour of staffed counter time; null for no staffed time. */
export function pairsPerStaffedHour(pairs: number, staffedMinutes: number): number | null {
  if (!(Number.isFinite(pairs) && pairs >= 0)) throw new RangeError('Pairs must be a non-negative number');
  if (!Number.isFinite(staffedMinutes) || staffedMinutes < 0) throw new RangeError('Staffed time must be a non-negative number');
  if (staffedMinutes === 0) return null;
  return pairs / (staffedMinutes / 60);
}

/**
 * Median minutes from drop-off to ready over the tickets that are ready. Tickets not yet ready are left out, and so is
 * a ready time before its drop-off, which can only be a clock or data error.
 */
export function medianTurnaroundMinutes(tickets: readonly { droppedOffAt: Date; readyAt: Date | null }[]): number | null {
  const minutes = tickets.flatMap((t) => (t.readyAt ? [(t.readyAt.getTime() - t.droppedOffAt.getTime()) / 60_000] : []));
  return median(minutes.filter((m) => Number.isFinite(m) && m >= 0));
}
