import { queryOptions, useQuery } from '@tanstack/react-query';
import type { PublicRink } from '@rinkwright/core';
import { api } from '../../../lib/api-client';
import { publicApi, publicKeys } from './keys';

export const getPublicRink = (slug: string, signal?: AbortSignal) => api<PublicRink>(publicApi(slug), { signal });

export const publicRinkQuery = (slug: string) => queryOptions({ queryKey: publicKeys.rink(slug), queryFn: ({ signal }) => getPublicRink(slug, signal) });

export const usePublicRink = (slug: string) => useQuery(publicRinkQuery(slug));
