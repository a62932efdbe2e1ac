import { z } from 'zod';

// Edge level: the signed height difference between a blade's two edges, positive when the right-hand edge is high
// (the same sign as the stored readings). Bands turn a reading into the word a technician acts on.

function assertWidth(widthNm: number): void {
  if (!Number.isFinite(widthNm) || widthNm <= 0) throw new RangeError('The blade width must be a positive length');
}

const DEG = Math.PI / 180;

/**
 * The level reading a tilt gauge implies: a bar resting on both edges, tilted by θ from square, means the edges
 * differ by Δh = w·tan θ. Positive angles tilt toward the right-hand edge being high. Whole nanometres, because
 * that is how a reading is stored.
 */
export function levelFromTilt(widthNm: number, angleDeg: number): number {
  assertWidth(widthNm);
  if (!Number.isFinite(angleDeg) || Math.abs(angleDeg) >= 90) throw new RangeError('A tilt lies strictly between −90° and 90°');
  const nm = Math.sign(angleDeg) * Math.round(Math.abs(widthNm * Math.tan(angleDeg * DEG)));
  return nm === 0 ? 0 : nm;
}

/** The tilt, in degrees, that a level reading means on a blade of this width: θ = atan(Δh / w). */
export function tiltFromLevel(widthNm: number, levelNm: number): number {
  assertWidth(widthNm);
  if (!Number.isFinite(levelNm)) throw new RangeError('A level reading must be a finite number');
  return Math.atan(levelNm / widthNm) / DEG;
}

/**
 * How far apart the two ends of a gauge bar of this length sit for a given reading, about L·Δh/w: why a longer
 * bar makes a small level error visible by eye.
 */
export function barEndRiseNm(barLengthNm: number, widthNm: number, levelNm: number): number {
  assertWidth(widthNm);
  if (!Number.isFinite(barLengthNm) || barLengthNm <= 0) throw new RangeError('The bar length must be a positive length');
  if (!Number.isFinite(levelNm)) throw new RangeError('A level reading must be a finite number');
  return (barLengthNm * levelNm) / widthNm;
}

export type LevelBand = 'true' | 'fair' | 'off';
export const LEVEL_BANDS: readonly LevelBand[] = ['true', 'fair', 'off'];

/** The limits of a band set: |reading| ≤ trueNm is true, ≤ fairNm is fair, beyond is off. */
export interface LevelBands {
  trueNm: number;
  fairNm: number;
}

export type LevelBandsErrors = Partial<Record<keyof LevelBands, string[]>>;

/** Per-field messages in the shape of the API's error body `fields`; an empty object means the limits are usable. */
export function validateBands(limits: LevelBands): LevelBandsErrors {
  const errors: LevelBandsErrors = {};
  const trueOk = Number.isFinite(limits.trueNm) && limits.trueNm > 0;
  const fairOk = Number.isFinite(limits.fairNm) && limits.fairNm > 0;
  if (!trueOk) errors.trueNm = ['The true limit must be a number greater than zero'];
  if (!fairOk) errors.fairNm = ['The fair limit must be a number greater than zero'];
  if (trueOk && fairOk && limits.fairNm < limits.trueNm) {
    errors.fairNm = ['The fair limit must be at least the true limit'];
  }
  return errors;
}

function assertBands(limits: LevelBands): void {
  const errors = validateBands(limits);
  const messages = [...(errors.trueNm ?? []), ...(errors.fairNm ?? [])];
  if (messages.length > 0) throw new RangeError(messages.join('; '));
}

/** The same rule as validateBands, for forms and routes that parse with zod; messages land on the field at fault. */
export const levelBandsSchema = z
  .object({ trueNm: z.number().int(), fairNm: z.number().int() })
  .superRefine((limits, ctx) => {
    for (const [field, messages] of Object.entries(validateBands(limits))) {
      for (const message of messages ?? []) ctx.addIssue({ code: 'custom', path: [field], message });
    }
  });

function assertReading(readingNm: number): void {
  if (!Number.isFinite(readingNm)) throw new RangeError('A level reading must be a finite number');
}

/** A reading exactly on a limit belongs to the better band: the limit is the last value the rink accepts. */
export function classifyLevel(readingNm: number, limits: LevelBands): LevelBand {
  assertBands(limits);
  assertReading(readingNm);
  const size = Math.abs(readingNm);
  if (size <= limits.trueNm) return 'true';
  if (size <= limits.fairNm) return 'fair';
  return 'off';
}

export interface LevelPosition {
  band: LevelBand;
  /** |reading| / fair limit: 0 is dead level, 1 is on the fair limit, above 1 is off. */
  fractionOfLimit: number;
  /** reading / fair limit, for placing the marker on a scale centred on zero. */
  signedFraction: number;
  /** Where the true limit sits on the same scale (true / fair), so the scale can draw the inner band. */
  trueLimitFraction: number;
  /** Which half of the scale the reading falls in; 'right' is the right-hand edge high. */
  side: 'left' | 'right' | 'level';
  /** How much more the reading could grow before it falls into the next worse band; null when already off. */
  marginToNextBandNm: number | null;
  /** How far the reading is past the limit of the next better band; null when already true. */
  pastBetterBandNm: number | null;
}

/** What a reading's scale needs so that "just inside" and "dead level" never look alike. */
export function levelPosition(readingNm: number, limits: LevelBands): LevelPosition {
  const band = classifyLevel(readingNm, limits);
  const size = Math.abs(readingNm);
  return {
    band,
    fractionOfLimit: size / limits.fairNm,
    signedFraction: readingNm / limits.fairNm,
    trueLimitFraction: limits.trueNm / limits.fairNm,
    side: readingNm > 0 ? 'right' : readingNm < 0 ? 'left' : 'level',
    marginToNextBandNm: band === 'true' ? limits.trueNm - size : band === 'fair' ? limits.fairNm - size : null,
    pastBetterBandNm: band === 'true' ? null : band === 'fair' ? size - limits.trueNm : size - limits.fairNm,
  };
}

/** The rink's counter settings as stored: normal and precision limits. */
export interface RinkBandSettings {
  trueNm: number;
  fairNm: number;
  precisionTrueNm: number;
  precisionFairNm: number;
}

/** A station's own normal limits, each null until the station sets them. */
export interface StationBandSettings {
  ownTrueNm: number | null;
  ownFairNm: number | null;
}

export interface ChosenBands extends LevelBands {
  source: 'station' | 'rink';
  precision: boolean;
}

/**
 * The limits that apply to a station's readings. Precision on means the rink's precision pair: precision is the
 * rink-wide tighter standard, and a station's own limits only loosen or tighten its normal pair. A station's own
 * pair is used only when both limits are set, since mixing one own limit with one of the rink's could give
 * true > fair.
 */
export function bandsFor(input: { rink: RinkBandSettings; station?: StationBandSettings | null; precision: boolean }): ChosenBands {
  const { rink, station, precision } = input;
  let chosen: ChosenBands;
  if (precision) {
    chosen = { trueNm: rink.precisionTrueNm, fairNm: rink.precisionFairNm, source: 'rink', precision: true };
  } else if (station && station.ownTrueNm !== null && station.ownFairNm !== null) {
    chosen = { trueNm: station.ownTrueNm, fairNm: station.ownFairNm, source: 'station', precision: false };
  } else {
    chosen = { trueNm: rink.trueNm, fairNm: rink.fairNm, source: 'rink', precision: false };
  }
  assertBands(chosen);
  return chosen;
}
