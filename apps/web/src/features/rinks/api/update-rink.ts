import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { RinkSummary, UpdateRinkInput } from '@rinkwright/core';
import { api } from '../../../lib/api-client';
import { meKey } from '../../../lib/session';
import { rinkKeys } from './get-rink';

export const updateRink = (slug: string, input: UpdateRinkInput) =>
  api<RinkSummary>(`/api/rinks/${encodeURIComponent(slug)}`, { method: 'PATCH', body: input });

export function useUpdateRink(slug: string) {
  const client = useQueryClient();
  return useMutation({
    mutationFn: (input: UpdateRinkInput) => updateRink(slug, input),
    onSuccess: (summary) => {
      client.setQueryData(rinkKeys.summary(slug), summary);
      return client.invalidateQueries({ queryKey: meKey });
    },
  });
}
