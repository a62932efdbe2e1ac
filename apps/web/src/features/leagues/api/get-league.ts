import { queryOptions, useQuery } from '@tanstack/react-query';
import type { LeagueDetail } from '@rinkwright/core';
import { api } from '../../../lib/api-client';
import { leagueKeys, rinkApi } from './keys';

export const getLeague = (slug: string, leagueId: string, signal?: AbortSignal) => api<LeagueDetail>(rinkApi(slug, `/leagues/${encodeURIComponent(leagueId)}`), { signal });

export const leagueQuery = (slug: string, leagueId: string) =>
  queryOptions({ queryKey: leagueKeys.detail(slug, leagueId), queryFn: ({ signal }) => getLeague(slug, leagueId, signal) });

export const useLeague = (slug: string, leagueId: string) => useQuery(leagueQuery(slug, leagueId));
