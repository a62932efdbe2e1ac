import { formatLength, hundredthsMmToNm, inchesToNm, mmToNm, thousandthsToNm, type LengthKind, type UnitPreference } from '@rinkwright/core';

// The counter types lengths in the rink's unit; the API stores integer nanometres. These are the only
// conversions the screens use, so a value typed in and shown back is always the same number.

export const readingUnitLabel = (unit: UnitPreference) => (unit === 'in' ? 'thou' : '0.01 mm');
export const lengthUnitLabel = (unit: UnitPreference) => (unit === 'in' ? 'in' : 'mm');

/** A length typed in the rink's unit (inches or millimetres), or null when the text is not a number. */
export function parseLength(text: string, unit: UnitPreference): number | null {
  const fraction = /^\s*(\d+)\s*\/\s*(\d+)\s*"?\s*$/.exec(text);
  if (fraction && unit === 'in') return inchesToNm(Number(fraction[1]) / Number(fraction[2]));
  const value = Number(text.replace(',', '.').replace('"', '').trim());
  if (text.trim() === '' || !Number.isFinite(value)) return null;
  return unit === 'in' ? inchesToNm(value) : mmToNm(value);
}

/** A level reading typed in thousandths of an inch or hundredths of a millimetre, signed. */
export function parseReading(text: string, unit: UnitPreference): number | null {
  const value = Number(text.replace(',', '.').replace('\u2212', '-').trim());
  if (text.trim() === '' || !Number.isFinite(value)) return null;
  return unit === 'in' ? thousandthsToNm(value) : hundredthsMmToNm(value);
}

export const showLength = (nm: number | null | undefined, unit: UnitPreference, kind: Exclude<LengthKind, 'reading'>) =>
  nm === null || nm === undefined ? '—' : formatLength(nm, unit, kind).text;

/** The number as typed into a field of the rink's unit, for prefilling an input. */
export const lengthInput = (nm: number | null | undefined, unit: UnitPreference, kind: Exclude<LengthKind, 'reading'>) =>
  nm === null || nm === undefined ? '' : formatLength(nm, unit, kind).value.replace(/"$/, '');

/** Profile (rocker) radii are spoken of in feet in inch rinks (9 ft, 10 ft…) and in metres elsewhere. */
export function radiusToNm(text: string, unit: UnitPreference): number | null {
  const value = Number(text.replace(',', '.').trim());
  if (!Number.isFinite(value) || value <= 0) return null;
  return unit === 'in' ? inchesToNm(value * 12) : mmToNm(value * 1000);
}

export const showRadius = (nm: number, unit: UnitPreference) =>
  unit === 'in' ? `${Number((nm / 25_400_000 / 12).toFixed(1))} ft` : `${Number((nm / 1_000_000_000).toFixed(2))} m`;
