import { queryOptions, useQuery } from '@tanstack/react-query';
import type { leagueList } from '@rinkwright/core';
import type { z } from 'zod';
import { api } from '../../../lib/api-client';
import { leagueKeys, rinkApi } from './keys';

export type LeagueList = z.infer<typeof leagueList>;
export type LeagueSummary = LeagueList['leagues'][number];

export const getLeagues = (slug: string, signal?: AbortSignal) => api<LeagueList>(rinkApi(slug, '/leagues'), { signal });

export const leaguesQuery = (slug: string) => queryOptions({ queryKey: leagueKeys.list(slug), queryFn: ({ signal }) => getLeagues(slug, signal) });

export const useLeagues = (slug: string) => useQuery(leaguesQuery(slug));
