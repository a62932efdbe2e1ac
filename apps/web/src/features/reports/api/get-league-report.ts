import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { LeagueReport, ReportQuery } from '@rinkwright/core';
import { api } from '../../../lib/api-client';
import { reportKeys, reportSearch, reportsPath, type ReportSource } from './keys';

export const getLeagueReport = (source: ReportSource, query: ReportQuery, signal?: AbortSignal) =>
  api<LeagueReport>(reportsPath(source, `/leagues?${reportSearch(query)}`), { signal });

// The figures of the last filters stay on screen while the next ones load, so the page does not jump.
export const leagueReportQuery = (source: ReportSource, query: ReportQuery) =>
  queryOptions({ queryKey: reportKeys.report(source, 'leagues', query), queryFn: ({ signal }) => getLeagueReport(source, query, signal), placeholderData: keepPreviousData });

export const useLeagueReport = (source: ReportSource, query: ReportQuery) => useQuery(leagueReportQuery(source, query));
