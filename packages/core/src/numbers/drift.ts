import { assertFiniteValues, mean } from './stats';

// Drift watch: control charts over a station's level readings, oldest first. The constants and chart formulas are
// those of the NIST/SEMATECH e-Handbook of Statistical Methods, §6.3.2.1–§6.3.2.4; the run rules are the Western
// Electric ones (Western Electric Statistical Quality Control Handbook, 1956; also listed in the e-Handbook §6.3.2),
// written here from memory.

/** d₂ for moving ranges of two (NIST e-Handbook §6.3.2.1, n = 2 row). */
export const D2 = 1.128;
/** D₄ for moving ranges of two (same row). */
export const D4 = 3.267;

export interface ImrChart {
  mean: number;
  /** Mean of |xᵢ − xᵢ₋₁|. */
  mrBar: number;
  /** The process deviation the limits imply, MR̄ / d₂. */
  sigma: number;
  ucl: number;
  lcl: number;
  /** Upper limit of the moving-range chart, D₄·MR̄ (its lower limit is 0). */
  mrUcl: number;
  /** movingRanges[i] is |x[i+1] − x[i]|. */
  movingRanges: number[];
  /** Indices of values strictly beyond the individuals limits: a value on a limit is in control. */
  outOfControl: number[];
  /** Indices i of values whose moving range |x[i] − x[i−1]| is strictly above mrUcl. */
  mrOutOfControl: number[];
}

/** Individuals and moving-range chart: limits x̄ ± 3·MR̄/d₂. Needs two values for a moving range. */
export function imrChart(values: readonly number[]): ImrChart {
  if (values.length < 2) throw new RangeError('An individuals chart needs at least two values');
  assertFiniteValues(values, 'Values');
  const movingRanges = values.slice(1).map((v, i) => Math.abs(v - (values[i] as number)));
  const centre = mean(values);
  const mrBar = mean(movingRanges);
  const sigma = mrBar / D2;
  const ucl = centre + 3 * sigma;
  const lcl = centre - 3 * sigma;
  const mrUcl = D4 * mrBar;
  const outOfControl = values.flatMap((v, i) => (v > ucl || v < lcl ? [i] : []));
  const mrOutOfControl = movingRanges.flatMap((r, i) => (r > mrUcl ? [i + 1] : []));
  return { mean: centre, mrBar, sigma, ucl, lcl, mrUcl, movingRanges, outOfControl, mrOutOfControl };
}

export interface EwmaOptions {
  /** Weight of the newest value, 0 < λ ≤ 1. */
  lambda?: number;
  /** The process standard deviation, an input (not re-estimated from these values). */
  sigma: number;
  /** EWMA₀: the target or the historical mean. */
  start: number;
  /** Width of the limits in standard deviations of the EWMA. */
  k?: number;
}

export interface EwmaChart {
  ewma: number[];
  centre: number;
  /** s_EWMA = s·√(λ/(2−λ)). */
  sigmaEwma: number;
  ucl: number;
  lcl: number;
  /** Indices whose EWMA lies strictly beyond the limits. */
  outOfControl: number[];
}

/**
 * EWMAₜ = λ·Yₜ + (1 − λ)·EWMAₜ₋₁ with the asymptotic limits EWMA₀ ± k·s·√(λ/(2−λ)) (NIST e-Handbook §6.3.2.4).
 * The asymptotic limits are wider than the exact ones for the first few points, so early alerts are if anything
 * held back rather than raised too soon.
 */
export function ewmaChart(values: readonly number[], options: EwmaOptions): EwmaChart {
  const lambda = options.lambda ?? 0.2;
  const k = options.k ?? 3;
  if (!(lambda > 0 && lambda <= 1)) throw new RangeError('λ lies in (0, 1]');
  if (!(k > 0 && Number.isFinite(k))) throw new RangeError('k must be a positive number');
  if (!(options.sigma >= 0 && Number.isFinite(options.sigma))) throw new RangeError('σ must be a non-negative number');
  if (!Number.isFinite(options.start)) throw new RangeError('EWMA₀ must be a finite number');
  assertFiniteValues(values, 'Values');
  const ewma: number[] = [];
  let previous = options.start;
  for (const v of values) {
    previous = lambda * v + (1 - lambda) * previous;
    ewma.push(previous);
  }
  const sigmaEwma = options.sigma * Math.sqrt(lambda / (2 - lambda));
  const ucl = options.start + k * sigmaEwma;
  const lcl = options.start - k * sigmaEwma;
  const outOfControl = ewma.flatMap((e, i) => (e > ucl || e < lcl ? [i] : []));
  return { ewma, centre: options.start, sigmaEwma, ucl, lcl, outOfControl };
}

export type RunRuleId = 'beyond_3_sigma' | 'two_of_three_beyond_2_sigma' | 'four_of_five_beyond_1_sigma' | 'eight_on_one_side';

/** The four standard run rules, in their usual order and with the usual wording. */
export const RUN_RULES: readonly { id: RunRuleId; number: 1 | 2 | 3 | 4; description: string }[] = [
  { id: 'beyond_3_sigma', number: 1, description: 'One point beyond 3σ' },
  { id: 'two_of_three_beyond_2_sigma', number: 2, description: 'Two of three successive points beyond 2σ on the same side' },
  { id: 'four_of_five_beyond_1_sigma', number: 3, description: 'Four of five successive points beyond 1σ on the same side' },
  { id: 'eight_on_one_side', number: 4, description: 'Eight successive points on the same side of the centre line' },
];

export interface RunRuleViolation {
  rule: RunRuleId;
  /** The point at which the rule fires: the last point of the run that breaks it. */
  index: number;
  side: 'above' | 'below';
}

// "Beyond" is strict throughout: a point exactly on a zone line, or on the centre line, is not beyond it, so a
// run of readings sitting on zero never counts as a run to one side.
const beyond = (deviation: number, limit: number, side: 1 | -1): boolean => side * deviation > limit;

/**
 * The Western Electric run rules over values against a centre line and σ. A rule fires at a point that is itself in
 * the rule's zone and completes the pattern, so one run is reported where it becomes a violation and again at each
 * later point that extends it, never at a point that merely follows it. Near the start, "2 of 3" and "4 of 5" look
 * at the points there are (two points beyond 2σ in a row already are two of three).
 */
export function runRules(values: readonly number[], options: { center: number; sigma: number }): RunRuleViolation[] {
  const { center, sigma } = options;
  if (!Number.isFinite(center)) throw new RangeError('The centre line must be a finite number');
  if (!(sigma >= 0 && Number.isFinite(sigma))) throw new RangeError('σ must be a non-negative number');
  assertFiniteValues(values, 'Values');
  const dev = values.map((v) => v - center);
  const violations: RunRuleViolation[] = [];
  const countBeyond = (end: number, length: number, limit: number, side: 1 | -1): number => {
    let count = 0;
    for (let j = Math.max(0, end - length + 1); j <= end; j++) if (beyond(dev[j] as number, limit, side)) count++;
    return count;
  };
  for (let i = 0; i < dev.length; i++) {
    for (const side of [1, -1] as const) {
      const sideName = side === 1 ? 'above' : 'below';
      const d = dev[i] as number;
      if (beyond(d, 3 * sigma, side)) violations.push({ rule: 'beyond_3_sigma', index: i, side: sideName });
      if (beyond(d, 2 * sigma, side) && countBeyond(i, 3, 2 * sigma, side) >= 2) {
        violations.push({ rule: 'two_of_three_beyond_2_sigma', index: i, side: sideName });
      }
      if (beyond(d, sigma, side) && countBeyond(i, 5, sigma, side) >= 4) {
        violations.push({ rule: 'four_of_five_beyond_1_sigma', index: i, side: sideName });
      }
      if (i >= 7 && countBeyond(i, 8, 0, side) === 8) violations.push({ rule: 'eight_on_one_side', index: i, side: sideName });
    }
  }
  return violations;
}

/*
 * Drift-watch defaults, and why:
 * - target 0: a station's readings should centre on level, so the EWMA starts there and the run rules look for runs
 *   away from it. The individuals chart stays centred on the readings' own mean (as in the Handbook) and so flags
 *   single readings that are odd for this station whatever its offset.
 * - σ from the moving ranges, MR̄/d₂: it follows the reading-to-reading scatter and is hardly raised by a slow drift,
 *   which would inflate an ordinary standard deviation and hide the drift being looked for.
 * - minReadings 10: the eight-in-a-row rule needs eight points, and MR̄ from fewer than about ten readings moves too
 *   much from one reading to the next to set limits by (common practice, no published source).
 * - recentWindow 5: an alert says something about the station now. It is raised by violations among the last five
 *   readings (two or three pairs), so it clears on its own once a re-levelled station reads in control again.
 */
export const DRIFT_DEFAULTS = { target: 0, lambda: 0.2, k: 3, minReadings: 10, recentWindow: 5 } as const;

export interface DriftWatchOptions {
  target?: number;
  /** Overrides the MR̄/d₂ estimate, e.g. with the station's σ from a period known to be in control. */
  sigma?: number;
  lambda?: number;
  k?: number;
  minReadings?: number;
  recentWindow?: number;
}

export interface DriftReason {
  chart: 'individuals' | 'moving_range' | 'ewma' | 'run_rule';
  rule?: RunRuleId;
  index: number;
  valueNm: number;
}

export type DriftWatch =
  | { status: 'not_enough_data'; alert: false; reasons: []; readingsCount: number; minReadings: number }
  | {
      status: 'watching';
      alert: boolean;
      /** Violations among the last recentWindow readings, the ones that raise the alert. */
      reasons: DriftReason[];
      readingsCount: number;
      target: number;
      sigma: number;
      imr: ImrChart;
      ewma: EwmaChart;
      /** Every run-rule violation over the whole series, for drawing. */
      runs: RunRuleViolation[];
    };

export function driftWatch(readingsNm: readonly number[], options: DriftWatchOptions = {}): DriftWatch {
  // Field by field, so that an option passed as undefined still takes its default.
  const o = {
    target: options.target ?? DRIFT_DEFAULTS.target,
    lambda: options.lambda ?? DRIFT_DEFAULTS.lambda,
    k: options.k ?? DRIFT_DEFAULTS.k,
    minReadings: options.minReadings ?? DRIFT_DEFAULTS.minReadings,
    recentWindow: options.recentWindow ?? DRIFT_DEFAULTS.recentWindow,
  };
  if (!(Number.isInteger(o.minReadings) && o.minReadings >= 2)) throw new RangeError('minReadings must be a whole number of at least 2');
  if (!(Number.isInteger(o.recentWindow) && o.recentWindow >= 1)) throw new RangeError('recentWindow must be a whole number of at least 1');
  assertFiniteValues(readingsNm, 'Readings');
  const readingsCount = readingsNm.length;
  if (readingsCount < o.minReadings) {
    return { status: 'not_enough_data', alert: false, reasons: [], readingsCount, minReadings: o.minReadings };
  }
  const imr = imrChart(readingsNm);
  const sigma = options.sigma ?? imr.sigma;
  const ewma = ewmaChart(readingsNm, { lambda: o.lambda, k: o.k, sigma, start: o.target });
  const runs = runRules(readingsNm, { center: o.target, sigma });

  const from = readingsCount - o.recentWindow;
  const value = (index: number) => readingsNm[index] as number;
  const reasons: DriftReason[] = [
    ...imr.outOfControl.map((index) => ({ chart: 'individuals' as const, index, valueNm: value(index) })),
    ...imr.mrOutOfControl.map((index) => ({ chart: 'moving_range' as const, index, valueNm: value(index) })),
    ...ewma.outOfControl.map((index) => ({ chart: 'ewma' as const, index, valueNm: value(index) })),
    ...runs.map((r) => ({ chart: 'run_rule' as const, rule: r.rule, index: r.index, valueNm: value(r.index) })),
  ]
    .filter((r) => r.index >= from)
    .sort((a, b) => a.index - b.index);
  return { status: 'watching', alert: reasons.length > 0, reasons, readingsCount, target: o.target, sigma, imr, ewma, runs };
}
