import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { DressingInput, StationRow } from '@rinkwright/core';
import { api } from '../../../lib/api-client';
import { stationKeys } from '../../../lib/queries/stations';
import { idempotencyHeader } from './idempotency';
import { stationPath } from './paths';

export const dressWheel = (slug: string, stationId: string, input: DressingInput, key: string) =>
  api<StationRow>(stationPath(slug, stationId, '/dressings'), { method: 'POST', body: input, headers: idempotencyHeader(key) });

export function useDressWheel(slug: string, stationId: string) {
  const client = useQueryClient();
  return useMutation({
    mutationFn: ({ input, key }: { input: DressingInput; key: string }) => dressWheel(slug, stationId, input, key),
    onSuccess: () => client.invalidateQueries({ queryKey: stationKeys.all(slug) }),
  });
}
