import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { QualityReport, ReportQuery } from '@rinkwright/core';
import { api } from '../../../lib/api-client';
import { reportKeys, reportSearch, reportsPath, type ReportSource } from './keys';

export const getQualityReport = (source: ReportSource, query: ReportQuery, signal?: AbortSignal) =>
  api<QualityReport>(reportsPath(source, `/quality?${reportSearch(query)}`), { signal });

// The figures of the last filters stay on screen while the next ones load, so the page does not jump.
export const qualityReportQuery = (source: ReportSource, query: ReportQuery) =>
  queryOptions({ queryKey: reportKeys.report(source, 'quality', query), queryFn: ({ signal }) => getQualityReport(source, query, signal), placeholderData: keepPreviousData });

export const useQualityReport = (source: ReportSource, query: ReportQuery) => useQuery(qualityReportQuery(source, query));
