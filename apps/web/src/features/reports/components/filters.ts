import { reportQuery, type ReportName, type ReportQuery } from '@rinkwright/core';

// The filters live in the address, so a link reproduces the view. "compare=previous" is kept as a word rather
// than as dates: the comparison follows the period when someone changes its dates later.

export type CompareMode = 'none' | 'previous' | 'custom';

export const REPORT_LABEL: Record<ReportName, string> = { throughput: 'Throughput', quality: 'Quality', money: 'Money', leagues: 'League usage' };

export const REPORT_BLURB: Record<ReportName, string> = {
  throughput: 'Pairs sharpened, staffed hours and how fast tickets are ready.',
  quality: 'First readings by band, re-runs, leveling and wheel life.',
  money: 'Sales, refunds, credits redeemed and expired, memberships.',
  leagues: 'Credits each team was allocated and has used.',
};

/** Which filters each report takes: sales and league credits belong to no station or technician. */
export const REPORT_FILTERS: Record<ReportName, { station: boolean; technician: boolean; compare: boolean }> = {
  throughput: { station: true, technician: true, compare: true },
  quality: { station: true, technician: true, compare: true },
  money: { station: false, technician: false, compare: true },
  leagues: { station: false, technician: false, compare: false },
};

const DAY_MS = 86_400_000;

/** A calendar day moved by whole days; days are plain dates, so this is UTC arithmetic with no zone in it. */
export function addDays(day: string, days: number): string {
  return new Date(Date.parse(`${day}T00:00:00Z`) + days * DAY_MS).toISOString().slice(0, 10);
}

export const daysBetween = (from: string, to: string) => Math.round((Date.parse(`${to}T00:00:00Z`) - Date.parse(`${from}T00:00:00Z`)) / DAY_MS);

export const DEFAULT_DAYS = 30;

/** The period of the same length that ends the day before `from`. */
export function previousPeriod(from: string, to: string): { compareFrom: string; compareTo: string } {
  const length = daysBetween(from, to) + 1;
  const compareTo = addDays(from, -1);
  return { compareFrom: addDays(compareTo, -(length - 1)), compareTo };
}

/** What the form shows and edits: every value as typed, empty for "not chosen". */
export interface FilterValues {
  from: string;
  to: string;
  stationId: string;
  technicianId: string;
  compare: CompareMode;
  compareFrom: string;
  compareTo: string;
}

export function valuesFromSearch(params: URLSearchParams, today: string): FilterValues {
  const custom = params.has('compareFrom') || params.has('compareTo');
  return {
    from: params.get('from') ?? addDays(today, -(DEFAULT_DAYS - 1)),
    to: params.get('to') ?? today,
    stationId: params.get('stationId') ?? '',
    technicianId: params.get('technicianId') ?? '',
    compare: custom ? 'custom' : params.get('compare') === 'previous' ? 'previous' : 'none',
    compareFrom: params.get('compareFrom') ?? '',
    compareTo: params.get('compareTo') ?? '',
  };
}

export const isDay = (day: string) => /^\d{4}-\d{2}-\d{2}$/.test(day) && !Number.isNaN(Date.parse(`${day}T00:00:00Z`));

/** The form's values as the API's query input (before its schema checks them), keeping only what the report takes. */
export function queryInput(values: FilterValues, report: ReportName): Record<string, string | undefined> {
  const takes = REPORT_FILTERS[report];
  const orUndefined = (v: string) => (v === '' ? undefined : v);
  let compare: { compareFrom?: string | undefined; compareTo?: string | undefined } = {};
  if (takes.compare && values.compare === 'custom') compare = { compareFrom: values.compareFrom, compareTo: values.compareTo };
  // An unusable period already has its own message; a comparison computed from it would only repeat it.
  else if (takes.compare && values.compare === 'previous' && isDay(values.from) && isDay(values.to) && values.from <= values.to) {
    compare = previousPeriod(values.from, values.to);
  }
  return {
    from: values.from,
    to: values.to,
    stationId: takes.station ? orUndefined(values.stationId) : undefined,
    technicianId: takes.technician ? orUndefined(values.technicianId) : undefined,
    ...compare,
  };
}

export type ParsedFilters = { ok: true; query: ReportQuery } | { ok: false; fields: Record<string, string[]> };

/** The filters checked by the route's own schema, with its messages per field when they do not pass. */
export function parseFilters(values: FilterValues, report: ReportName): ParsedFilters {
  const parsed = reportQuery.safeParse(queryInput(values, report));
  if (parsed.success) return { ok: true, query: parsed.data };
  const fields: Record<string, string[]> = {};
  for (const issue of parsed.error.issues) {
    const key = String(issue.path[0] ?? 'from');
    (fields[key] ??= []).push(issue.message);
  }
  return { ok: false, fields };
}

/**
 * The address of the view. The dates are always written, so a shared link shows the same period tomorrow; a
 * station or technician is kept even on a report that ignores it, so it is still chosen on the way back.
 */
export function searchFromValues(values: FilterValues): URLSearchParams {
  const params = new URLSearchParams({ from: values.from, to: values.to });
  if (values.stationId) params.set('stationId', values.stationId);
  if (values.technicianId) params.set('technicianId', values.technicianId);
  if (values.compare === 'previous') params.set('compare', 'previous');
  if (values.compare === 'custom') {
    params.set('compareFrom', values.compareFrom);
    params.set('compareTo', values.compareTo);
  }
  return params;
}
