import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { MountWheelInput, StationRow } from '@rinkwright/core';
import { api } from '../../../lib/api-client';
import { stationKeys } from '../../../lib/queries/stations';
import { idempotencyHeader } from './idempotency';
import { stationPath } from './paths';

export const mountWheel = (slug: string, stationId: string, input: MountWheelInput, key: string) =>
  api<StationRow>(stationPath(slug, stationId, '/wheels'), { method: 'POST', body: input, headers: idempotencyHeader(key) });

export function useMountWheel(slug: string, stationId: string) {
  const client = useQueryClient();
  return useMutation({
    mutationFn: ({ input, key }: { input: MountWheelInput; key: string }) => mountWheel(slug, stationId, input, key),
    onSuccess: () => client.invalidateQueries({ queryKey: stationKeys.all(slug) }),
  });
}
