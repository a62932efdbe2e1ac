import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { MoneyReport, ReportQuery } from '@rinkwright/core';
import { api } from '../../../lib/api-client';
import { reportKeys, reportSearch, reportsPath } from './keys';

export const getMoneyReport = (slug: string, query: ReportQuery, signal?: AbortSignal) =>
  api<MoneyReport>(reportsPath(slug, `/money?${reportSearch(query)}`), { signal });

// The figures of the last filters stay on screen while the next ones load, so the page does not jump.
export const moneyReportQuery = (slug: string, query: ReportQuery) =>
  queryOptions({ queryKey: reportKeys.report(slug, 'money', query), queryFn: ({ signal }) => getMoneyReport(slug, query, signal), placeholderData: keepPreviousData });

export const useMoneyReport = (slug: string, query: ReportQuery) => useQuery(moneyReportQuery(slug, query));
