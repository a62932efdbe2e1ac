import { queryOptions, useQuery } from '@tanstack/react-query';
import type { PortalRinkDetail } from '@rinkwright/core';
import { api } from '../../../lib/api-client';
import { portalApi, portalKeys } from './keys';

export const getPortalRink = (slug: string, signal?: AbortSignal) => api<PortalRinkDetail>(portalApi(slug), { signal });

export const portalRinkQuery = (slug: string) => queryOptions({ queryKey: portalKeys.rink(slug), queryFn: ({ signal }) => getPortalRink(slug, signal) });

export const usePortalRink = (slug: string) => useQuery(portalRinkQuery(slug));
