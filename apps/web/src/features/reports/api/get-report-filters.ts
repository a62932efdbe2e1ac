import { queryOptions, useQuery } from '@tanstack/react-query';
import type { ReportFilterChoices } from '@rinkwright/core';
import { api } from '../../../lib/api-client';
import { reportKeys, reportsPath } from './keys';

export type { ReportFilterChoices };

export const getReportFilters = (slug: string, signal?: AbortSignal) => api<ReportFilterChoices>(reportsPath(slug), { signal });

export const reportFiltersQuery = (slug: string) => queryOptions({ queryKey: reportKeys.filters(slug), queryFn: ({ signal }) => getReportFilters(slug, signal) });

export const useReportFilters = (slug: string) => useQuery(reportFiltersQuery(slug));
