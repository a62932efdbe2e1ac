import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { DeskSettings } from '@rinkwright/core';
import { api } from '../../../lib/api-client';
import { stationKeys } from '../../../lib/queries/stations';
import { rinkPath } from './paths';

export const updateDeskSettings = (slug: string, input: DeskSettings) =>
  api<DeskSettings>(rinkPath(slug, '/desk-settings'), { method: 'PUT', body: input });

export function useUpdateDeskSettings(slug: string) {
  const client = useQueryClient();
  return useMutation({
    mutationFn: (input: DeskSettings) => updateDeskSettings(slug, input),
    // The bands decide every station's readings, so every station view is stale.
    onSuccess: (saved) => {
      client.setQueryData(stationKeys.settings(slug), saved);
      return client.invalidateQueries({ queryKey: stationKeys.all(slug) });
    },
  });
}
