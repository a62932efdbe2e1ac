import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { LeagueDetail, LeagueInput } from '@rinkwright/core';
import { api } from '../../../lib/api-client';
import { leagueKeys, rinkApi } from './keys';

export const createLeague = (slug: string, input: LeagueInput) => api<LeagueDetail>(rinkApi(slug, '/leagues'), { method: 'POST', body: input });

export function useCreateLeague(slug: string) {
  const client = useQueryClient();
  return useMutation({
    mutationFn: (input: LeagueInput) => createLeague(slug, input),
    onSuccess: (detail) => {
      client.setQueryData(leagueKeys.detail(slug, detail.league.id), detail);
      return client.invalidateQueries({ queryKey: leagueKeys.list(slug) });
    },
  });
}
