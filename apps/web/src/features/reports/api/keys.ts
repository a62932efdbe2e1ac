import type { ReportName, ReportQuery } from '@rinkwright/core';

export const reportKeys = {
  all: (slug: string) => ['rink', slug, 'reports'] as const,
  filters: (slug: string) => ['rink', slug, 'reports', 'filters'] as const,
  report: (slug: string, report: ReportName, query: ReportQuery) => ['rink', slug, 'reports', report, query] as const,
};

export const reportsPath = (slug: string, rest = '') => `/api/rinks/${encodeURIComponent(slug)}/reports${rest}`;

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
export const reportCsvHref = (slug: string, report: ReportName, table: string, query: ReportQuery) =>
  reportsPath(slug, `/${report}/${encodeURIComponent(table)}.csv?${reportSearch(query)}`);
