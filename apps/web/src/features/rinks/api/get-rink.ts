import { queryOptions, useQuery } from '@tanstack/react-query';
import type { RinkSummary } from '@rinkwright/core';
import { api } from '../../../lib/api-client';

export const rinkKeys = {
  all: (slug: string) => ['rink', slug] as const,
  summary: (slug: string) => ['rink', slug, 'summary'] as const,
};

export const getRink = (slug: string, signal?: AbortSignal) => api<RinkSummary>(`/api/rinks/${encodeURIComponent(slug)}`, { signal });

export const rinkQuery = (slug: string) => queryOptions({ queryKey: rinkKeys.summary(slug), queryFn: ({ signal }) => getRink(slug, signal) });

export const useRinkSummary = (slug: string) => useQuery(rinkQuery(slug));
