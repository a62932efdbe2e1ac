import { queryOptions, useQuery } from '@tanstack/react-query';
import type { ReportFilterChoices } from '@rinkwright/core';
import { api } from '../../../lib/api-client';
import { reportKeys, reportsPath, type ReportSource } from './keys';

export type { ReportFilterChoices };

export const getReportFilters = (source: ReportSource, signal?: AbortSignal) => api<ReportFilterChoices>(reportsPath(source), { signal });

export const reportFiltersQuery = (source: ReportSource) =>
  queryOptions({ queryKey: reportKeys.filters(source), queryFn: ({ signal }) => getReportFilters(source, signal) });

export const useReportFilters = (source: ReportSource) => useQuery(reportFiltersQuery(source));
