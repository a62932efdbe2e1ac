import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { StationRow } from '@rinkwright/core';
import { api } from '../../../lib/api-client';
import { stationKeys } from '../../../lib/queries/stations';
import { idempotencyHeader } from './idempotency';
import { stationPath } from './paths';

export const removeWheel = (slug: string, stationId: string, key: string) =>
  api<StationRow>(stationPath(slug, stationId, '/wheel-removals'), { method: 'POST', headers: idempotencyHeader(key) });

export function useRemoveWheel(slug: string, stationId: string) {
  const client = useQueryClient();
  return useMutation({
    mutationFn: ({ key }: { key: string }) => removeWheel(slug, stationId, key),
    onSuccess: () => client.invalidateQueries({ queryKey: stationKeys.all(slug) }),
  });
}
