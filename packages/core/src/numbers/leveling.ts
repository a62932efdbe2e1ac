import { assertFiniteValues, linearFit, mean, sampleStdDev } from './stats';

// Leveling advice: how far to turn a station's adjusting screw so that its readings centre on zero. "Turns" are in
// the station's own adjusting unit (screw turns, or millimetres on a station set in mm); nothing here depends on
// which.

export interface LevelingPoint {
  turns: number;
  deltaNm: number;
}

export interface LevelingFit {
  /** Change in reading per turn: the station's response. */
  slopeNmPerTurn: number;
  /**
   * Change in reading with no turn at all (re-seating the holder, a new blade in the gauge). Reported so that a
   * large one can be noticed; the advice does not use it, because it is not something a turn can undo.
   */
  interceptNm: number;
  /** sqrt(SSE/(n − 2) / Σ(x − x̄)²); null when n < 3, where the residual variance has no degrees of freedom. */
  stdErrSlope: number | null;
  n: number;
}

/**
 * Ordinary least squares of the change in reading against the turns made. Null when no line is defined: fewer than
 * two adjustments, or every adjustment the same number of turns.
 */
export function fitLevelingResponse(points: readonly LevelingPoint[]): LevelingFit | null {
  const fit = linearFit(points.map((p) => ({ x: p.turns, y: p.deltaNm })));
  if (!fit) return null;
  return { slopeNmPerTurn: fit.slope, interceptNm: fit.intercept, stdErrSlope: fit.stdErrSlope, n: fit.n };
}

/*
 * Thresholds, and why:
 * - minPoints 3: the fewest adjustments that give a slope a standard error (n − 2 ≥ 1); below it the rink's default
 *   response is used.
 * - maxFitRelativeStdErr 0.25: a response known only to ±25 % (one standard error) already turns a 4-step correction
 *   into 3 or 5 steps; noisier than that, the advice would as likely under- as over-correct.
 * - minReadings 3: one or two blades say more about those blades than about the station.
 * - maxMeanRelativeStdErr 0.5, or half a step's effect if larger: the recent mean is trusted when its standard error
 *   is under half its size (the offset is then at least two standard errors from zero), or when the error is too
 *   small to change the advice by a step anyway.
 * - Level: when the advice rounds to no step at all, i.e. the mean is within half a step's effect of zero (no turn
 *   can bring it closer), or within the station's optional extra dead band levelToleranceNm.
 */
export const LEVELING_DEFAULTS = {
  minPoints: 3,
  minReadings: 3,
  maxFitRelativeStdErr: 0.25,
  maxMeanRelativeStdErr: 0.5,
  levelToleranceNm: 0,
} as const;

export interface LevelingAdviceInput {
  /** Logged adjustments with the station's mean reading just before and just after each. */
  adjustments: readonly { turns: number; beforeNm: number; afterNm: number }[];
  /** The station's readings since its last adjustment. */
  recentReadingsNm: readonly number[];
  /** The rink's response per turn, used until the station has minPoints adjustments of its own. */
  defaultResponseNmPerTurn: number;
  /** The smallest adjustment the station's screw is set in. */
  stepTurns: number;
  minPoints?: number;
  minReadings?: number;
  maxFitRelativeStdErr?: number;
  maxMeanRelativeStdErr?: number;
  levelToleranceNm?: number;
}

interface ReadingsSummary {
  meanNm: number;
  stdErrMeanNm: number;
  readingsCount: number;
}

interface ResponseSummary {
  responseNmPerTurn: number;
  responseSource: 'fit' | 'default';
  /** The fit of the station's adjustments, whether or not it was used; null when none could be made. */
  fit: LevelingFit | null;
  /** What one step of the screw moves the mean by, |response| × step. */
  stepEffectNm: number;
  /** Turns that would bring the mean exactly to zero, before rounding to the step. */
  rawTurns: number;
}

export type LevelingAdvice =
  | ({
      kind: 'advise';
      /** Signed turns to make, rounded to the nearest step. */
      turns: number;
      /** The same as a whole number of steps. */
      steps: number;
      /** One standard error of rawTurns, from the readings' scatter and (with a fit) the response's. */
      uncertaintyTurns: number;
      /** The mean the fitted (or default) response predicts after the advised turns; within half a step's effect of 0. */
      predictedMeanNm: number;
    } & ReadingsSummary &
      ResponseSummary)
  | ({ kind: 'level' } & ReadingsSummary & ResponseSummary)
  | { kind: 'not_enough_data'; readingsCount: number; minReadings: number }
  | ({
      kind: 'too_noisy';
      reason: 'response_fit';
      /** The fit's stdErrSlope / |slope|; null where it is unbounded (a fitted slope of 0). */
      relativeStdErr: number | null;
      maxRelativeStdErr: number;
      fit: LevelingFit;
    } & ReadingsSummary)
  | ({
      kind: 'too_noisy';
      reason: 'readings';
      /** The largest standard error of the mean that would have been trusted (compare stdErrMeanNm). */
      allowedStdErrMeanNm: number;
      fit: LevelingFit | null;
    } & ReadingsSummary);

function option(value: number | undefined, fallback: number, valid: (v: number) => boolean, what: string): number {
  const v = value ?? fallback;
  if (!valid(v)) throw new RangeError(`${what} is out of range`);
  return v;
}

// Turns are shown to a technician, so 0.30000000000000004 has to come out as 0.3.
function clean(x: number): number {
  const y = Number(x.toPrecision(12));
  return y === 0 ? 0 : y;
}

export function levelingAdvice(input: LevelingAdviceInput): LevelingAdvice {
  const d = LEVELING_DEFAULTS;
  const minPoints = option(input.minPoints, d.minPoints, (v) => Number.isInteger(v) && v >= 3, 'minPoints');
  const minReadings = option(input.minReadings, d.minReadings, (v) => Number.isInteger(v) && v >= 2, 'minReadings');
  const maxFit = option(input.maxFitRelativeStdErr, d.maxFitRelativeStdErr, (v) => v > 0, 'maxFitRelativeStdErr');
  const maxMean = option(input.maxMeanRelativeStdErr, d.maxMeanRelativeStdErr, (v) => v > 0, 'maxMeanRelativeStdErr');
  const tolerance = option(input.levelToleranceNm, d.levelToleranceNm, (v) => v >= 0 && Number.isFinite(v), 'levelToleranceNm');
  const step = option(input.stepTurns, 0, (v) => Number.isFinite(v) && v > 0, 'stepTurns');
  const fallback = option(input.defaultResponseNmPerTurn, 0, (v) => Number.isFinite(v) && v !== 0, 'defaultResponseNmPerTurn');
  assertFiniteValues(input.recentReadingsNm, 'Readings');
  assertFiniteValues(
    input.adjustments.flatMap((a) => [a.turns, a.beforeNm, a.afterNm]),
    'Adjustments',
  );

  const readingsCount = input.recentReadingsNm.length;
  if (readingsCount < minReadings) return { kind: 'not_enough_data', readingsCount, minReadings };

  const meanNm = mean(input.recentReadingsNm);
  const stdErrMeanNm = (sampleStdDev(input.recentReadingsNm) as number) / Math.sqrt(readingsCount);
  const readings: ReadingsSummary = { meanNm, stdErrMeanNm, readingsCount };

  const fit = fitLevelingResponse(input.adjustments.map((a) => ({ turns: a.turns, deltaNm: a.afterNm - a.beforeNm })));
  // With every adjustment the same size no slope can be fitted; the default stands in rather than refusing, which
  // leaves such a station no worse off than one without history.
  const useFit = fit !== null && fit.n >= minPoints;
  if (useFit) {
    const stdErr = fit.stdErrSlope as number;
    const relative = stdErr / Math.abs(fit.slopeNmPerTurn);
    if (!(relative <= maxFit)) {
      return {
        kind: 'too_noisy',
        reason: 'response_fit',
        relativeStdErr: Number.isFinite(relative) ? relative : null,
        maxRelativeStdErr: maxFit,
        fit,
        ...readings,
      };
    }
  }
  const slope = useFit ? fit.slopeNmPerTurn : fallback;
  const slopeStdErr = useFit ? (fit.stdErrSlope as number) : 0;
  const stepEffectNm = Math.abs(slope) * step;
  const rawTurns = clean(-meanNm / slope);
  const response: ResponseSummary = { responseNmPerTurn: slope, responseSource: useFit ? 'fit' : 'default', fit, stepEffectNm, rawTurns };

  // Nearest step, halves away from zero: rounding toward zero is how a correction ends up short of level.
  const steps = Math.sign(rawTurns) * Math.round(Math.abs(rawTurns) / step) || 0;
  // A mean that no turn of the screw would bring closer to zero needs no advice, however scattered the readings:
  // there is nothing to correct. Noise only matters when it would decide a correction.
  if (steps === 0 || Math.abs(meanNm) <= tolerance) return { kind: 'level', ...readings, ...response };

  const allowedStdErrMeanNm = Math.max(maxMean * Math.abs(meanNm), stepEffectNm / 2);
  if (stdErrMeanNm > allowedStdErrMeanNm) return { kind: 'too_noisy', reason: 'readings', allowedStdErrMeanNm, fit, ...readings };

  const turns = clean(steps * step);
  const uncertaintyTurns = Math.hypot(stdErrMeanNm / slope, (meanNm * slopeStdErr) / (slope * slope));
  return {
    kind: 'advise',
    turns,
    steps,
    uncertaintyTurns,
    predictedMeanNm: meanNm + slope * turns,
    ...readings,
    ...response,
  };
}

// ---- the effect of an adjustment ------------------------------------------------------------------------------

/** How many first readings on each side of a leveling adjustment stand for its effect. */
export const EFFECT_READINGS = 10;

/** Index ranges [from, to) into a station's readings. */
export interface EffectWindow {
  before: [number, number];
  after: [number, number];
}

/**
 * Which of a station's first readings show each of its adjustments' effect; the station page and the quality report
 * both read it this way. Only readings strictly between an adjustment and its neighbours count, because a reading
 * beyond a neighbour shows that neighbour's setting: before, the last EFFECT_READINGS after the previous adjustment;
 * after, the first EFFECT_READINGS before the next one. A reading taken at the very moment of an adjustment belongs
 * to neither side. Both lists are times in ms, ascending; the answer follows `adjustments`.
 */
export function effectWindows(readings: readonly number[], adjustments: readonly number[], size = EFFECT_READINGS): EffectWindow[] {
  const windows: EffectWindow[] = [];
  let i = 0;
  for (const [k, at] of adjustments.entries()) {
    const previous = adjustments[k - 1] ?? -Infinity;
    const next = adjustments[k + 1] ?? Infinity;
    while (i < readings.length && readings[i]! < at) i += 1;
    let from = i;
    while (from > 0 && i - from < size && readings[from - 1]! > previous) from -= 1;
    let start = i;
    while (start < readings.length && readings[start]! === at) start += 1;
    let end = start;
    while (end < readings.length && end - start < size && readings[end]! < next) end += 1;
    windows.push({ before: [from, i], after: [start, end] });
  }
  return windows;
}
