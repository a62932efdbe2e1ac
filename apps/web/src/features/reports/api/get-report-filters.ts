import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { reportKeys, reportsPath } from './keys';

export interface ReportFilterChoices {
  timeZone: string;
  currency: string;
  /** The rink's local day now, as the server sees it: the default period ends here. */
  today: string;
  stations: { id: string; name: string }[];
  technicians: { id: string; name: string }[];
}

export const getReportFilters = (slug: string, signal?: AbortSignal) => api<ReportFilterChoices>(reportsPath(slug), { signal });

export const reportFiltersQuery = (slug: string) => queryOptions({ queryKey: reportKeys.filters(slug), queryFn: ({ signal }) => getReportFilters(slug, signal) });

export const useReportFilters = (slug: string) => useQuery(reportFiltersQuery(slug));
