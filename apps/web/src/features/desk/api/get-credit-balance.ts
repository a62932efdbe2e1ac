import { queryOptions, useQuery } from '@tanstack/react-query';
import type { BalanceResponse } from '@rinkwright/core';
import { api } from '../../../lib/api-client';
import { rinkApi } from './keys';

// The same key as the credits panel's, so a redemption there and an intake here refresh one another.
export const creditBalanceKey = (slug: string, customerId: string) => ['rink', slug, 'credits', 'customer', customerId, 'balance'] as const;

export const creditBalanceQuery = (slug: string, customerId: string) =>
  queryOptions({
    queryKey: creditBalanceKey(slug, customerId),
    queryFn: ({ signal }) => api<BalanceResponse>(rinkApi(slug, `/customers/${encodeURIComponent(customerId)}/balance`), { signal }),
  });

export const useCreditBalance = (slug: string, customerId: string, enabled: boolean) => useQuery({ ...creditBalanceQuery(slug, customerId), enabled });
