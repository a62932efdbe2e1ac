import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { LeagueReport, ReportQuery } from '@rinkwright/core';
import { api } from '../../../lib/api-client';
import { reportKeys, reportSearch, reportsPath } from './keys';

export const getLeagueReport = (slug: string, query: ReportQuery, signal?: AbortSignal) =>
  api<LeagueReport>(reportsPath(slug, `/leagues?${reportSearch(query)}`), { signal });

// The figures of the last filters stay on screen while the next ones load, so the page does not jump.
export const leagueReportQuery = (slug: string, query: ReportQuery) =>
  queryOptions({ queryKey: reportKeys.report(slug, 'leagues', query), queryFn: ({ signal }) => getLeagueReport(slug, query, signal), placeholderData: keepPreviousData });

export const useLeagueReport = (slug: string, query: ReportQuery) => useQuery(leagueReportQuery(slug, query));
