import { formatLength, type ColumnFormat, type ReportColumn, type UnitPreference } from '@rinkwright/core';
import { formatCount, formatDate, formatDateTime, formatMoney } from '../../../lib/format';

// How each kind of report figure is written. Money and counts come from lib/format; readings from the core's
// length formatter, the one the counter and station screens use, so a reading reads the same everywhere.

const percent = new Intl.NumberFormat(undefined, { style: 'percent', maximumFractionDigits: 1 });
const oneDecimal = new Intl.NumberFormat(undefined, { minimumFractionDigits: 1, maximumFractionDigits: 1 });
const MINUS = '\u2212';

export const formatShare = (share: number) => percent.format(share);
export const formatDecimal = (n: number) => oneDecimal.format(n);

/** A signed reading with its unit ("+1.2 thou"); a mean of absolute readings is written without its plus. */
export const formatReading = (nm: number, unit: UnitPreference, absolute = false) => {
  const text = formatLength(nm, unit, 'reading').text;
  return absolute ? text.replace(/^\+/, '') : text;
};

/** The number alone, for a table column whose header names the unit. */
export const formatReadingValue = (nm: number, unit: UnitPreference, absolute = false) => {
  const value = formatLength(nm, unit, 'reading').value;
  return absolute ? value.replace(/^\+/, '') : value;
};

export const readingUnitWords = (unit: UnitPreference) => (unit === 'in' ? 'thou' : 'hundredths mm');

/** Minutes as a person says them: "45 min", "2 h 05 min", "1 d 3 h". */
export function formatMinutes(minutes: number): string {
  const m = Math.round(minutes);
  if (m < 60) return `${m} min`;
  if (m < 24 * 60) return `${Math.floor(m / 60)} h ${String(m % 60).padStart(2, '0')} min`;
  const hours = Math.round(m / 60);
  return `${Math.floor(hours / 24)} d ${hours % 24} h`;
}

/** A local calendar day ("2026-11-03") in the reader's words, without a time zone shifting it. */
export const formatDay = (day: string) => formatDate(`${day}T00:00:00Z`, 'UTC');

export const formatPeriod = (period: { from: string; to: string }) => (period.from === period.to ? formatDay(period.from) : `${formatDay(period.from)} – ${formatDay(period.to)}`);

export const WEEKDAYS = ['Monday', 'Tuesday', 'Wednesday', 'Thursday', 'Friday', 'Saturday', 'Sunday'] as const;

export interface CellContext {
  currency: string;
  unit: UnitPreference;
  timeZone: string;
}

/**
 * A column's header: its shared label, with the currency or the reading unit after it as the CSV export writes
 * them, so the headers on screen and in the file are the same words.
 */
export function columnLabel(column: ReportColumn, ctx: CellContext): string {
  if (column.format === 'minor') return `${column.label} (${ctx.currency})`;
  if (column.format === 'nm') return `${column.label} (${readingUnitWords(ctx.unit)})`;
  return column.label;
}

/** One table cell as text, by the column's format in the shared table list. */
export function formatCell(value: unknown, format: ColumnFormat, ctx: CellContext): string {
  if (value === null || value === undefined) return '—';
  if (format === 'datetime') return formatDateTime(String(value), ctx.timeZone);
  if (format === 'text' || typeof value !== 'number') return String(value);
  switch (format) {
    case 'int':
      return formatCount(value);
    case 'decimal':
      return formatDecimal(value);
    case 'share':
      return formatShare(value);
    case 'minor':
      return formatMoney(value, ctx.currency);
    case 'nm':
      return formatReadingValue(value, ctx.unit);
  }
}

/** A signed difference: "+12", "−3.5", "0". */
export function signedText(diff: number, format: (n: number) => string): string {
  if (diff === 0) return format(0);
  return `${diff < 0 ? MINUS : '+'}${format(Math.abs(diff))}`;
}
