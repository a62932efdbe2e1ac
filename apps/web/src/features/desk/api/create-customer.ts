import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { CreateCustomerInput, CustomerRow } from '@rinkwright/core';
import { api } from '../../../lib/api-client';
import { deskKeys, rinkApi } from './keys';

export const createCustomer = (slug: string, input: CreateCustomerInput) => api<CustomerRow>(rinkApi(slug, '/customers'), { method: 'POST', body: input });

export function useCreateCustomer(slug: string) {
  const client = useQueryClient();
  return useMutation({ mutationFn: (input: CreateCustomerInput) => createCustomer(slug, input), onSuccess: () => client.invalidateQueries({ queryKey: deskKeys.customers(slug) }) });
}
