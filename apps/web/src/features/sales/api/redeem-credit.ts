import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { EntryResponse } from '@rinkwright/core';
import { dismiss, newKey, send } from '../../../lib/outbox';
import { rinkApi, salesKeys } from './keys';

/** Through the outbox like every counter write: one key per press, resent with it after a dropped connection. */
export async function redeemCredit(slug: string, customerId: string, label: string) {
  const key = newKey();
  try {
    return await send<EntryResponse>({ key, rinkSlug: slug, method: 'POST', path: rinkApi(slug, `/customers/${encodeURIComponent(customerId)}/redemptions`), body: { ticketPairId: null, note: null }, label });
  } catch (error) {
    // The panel shows the refusal beside the button; the outbox need not keep it on show as well.
    await dismiss(key);
    throw error;
  }
}

export function useRedeemCredit(slug: string, customerId: string) {
  const client = useQueryClient();
  return useMutation({
    mutationFn: (label: string) => redeemCredit(slug, customerId, label),
    onSettled: () => client.invalidateQueries({ queryKey: salesKeys.customerCredits(slug, customerId) }),
  });
}
