import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { ThroughputReport, ReportQuery } from '@rinkwright/core';
import { api } from '../../../lib/api-client';
import { reportKeys, reportSearch, reportsPath, type ReportSource } from './keys';

export const getThroughputReport = (source: ReportSource, query: ReportQuery, signal?: AbortSignal) =>
  api<ThroughputReport>(reportsPath(source, `/throughput?${reportSearch(query)}`), { signal });

// The figures of the last filters stay on screen while the next ones load, so the page does not jump.
export const throughputReportQuery = (source: ReportSource, query: ReportQuery) =>
  queryOptions({ queryKey: reportKeys.report(source, 'throughput', query), queryFn: ({ signal }) => getThroughputReport(source, query, signal), placeholderData: keepPreviousData });

export const useThroughputReport = (source: ReportSource, query: ReportQuery) => useQuery(throughputReportQuery(source, query));
