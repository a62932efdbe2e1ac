import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { BillingResponse } from '@rinkwright/core';
import { api } from '../../../lib/api-client';
import { rinkApi, salesKeys } from './keys';

export const refreshPayoutAccount = (slug: string) => api<BillingResponse>(rinkApi(slug, '/billing/payout-account/refresh'), { method: 'POST' });

export function useRefreshPayoutAccount(slug: string) {
  const client = useQueryClient();
  return useMutation({
    mutationFn: () => refreshPayoutAccount(slug),
    onSuccess: (billing) => client.setQueryData(salesKeys.billing(slug), billing),
  });
}
