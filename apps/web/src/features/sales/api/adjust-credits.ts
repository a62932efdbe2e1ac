import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { CreditAdjustmentInput, EntryResponse } from '@rinkwright/core';
import { dismiss, newKey, send } from '../../../lib/outbox';
import { rinkApi, salesKeys } from './keys';

export async function adjustCredits(slug: string, customerId: string, input: CreditAdjustmentInput, label: string) {
  const key = newKey();
  try {
    return await send<EntryResponse>({ key, rinkSlug: slug, method: 'POST', path: rinkApi(slug, `/customers/${encodeURIComponent(customerId)}/adjustments`), body: input, label });
  } catch (error) {
    // The form shows the refusal by its fields; the outbox need not keep it on show as well.
    await dismiss(key);
    throw error;
  }
}

export function useAdjustCredits(slug: string, customerId: string) {
  const client = useQueryClient();
  return useMutation({
    mutationFn: ({ input, label }: { input: CreditAdjustmentInput; label: string }) => adjustCredits(slug, customerId, input, label),
    onSettled: () => client.invalidateQueries({ queryKey: salesKeys.customerCredits(slug, customerId) }),
  });
}
