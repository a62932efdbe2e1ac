import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { StationInput, StationRow } from '@rinkwright/core';
import { api } from '../../../lib/api-client';
import { stationKeys } from '../../../lib/queries/stations';
import { rinkPath } from './paths';

export const createStation = (slug: string, input: StationInput) => api<StationRow>(rinkPath(slug, '/stations'), { method: 'POST', body: input });

export function useCreateStation(slug: string) {
  const client = useQueryClient();
  return useMutation({
    mutationFn: (input: StationInput) => createStation(slug, input),
    onSuccess: () => client.invalidateQueries({ queryKey: stationKeys.all(slug) }),
  });
}
