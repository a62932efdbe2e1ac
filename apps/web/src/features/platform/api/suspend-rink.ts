import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { SuspensionInput } from '@rinkwright/core';
import { api } from '../../../lib/api-client';
import { platformKeys } from './get-platform-rinks';

export const suspendRink = (rinkId: string, input: SuspensionInput) =>
  api<{ ok: true }>(`/api/platform/rinks/${encodeURIComponent(rinkId)}/suspension`, { method: 'POST', body: input });

export function useSuspendRink() {
  const client = useQueryClient();
  return useMutation({
    mutationFn: ({ rinkId, input }: { rinkId: string; input: SuspensionInput }) => suspendRink(rinkId, input),
    onSuccess: () => client.invalidateQueries({ queryKey: platformKeys.rinks, exact: true }),
  });
}
