import { formatLength, type StationRow, type UnitPreference } from '@rinkwright/core';
import { parseLength, parseReading } from '../../../lib/units';

// Forms here are typed as text in the rink's units and checked by the shared API schemas after conversion, so a
// field's message is the same whether the browser or the server found the problem. These turn one typed field
// into the number the API takes, or a message on that field.

type Issue = { addIssue: (issue: { code: 'custom'; message: string; path?: PropertyKey[] }) => void };

/** Adds the message on `path` and answers null, so a caller can collect every field's problem in one pass. */
export function converted<T>(value: T | null, ctx: Issue, path: string, message: string): T | null {
  if (value === null) ctx.addIssue({ code: 'custom', message, path: [path] });
  return value;
}

export const toInteger = (text: string): number | null => {
  const t = text.replace(/[\s,]/g, '');
  return /^-?\d+$/.test(t) ? Number(t) : null;
};

/** A decimal typed to at most three places as integer thousandths (turns, mm, λ, L). */
export const toMilli = (text: string): number | null => {
  const t = text.trim().replace(',', '.').replace('\u2212', '-');
  if (!/^[+-]?(\d+\.?\d*|\.\d+)$/.test(t)) return null;
  const [whole = '0', fraction = ''] = t.replace(/^[+-]/, '').split('.');
  if (fraction.length > 3) return null;
  const milli = Number(whole) * 1000 + Number(fraction.padEnd(3, '0'));
  return t.startsWith('-') ? -milli : milli;
};

export const toLength = (text: string, unit: UnitPreference) => parseLength(text, unit);
export const toReading = (text: string, unit: UnitPreference) => parseReading(text, unit);

export const numberMessage = 'Enter a number';
export const milliMessage = 'Enter a number with at most three decimals';
export const wholeMessage = 'Enter a whole number';

/** Thousandths shown back as the decimal a person typed: 125 → "0.125", 3000 → "3". */
export const milliInput = (milli: number) => {
  const sign = milli < 0 ? '-' : '';
  const abs = Math.abs(milli);
  const fraction = String(abs % 1000).padStart(3, '0').replace(/0+$/, '');
  return `${sign}${Math.floor(abs / 1000)}${fraction ? `.${fraction}` : ''}`;
};

/** A reading limit shown as typed into a field: "1.0" thou, "2.5" hundredths of a mm. */
export const readingInput = (nm: number, unit: UnitPreference) => formatLength(nm, unit, 'reading').value.replace(/^\+/, '');

/** A signed reading with its unit, for logs and legends: "+1.2 thou", "−3.0 hundredths mm". */
export const readingText = (nm: number, unit: UnitPreference) => formatLength(nm, unit, 'reading').text;

export const limitText = (nm: number, unit: UnitPreference) => formatLength(Math.abs(nm), unit, 'reading').text.replace(/^\+/, '');

const MINUS = '\u2212';

/** A signed adjustment in the station's unit: "+0.250 turn", "−1.125 turns", "+0.050 mm". */
export function adjustText(milli: number, unit: StationRow['adjustUnit'], decimals = 3): string {
  const value = Math.abs(milli / 1000).toFixed(decimals);
  const sign = Number(value) === 0 ? '' : milli < 0 ? MINUS : '+';
  const word = unit === 'mm' ? 'mm' : Math.abs(milli) === 1000 || Number(value) < 1 ? 'turn' : 'turns';
  return `${sign}${value} ${word}`;
}

export const adjustUnitWord = (unit: StationRow['adjustUnit']) => (unit === 'mm' ? 'mm' : 'turns');

export const STATUS_LABEL: Record<StationRow['status'], string> = { active: 'Active', maintenance: 'In maintenance', retired: 'Retired' };

export const wholeNumber = (n: number) => new Intl.NumberFormat(undefined, { maximumFractionDigits: 0 }).format(n);

