import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { ServiceInput, ServiceRow } from '@rinkwright/core';
import { api } from '../../../lib/api-client';
import { serviceKeys } from '../../../lib/queries/services';
import { servicesPath } from './paths';

export const createService = (slug: string, input: ServiceInput) => api<ServiceRow>(servicesPath(slug), { method: 'POST', body: input });

export function useCreateService(slug: string) {
  const client = useQueryClient();
  return useMutation({
    mutationFn: (input: ServiceInput) => createService(slug, input),
    onSuccess: () => client.invalidateQueries({ queryKey: serviceKeys.list(slug) }),
  });
}
