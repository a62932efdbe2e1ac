import { queryOptions, useQuery } from '@tanstack/react-query';
import type { MeResponse, PublicConfig } from '@rinkwright/core';
import { api, ApiError } from './api-client';

export const meKey = ['me'] as const;

/** The signed-in user with their rinks, or null when signed out. */
export const meQuery = queryOptions({
  queryKey: meKey,
  queryFn: async ({ signal }): Promise<MeResponse | null> => {
    try {
      return await api<MeResponse>('/api/me', { signal });
    } catch (error) {
      if (error instanceof ApiError && error.status === 401) return null;
      throw error;
    }
  },
});

export const useMe = () => useQuery(meQuery);

export const configQuery = queryOptions({
  queryKey: ['config'] as const,
  queryFn: ({ signal }) => api<PublicConfig>('/api/config', { signal }),
  staleTime: Infinity,
});
export const useConfig = () => useQuery(configQuery);

/** Where a signed-in user lands: their one rink, or the list of rinks. */
export function homeOf(me: MeResponse): string {
  const only = me.rinks.length === 1 ? me.rinks[0] : undefined;
  return only ? `/rinks/${only.slug}` : '/rinks';
}
