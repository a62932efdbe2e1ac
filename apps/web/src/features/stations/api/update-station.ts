import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { StationInput, StationRow } from '@rinkwright/core';
import { api } from '../../../lib/api-client';
import { stationKeys } from '../../../lib/queries/stations';
import { stationPath } from './paths';

export const updateStation = (slug: string, stationId: string, input: StationInput) =>
  api<StationRow>(stationPath(slug, stationId), { method: 'PUT', body: input });

export function useUpdateStation(slug: string, stationId: string) {
  const client = useQueryClient();
  return useMutation({
    mutationFn: (input: StationInput) => updateStation(slug, stationId, input),
    onSuccess: () => client.invalidateQueries({ queryKey: stationKeys.all(slug) }),
  });
}
