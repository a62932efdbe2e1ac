import { queryOptions, useQuery } from '@tanstack/react-query';
import type { BalanceResponse } from '@rinkwright/core';
import { api } from '../../../lib/api-client';
import { rinkApi, salesKeys } from './keys';

export const getBalance = (slug: string, customerId: string, signal?: AbortSignal) =>
  api<BalanceResponse>(rinkApi(slug, `/customers/${encodeURIComponent(customerId)}/balance`), { signal });

export const balanceQuery = (slug: string, customerId: string) =>
  queryOptions({ queryKey: salesKeys.balance(slug, customerId), queryFn: ({ signal }) => getBalance(slug, customerId, signal) });

export const useBalance = (slug: string, customerId: string) => useQuery(balanceQuery(slug, customerId));
