import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { ThroughputReport, ReportQuery } from '@rinkwright/core';
import { api } from '../../../lib/api-client';
import { reportKeys, reportSearch, reportsPath } from './keys';

export const getThroughputReport = (slug: string, query: ReportQuery, signal?: AbortSignal) =>
  api<ThroughputReport>(reportsPath(slug, `/throughput?${reportSearch(query)}`), { signal });

// The figures of the last filters stay on screen while the next ones load, so the page does not jump.
export const throughputReportQuery = (slug: string, query: ReportQuery) =>
  queryOptions({ queryKey: reportKeys.report(slug, 'throughput', query), queryFn: ({ signal }) => getThroughputReport(slug, query, signal), placeholderData: keepPreviousData });

export const useThroughputReport = (slug: string, query: ReportQuery) => useQuery(throughputReportQuery(slug, query));
