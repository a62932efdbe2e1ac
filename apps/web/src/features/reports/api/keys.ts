import type { ReportName, ReportQuery } from '@rinkwright/core';

/**
 * Where the report screens read from: a rink's own reports for its staff, or the same reports of any rink for the
 * platform admin. The screens are the same; only the API path, the cache and the screens' own address differ.
 */
export interface ReportSource {
  /** The API path the report routes hang under. */
  path: string;
  /** The start of every query key, so each source's answers are cached apart. */
  key: readonly string[];
  /** The app's address of the report screens, for the links from one report to another. */
  pages: string;
}

export const rinkReports = (slug: string): ReportSource => ({
  path: `/api/rinks/${encodeURIComponent(slug)}/reports`,
  key: ['rink', slug, 'reports'],
  pages: `/rinks/${slug}/reports`,
});

export const platformReports = (rinkId: string): ReportSource => ({
  path: `/api/platform/rinks/${encodeURIComponent(rinkId)}/reports`,
  key: ['platform', 'rinks', rinkId, 'reports'],
  pages: `/platform/rinks/${encodeURIComponent(rinkId)}/reports`,
});

export const reportKeys = {
  all: (source: ReportSource) => source.key,
  filters: (source: ReportSource) => [...source.key, 'filters'] as const,
  report: (source: ReportSource, report: ReportName, query: ReportQuery) => [...source.key, report, query] as const,
};

export const reportsPath = (source: ReportSource, rest = '') => `${source.path}${rest}`;

// A fixed order, so the same filters always make the same address (and the CSV link repeats the screen's).
const ORDER = ['from', 'to', 'stationId', 'technicianId', 'compareFrom', 'compareTo'] as const;

export function reportSearch(query: ReportQuery): string {
  const params = new URLSearchParams();
  for (const key of ORDER) {
    const value = query[key];
    if (value) params.set(key, value);
  }
  return params.toString();
}

/** The CSV of one table, with the same filters as the screen; the browser's session cookie carries the download. */
export const reportCsvHref = (source: ReportSource, report: ReportName, table: string, query: ReportQuery) =>
  reportsPath(source, `/${report}/${encodeURIComponent(table)}.csv?${reportSearch(query)}`);
