import { queryOptions, useQuery } from '@tanstack/react-query';
import type { PlatformRinkRow } from '@rinkwright/core';
import { api } from '../../../lib/api-client';

// A rink's reports in the console are cached under ['platform', 'rinks', rinkId, 'reports', …]; a change to the
// list refreshes the list alone (exact), not every report read so far.
export const platformKeys = { rinks: ['platform', 'rinks'] as const };

export const getPlatformRinks = (signal?: AbortSignal) => api<{ rinks: PlatformRinkRow[] }>('/api/platform/rinks', { signal });

// The console is where the platform watches its rinks: each visit reads the list again rather than the cache.
export const platformRinksQuery = queryOptions({ queryKey: platformKeys.rinks, queryFn: ({ signal }) => getPlatformRinks(signal), staleTime: 0 });

export const usePlatformRinks = () => useQuery(platformRinksQuery);
