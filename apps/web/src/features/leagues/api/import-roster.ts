import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { RosterResult } from '@rinkwright/core';
import { api } from '../../../lib/api-client';
import { leagueKeys, rinkApi } from './keys';

export const importRoster = (slug: string, leagueId: string, csv: string) =>
  api<RosterResult>(rinkApi(slug, `/leagues/${encodeURIComponent(leagueId)}/roster`), { method: 'POST', body: { csv } });

export function useImportRoster(slug: string, leagueId: string) {
  const client = useQueryClient();
  return useMutation({
    mutationFn: (csv: string) => importRoster(slug, leagueId, csv),
    onSuccess: () => client.invalidateQueries({ queryKey: leagueKeys.all(slug) }),
  });
}
