import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { AllocationInput, LeagueDetail } from '@rinkwright/core';
import { dismiss, newKey, send } from '../../../lib/outbox';
import { leagueKeys, rinkApi } from './keys';

/** Moves credits from the pool through the outbox, like every counter write: one key per press. */
export async function allocate(slug: string, leagueId: string, input: AllocationInput, label: string) {
  const key = newKey();
  try {
    return await send<LeagueDetail>({ key, rinkSlug: slug, method: 'POST', path: rinkApi(slug, `/leagues/${encodeURIComponent(leagueId)}/allocations`), body: input, label });
  } catch (error) {
    // The form shows the refusal by its fields; the outbox need not keep it on show as well.
    await dismiss(key);
    throw error;
  }
}

export function useAllocate(slug: string, leagueId: string) {
  const client = useQueryClient();
  return useMutation({
    mutationFn: ({ input, label }: { input: AllocationInput; label: string }) => allocate(slug, leagueId, input, label),
    onSuccess: (outcome) => {
      if (!outcome.queued) client.setQueryData(leagueKeys.detail(slug, leagueId), outcome.result);
      return client.invalidateQueries({ queryKey: leagueKeys.all(slug) });
    },
  });
}
