import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { ServiceInput, ServiceRow } from '@rinkwright/core';
import { api } from '../../../lib/api-client';
import { serviceKeys } from '../../../lib/queries/services';
import { servicesPath } from './paths';

export const updateService = (slug: string, serviceId: string, input: ServiceInput) =>
  api<ServiceRow>(servicesPath(slug, `/${encodeURIComponent(serviceId)}`), { method: 'PUT', body: input });

export function useUpdateService(slug: string) {
  const client = useQueryClient();
  return useMutation({
    mutationFn: ({ serviceId, input }: { serviceId: string; input: ServiceInput }) => updateService(slug, serviceId, input),
    onSuccess: () => client.invalidateQueries({ queryKey: serviceKeys.list(slug) }),
  });
}
