import { queryOptions, useQuery } from '@tanstack/react-query';
import type { PortalRink } from '@rinkwright/core';
import { api } from '../../../lib/api-client';
import { portalKeys } from './keys';

export const getPortalHome = (signal?: AbortSignal) => api<{ rinks: PortalRink[] }>('/api/portal', { signal });

export const portalHomeQuery = queryOptions({ queryKey: portalKeys.home(), queryFn: ({ signal }) => getPortalHome(signal) });

export const usePortalHome = () => useQuery(portalHomeQuery);
