import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { CounterSaleInput, PaymentRow } from '@rinkwright/core';
import { api } from '../../../lib/api-client';
import { rinkApi, salesKeys } from './keys';

export const sellAtCounter = (slug: string, customerId: string, input: CounterSaleInput, key: string) =>
  api<{ payment: PaymentRow; balance: number }>(rinkApi(slug, `/customers/${encodeURIComponent(customerId)}/sales`), {
    method: 'POST',
    body: input,
    headers: { 'Idempotency-Key': key },
  });

export function useSellAtCounter(slug: string, customerId: string) {
  const client = useQueryClient();
  return useMutation({
    mutationFn: ({ input, key }: { input: CounterSaleInput; key: string }) => sellAtCounter(slug, customerId, input, key),
    onSettled: () => client.invalidateQueries({ queryKey: salesKeys.customerCredits(slug, customerId) }),
  });
}
