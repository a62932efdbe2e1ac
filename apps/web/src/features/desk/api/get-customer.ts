import { queryOptions, useQuery } from '@tanstack/react-query';
import type { CustomerDetail } from '@rinkwright/core';
import { api } from '../../../lib/api-client';
import { deskKeys, rinkApi } from './keys';

export const getCustomer = (slug: string, id: string, signal?: AbortSignal) => api<CustomerDetail>(rinkApi(slug, `/customers/${id}`), { signal });

export const customerQuery = (slug: string, id: string) => queryOptions({ queryKey: deskKeys.customer(slug, id), queryFn: ({ signal }) => getCustomer(slug, id, signal) });

export const useCustomer = (slug: string, id: string | undefined) => useQuery({ ...customerQuery(slug, id ?? ''), enabled: Boolean(id) });
