import { queryOptions, useQuery } from '@tanstack/react-query';
import type { counterTeams } from '@rinkwright/core';
import type { z } from 'zod';
import { api } from '../../../lib/api-client';
import { rinkApi } from './keys';

export type CounterTeams = z.infer<typeof counterTeams>;

/** League teams whose allocation an intake can draw from, with the credits each has left. */
export const counterTeamsQuery = (slug: string) =>
  queryOptions({
    queryKey: ['rink', slug, 'leagues', 'counter-teams'] as const,
    queryFn: ({ signal }) => api<CounterTeams>(rinkApi(slug, '/teams'), { signal }),
  });

export const useCounterTeams = (slug: string, enabled: boolean) => useQuery({ ...counterTeamsQuery(slug), enabled });
