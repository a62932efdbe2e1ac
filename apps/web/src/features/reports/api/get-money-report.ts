import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { MoneyReport, ReportQuery } from '@rinkwright/core';
import { api } from '../../../lib/api-client';
import { reportKeys, reportSearch, reportsPath, type ReportSource } from './keys';

export const getMoneyReport = (source: ReportSource, query: ReportQuery, signal?: AbortSignal) =>
  api<MoneyReport>(reportsPath(source, `/money?${reportSearch(query)}`), { signal });

// The figures of the last filters stay on screen while the next ones load, so the page does not jump.
export const moneyReportQuery = (source: ReportSource, query: ReportQuery) =>
  queryOptions({ queryKey: reportKeys.report(source, 'money', query), queryFn: ({ signal }) => getMoneyReport(source, query, signal), placeholderData: keepPreviousData });

export const useMoneyReport = (source: ReportSource, query: ReportQuery) => useQuery(moneyReportQuery(source, query));
