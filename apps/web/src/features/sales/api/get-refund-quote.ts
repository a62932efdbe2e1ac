import { queryOptions, useQuery } from '@tanstack/react-query';
import type { RefundQuote } from '@rinkwright/core';
import { api } from '../../../lib/api-client';
import { rinkApi, salesKeys } from './keys';

export const getRefundQuote = (slug: string, paymentId: string, signal?: AbortSignal) =>
  api<RefundQuote>(rinkApi(slug, `/payments/${encodeURIComponent(paymentId)}/refund-quote`), { signal });

// Always asked afresh: a credit redeemed a minute ago changes what a refund returns.
export const refundQuoteQuery = (slug: string, paymentId: string) =>
  queryOptions({ queryKey: salesKeys.refundQuote(slug, paymentId), queryFn: ({ signal }) => getRefundQuote(slug, paymentId, signal), staleTime: 0 });

export const useRefundQuote = (slug: string, paymentId: string) => useQuery(refundQuoteQuery(slug, paymentId));
