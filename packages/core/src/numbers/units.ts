// Lengths live as integer nanometres because both inch and millimetre inputs of the trade land on whole
// nanometres (1 in = 25.4 mm exactly, so 0.001 in = 25,400 nm and 0.01 mm = 10,000 nm): nothing is lost going
// either way, and equal lengths compare equal whatever unit they were typed in.

export const NM_PER_INCH = 25_400_000;
export const NM_PER_MM = 1_000_000;
export const NM_PER_THOUSANDTH = 25_400;
export const NM_PER_HUNDREDTH_MM = 10_000;

export type LengthUnit = 'in' | 'mm';
export type LengthKind = 'hollow' | 'width' | 'reading' | 'diameter';

// Readings are signed: a mirror-image reading has to convert to the mirror-image length, which Math.round
// (halves toward +∞) would break at -x.5.
function roundHalfAwayFromZero(x: number): number {
  return Math.sign(x) * Math.round(Math.abs(x));
}

function toNm(value: number, nmPerUnit: number): number {
  if (!Number.isFinite(value)) throw new RangeError('A length must be a finite number');
  const nm = roundHalfAwayFromZero(value * nmPerUnit);
  // -0 would print as "0" but compare oddly with Object.is and in snapshots.
  return nm === 0 ? 0 : nm;
}

export const inchesToNm = (inches: number): number => toNm(inches, NM_PER_INCH);
export const mmToNm = (mm: number): number => toNm(mm, NM_PER_MM);
export const thousandthsToNm = (thousandths: number): number => toNm(thousandths, NM_PER_THOUSANDTH);
export const hundredthsMmToNm = (hundredths: number): number => toNm(hundredths, NM_PER_HUNDREDTH_MM);

export const nmToInches = (nm: number): number => nm / NM_PER_INCH;
export const nmToMm = (nm: number): number => nm / NM_PER_MM;
export const nmToThousandths = (nm: number): number => nm / NM_PER_THOUSANDTH;
export const nmToHundredthsMm = (nm: number): number => nm / NM_PER_HUNDREDTH_MM;

export interface CommonHollow {
  /** As the trade writes it, e.g. 1/2". */
  label: string;
  fraction: string;
  inches: number;
  nm: number;
}

const hollow = (fraction: string, inches: number): CommonHollow => ({
  label: `${fraction}"`,
  fraction,
  inches,
  nm: inchesToNm(inches),
});

/** The radii of hollow most shops keep dressed, shallowest last. */
export const COMMON_HOLLOWS: readonly CommonHollow[] = Object.freeze([
  hollow('3/8', 0.375),
  hollow('7/16', 0.4375),
  hollow('1/2', 0.5),
  hollow('5/8', 0.625),
  hollow('3/4', 0.75),
  hollow('1', 1),
]);

export interface FormattedLength {
  /** The number alone, ready for tabular figures. */
  value: string;
  /** The unit as a technician says it, shown beside or under the value. */
  unit: string;
  /** Value and unit on one line. */
  text: string;
}

// Decimal places per kind and unit: enough to tell apart the steps a technician can actually set or measure
// (a 0.1 thou or 0.1 hundredth-mm reading, a 0.01 mm blade width), no more, so a column of figures stays calm.
const DECIMALS: Record<Exclude<LengthKind, 'hollow'>, Record<LengthUnit, number>> = {
  width: { in: 4, mm: 2 },
  diameter: { in: 3, mm: 1 },
  reading: { in: 1, mm: 1 },
};

// U+2212 rather than a hyphen: in tabular figures it is as wide as the plus sign, so signed columns line up.
const MINUS = '\u2212';

function fixed(value: number, decimals: number): string {
  const text = value.toFixed(decimals);
  // toFixed keeps the sign of a value that rounds to zero ("-0.0"): a level blade must not look tilted.
  return Number(text) === 0 ? (0).toFixed(decimals) : text;
}

function trimmed(value: number, maxDecimals: number): string {
  return fixed(value, maxDecimals).replace(/(\.\d*?)0+$/, '$1').replace(/\.$/, '');
}

function signed(text: string): string {
  if (Number(text) === 0) return text;
  return text.startsWith('-') ? MINUS + text.slice(1) : `+${text}`;
}

/**
 * A length as the trade writes it. Hollows in inches are shown as the usual fraction when they are exactly one of
 * the common hollows (an exact nm match: every common hollow typed in inches or millimetres lands on it), else as
 * a decimal. Readings are always signed, in thousandths of an inch or hundredths of a millimetre, because those
 * are the units the level gauges of each kind read in.
 */
export function formatLength(nm: number, unit: LengthUnit, kind: LengthKind): FormattedLength {
  if (!Number.isFinite(nm)) throw new RangeError('A length must be a finite number');
  if (kind === 'reading') {
    const value = signed(fixed(unit === 'in' ? nmToThousandths(nm) : nmToHundredthsMm(nm), DECIMALS.reading[unit]));
    const unitLabel = unit === 'in' ? 'thousandths of an inch' : 'hundredths of a millimetre';
    return { value, unit: unitLabel, text: `${value} ${unit === 'in' ? 'thou' : 'hundredths mm'}` };
  }
  let value: string;
  if (kind === 'hollow') {
    const common = unit === 'in' ? COMMON_HOLLOWS.find((h) => h.nm === nm) : undefined;
    value = common ? common.fraction : unit === 'in' ? trimmed(nmToInches(nm), 4) : trimmed(nmToMm(nm), 3);
  } else {
    value = fixed(unit === 'in' ? nmToInches(nm) : nmToMm(nm), DECIMALS[kind][unit]);
  }
  return { value, unit, text: unit === 'in' ? `${value}"` : `${value} mm` };
}
