import { queryOptions, useQuery } from '@tanstack/react-query';
import type { PlatformRinkRow } from '@rinkwright/core';
import { api } from '../../../lib/api-client';

export const platformKeys = { rinks: ['platform', 'rinks'] as const };

export const getPlatformRinks = (signal?: AbortSignal) => api<{ rinks: PlatformRinkRow[] }>('/api/platform/rinks', { signal });

export const platformRinksQuery = queryOptions({ queryKey: platformKeys.rinks, queryFn: ({ signal }) => getPlatformRinks(signal) });

export const usePlatformRinks = () => useQuery(platformRinksQuery);
