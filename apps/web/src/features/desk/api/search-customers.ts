import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { CustomerRow } from '@rinkwright/core';
import { api } from '../../../lib/api-client';
import { deskKeys, rinkApi } from './keys';

export const searchCustomers = (slug: string, q: string, signal?: AbortSignal) =>
  api<{ customers: CustomerRow[] }>(rinkApi(slug, `/customers?q=${encodeURIComponent(q)}`), { signal });

export const customerSearchQuery = (slug: string, q: string) =>
  queryOptions({ queryKey: deskKeys.customerSearch(slug, q), queryFn: ({ signal }) => searchCustomers(slug, q, signal), placeholderData: keepPreviousData });

export const useCustomerSearch = (slug: string, q: string) => useQuery(customerSearchQuery(slug, q));
