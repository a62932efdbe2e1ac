import { queryOptions, useQuery } from '@tanstack/react-query';
import type { ServiceRow } from '@rinkwright/core';
import { api } from '../api-client';

// The rink's services, read by the intake form and the services page alike.
export const serviceKeys = { list: (slug: string) => ['rink', slug, 'services', 'list'] as const };

export const servicesQuery = (slug: string) =>
  queryOptions({
    queryKey: serviceKeys.list(slug),
    queryFn: ({ signal }) => api<{ services: ServiceRow[] }>(`/api/rinks/${encodeURIComponent(slug)}/services`, { signal }),
  });

export const useServices = (slug: string) => useQuery(servicesQuery(slug));
