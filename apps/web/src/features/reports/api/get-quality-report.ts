import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { QualityReport, ReportQuery } from '@rinkwright/core';
import { api } from '../../../lib/api-client';
import { reportKeys, reportSearch, reportsPath } from './keys';

export const getQualityReport = (slug: string, query: ReportQuery, signal?: AbortSignal) =>
  api<QualityReport>(reportsPath(slug, `/quality?${reportSearch(query)}`), { signal });

// The figures of the last filters stay on screen while the next ones load, so the page does not jump.
export const qualityReportQuery = (slug: string, query: ReportQuery) =>
  queryOptions({ queryKey: reportKeys.report(slug, 'quality', query), queryFn: ({ signal }) => getQualityReport(slug, query, signal), placeholderData: keepPreviousData });

export const useQualityReport = (slug: string, query: ReportQuery) => useQuery(qualityReportQuery(slug, query));
