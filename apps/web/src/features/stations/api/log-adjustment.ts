import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { AdjustmentInput } from '@rinkwright/core';
import { api } from '../../../lib/api-client';
import { stationKeys } from '../../../lib/queries/stations';
import { idempotencyHeader } from './idempotency';
import { stationPath } from './paths';

export const logAdjustment = (slug: string, stationId: string, input: AdjustmentInput, key: string) =>
  api<{ ok: true }>(stationPath(slug, stationId, '/adjustments'), { method: 'POST', body: input, headers: idempotencyHeader(key) });

export function useLogAdjustment(slug: string, stationId: string) {
  const client = useQueryClient();
  return useMutation({
    mutationFn: ({ input, key }: { input: AdjustmentInput; key: string }) => logAdjustment(slug, stationId, input, key),
    onSuccess: () => client.invalidateQueries({ queryKey: stationKeys.all(slug) }),
  });
}
