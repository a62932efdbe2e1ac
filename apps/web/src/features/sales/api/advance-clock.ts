import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { BillingResponse } from '@rinkwright/core';
import { api } from '../../../lib/api-client';
import { rinkApi, salesKeys } from './keys';

export const advanceClock = (slug: string, days: number) => api<BillingResponse>(rinkApi(slug, '/billing/test-clock'), { method: 'POST', body: { days } });

export function useAdvanceClock(slug: string) {
  const client = useQueryClient();
  return useMutation({
    mutationFn: (days: number) => advanceClock(slug, days),
    onSuccess: (billing) => {
      client.setQueryData(salesKeys.billing(slug), billing);
      // Renewals and expiries happened on the moved clock: every balance and list of the rink may have changed.
      return client.invalidateQueries({ queryKey: ['rink', slug], predicate: (q) => q.queryKey[2] !== 'billing' });
    },
  });
}
