import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { platformKeys } from './get-platform-rinks';

export const reactivateRink = (rinkId: string) => api<{ ok: true }>(`/api/platform/rinks/${encodeURIComponent(rinkId)}/reactivation`, { method: 'POST' });

export function useReactivateRink() {
  const client = useQueryClient();
  return useMutation({
    mutationFn: (rinkId: string) => reactivateRink(rinkId),
    onSuccess: () => client.invalidateQueries({ queryKey: platformKeys.rinks, exact: true }),
  });
}
