import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { CheckReadingInput } from '@rinkwright/core';
import { api } from '../../../lib/api-client';
import { stationKeys } from '../../../lib/queries/stations';
import { idempotencyHeader } from './idempotency';
import { stationPath } from './paths';

export const logCheckReading = (slug: string, stationId: string, input: CheckReadingInput, key: string) =>
  api<{ ok: true }>(stationPath(slug, stationId, '/check-readings'), { method: 'POST', body: input, headers: idempotencyHeader(key) });

export function useLogCheckReading(slug: string, stationId: string) {
  const client = useQueryClient();
  return useMutation({
    mutationFn: ({ input, key }: { input: CheckReadingInput; key: string }) => logCheckReading(slug, stationId, input, key),
    onSuccess: () => client.invalidateQueries({ queryKey: stationKeys.all(slug) }),
  });
}
