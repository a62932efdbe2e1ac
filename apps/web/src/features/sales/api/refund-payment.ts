import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { PaymentRow } from '@rinkwright/core';
import { api } from '../../../lib/api-client';
import { rinkApi, salesKeys } from './keys';

export const refundPayment = (slug: string, paymentId: string, reason: string, key: string) =>
  api<PaymentRow>(rinkApi(slug, `/payments/${encodeURIComponent(paymentId)}/refunds`), { method: 'POST', body: { reason }, headers: { 'Idempotency-Key': key } });

export function useRefundPayment(slug: string, customerId: string) {
  const client = useQueryClient();
  return useMutation({
    mutationFn: ({ paymentId, reason, key }: { paymentId: string; reason: string; key: string }) => refundPayment(slug, paymentId, reason, key),
    onSettled: () => client.invalidateQueries({ queryKey: salesKeys.customerCredits(slug, customerId) }),
  });
}
