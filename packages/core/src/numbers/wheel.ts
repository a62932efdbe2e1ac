import { linearFit } from './stats';
import { NM_PER_INCH } from './units';

// Wheel wear and speed. Diameters are integer nanometres; speeds are computed in the units the wheel's marking and
// the safety code use (RPM, surface feet per minute), with metres per second beside them for mm rinks.

const DAY_MS = 86_400_000;

export interface WheelWearPoint {
  /** Passes run on this wheel since it was mounted, at the time of the measurement. */
  passes: number;
  diameterNm: number;
  at: Date;
}

export interface WheelWear {
  n: number;
  /** Fitted loss of diameter per pass (dressing included, since it is part of how a wheel is used up); null until a loss is measured. */
  wearPerPassNm: number | null;
  /** The latest measurement by passes, the starting point of the prediction. */
  lastDiameterNm: number | null;
  lastPasses: number | null;
  /** Whole passes left after the latest measurement before the minimum diameter; 0 once reached. */
  passesLeft: number | null;
  /** Fitted passes per calendar day over the measurements' dates. */
  passesPerDay: number | null;
  /** Days from `now` until the minimum is expected; 0 when it is already due. */
  daysLeft: number | null;
  predictedAt: Date | null;
  atOrBelowMinimum: boolean;
}

function assertPositiveLength(value: number, what: string): void {
  if (!Number.isFinite(value) || value <= 0) throw new RangeError(`${what} must be a positive length`);
}

/**
 * Least squares of diameter against passes since mounting gives the wear per pass; passes left count from the
 * latest measured diameter rather than from the fitted line, because a dressing steps the diameter down at once
 * and the measurement after it is the best knowledge of the wheel. Passes per day come from a second fit, passes
 * against date, so that a quiet week and a busy one average out.
 */
export function wheelWear(input: { points: readonly WheelWearPoint[]; minDiameterNm: number; now: Date }): WheelWear {
  assertPositiveLength(input.minDiameterNm, 'The minimum diameter');
  for (const p of input.points) {
    assertPositiveLength(p.diameterNm, 'A diameter');
    if (!Number.isFinite(p.passes) || p.passes < 0) throw new RangeError('Passes must be a non-negative number');
    if (!Number.isFinite(p.at.getTime())) throw new RangeError('A measurement needs a valid date');
  }
  const n = input.points.length;
  const last = [...input.points].sort((a, b) => a.passes - b.passes || a.at.getTime() - b.at.getTime()).at(-1);
  const wearFit = linearFit(input.points.map((p) => ({ x: p.passes, y: p.diameterNm })));
  const wearPerPassNm = wearFit && wearFit.slope < 0 ? -wearFit.slope : null;
  const atOrBelowMinimum = last !== undefined && last.diameterNm <= input.minDiameterNm;

  let passesLeft: number | null = null;
  if (last && atOrBelowMinimum) passesLeft = 0;
  else if (last && wearPerPassNm !== null) passesLeft = Math.floor((last.diameterNm - input.minDiameterNm) / wearPerPassNm);

  // Days are counted from the first measurement so the fit's sums stay small.
  const origin = input.points[0]?.at.getTime() ?? 0;
  const rateFit = linearFit(input.points.map((p) => ({ x: (p.at.getTime() - origin) / DAY_MS, y: p.passes })));
  const passesPerDay = rateFit && rateFit.slope > 0 ? rateFit.slope : null;

  let predictedAt: Date | null = null;
  let daysLeft: number | null = null;
  if (last && passesLeft !== null && passesPerDay !== null) {
    predictedAt = new Date(last.at.getTime() + (passesLeft / passesPerDay) * DAY_MS);
    daysLeft = Math.max(0, (predictedAt.getTime() - input.now.getTime()) / DAY_MS);
  }
  return {
    n,
    wearPerPassNm,
    lastDiameterNm: last?.diameterNm ?? null,
    lastPasses: last?.passes ?? null,
    passesLeft,
    passesPerDay,
    daysLeft,
    predictedAt,
    atOrBelowMinimum,
  };
}

function assertRpm(rpm: number): void {
  if (!Number.isFinite(rpm) || rpm < 0) throw new RangeError('RPM must be a non-negative number');
}

/** Surface speed in feet per minute: π·D(in)·RPM/12. */
export function surfaceSpeedSfpm(diameterNm: number, rpm: number): number {
  assertPositiveLength(diameterNm, 'The wheel diameter');
  assertRpm(rpm);
  return (Math.PI * (diameterNm / NM_PER_INCH) * rpm) / 12;
}

/** Surface speed in metres per second: π·D(m)·RPM/60. */
export function surfaceSpeedMps(diameterNm: number, rpm: number): number {
  assertPositiveLength(diameterNm, 'The wheel diameter');
  assertRpm(rpm);
  return (Math.PI * (diameterNm / 1e9) * rpm) / 60;
}

export interface SpeedCheck {
  sfpm: number;
  mps: number;
  /** 'unrated' when the wheel carries no rating to check against: the screen must then ask for the marking. */
  status: 'within' | 'over' | 'unrated';
  overRpm: boolean | null;
  overSfpm: boolean | null;
  /** The highest RPM every given rating allows at this diameter; null when unrated. */
  maxRpm: number | null;
}

/**
 * Against the wheel's marked maximum speed, which a wheel must never exceed (29 CFR 1910.215; ANSI B7.1). Running
 * exactly at the rating is within it. A surface-speed rating is checked at the current diameter: as a wheel wears
 * the same RPM gives less surface speed, so a new wheel is the case that matters.
 */
export function speedCheck(input: { diameterNm: number; rpm: number; ratedMaxRpm?: number | null; ratedMaxSfpm?: number | null }): SpeedCheck {
  const sfpm = surfaceSpeedSfpm(input.diameterNm, input.rpm);
  const mps = surfaceSpeedMps(input.diameterNm, input.rpm);
  const ratedRpm = input.ratedMaxRpm ?? null;
  const ratedSfpm = input.ratedMaxSfpm ?? null;
  for (const rating of [ratedRpm, ratedSfpm]) {
    if (rating !== null && !(Number.isFinite(rating) && rating > 0)) throw new RangeError('A speed rating must be a positive number');
  }
  const overRpm = ratedRpm === null ? null : input.rpm > ratedRpm;
  const overSfpm = ratedSfpm === null ? null : sfpm > ratedSfpm;
  const limits = [ratedRpm, ratedSfpm === null ? null : (ratedSfpm * 12) / (Math.PI * (input.diameterNm / NM_PER_INCH))].filter(
    (v): v is number => v !== null,
  );
  const maxRpm = limits.length > 0 ? Math.min(...limits) : null;
  const status = overRpm === null && overSfpm === null ? 'unrated' : overRpm || overSfpm ? 'over' : 'within';
  return { sfpm, mps, status, overRpm, overSfpm, maxRpm };
}
