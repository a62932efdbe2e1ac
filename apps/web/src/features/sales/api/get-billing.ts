import { queryOptions, useQuery } from '@tanstack/react-query';
import type { BillingResponse } from '@rinkwright/core';
import { api } from '../../../lib/api-client';
import { rinkApi, salesKeys } from './keys';

export const getBilling = (slug: string, signal?: AbortSignal) => api<BillingResponse>(rinkApi(slug, '/billing'), { signal });

export const billingQuery = (slug: string) => queryOptions({ queryKey: salesKeys.billing(slug), queryFn: ({ signal }) => getBilling(slug, signal) });

export const useBilling = (slug: string, enabled = true) => useQuery({ ...billingQuery(slug), enabled });
