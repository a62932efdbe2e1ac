import { queryOptions, useQuery } from '@tanstack/react-query';
import type { PublicRink } from '@rinkwright/core';
import { api } from '../../../lib/api-client';
import { portalKeys } from './keys';

// The portal's own record has no word on whether the rink can take payments now; its public page does.
export const getSelling = async (slug: string, signal?: AbortSignal) => (await api<PublicRink>(`/api/public/rinks/${encodeURIComponent(slug)}`, { signal })).selling;

export const sellingQuery = (slug: string) => queryOptions({ queryKey: portalKeys.selling(slug), queryFn: ({ signal }) => getSelling(slug, signal) });

export const useSelling = (slug: string) => useQuery(sellingQuery(slug));
