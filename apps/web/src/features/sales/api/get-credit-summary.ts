import { queryOptions, useQuery } from '@tanstack/react-query';
import type { CreditSummary } from '@rinkwright/core';
import { api } from '../../../lib/api-client';
import { rinkApi, salesKeys } from './keys';

export const getCreditSummary = (slug: string, signal?: AbortSignal) => api<CreditSummary>(rinkApi(slug, '/credits/summary'), { signal });

export const creditSummaryQuery = (slug: string) => queryOptions({ queryKey: salesKeys.creditSummary(slug), queryFn: ({ signal }) => getCreditSummary(slug, signal) });

export const useCreditSummary = (slug: string) => useQuery(creditSummaryQuery(slug));
