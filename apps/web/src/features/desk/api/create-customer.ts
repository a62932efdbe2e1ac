import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { CreateCustomerInput, CustomerRow } from '@rinkwright/core';
import { ApiError, api } from '../../../lib/api-client';
import { deskKeys, rinkApi } from './keys';

export const createCustomer = (slug: string, input: CreateCustomerInput, key: string) =>
  api<CustomerRow>(rinkApi(slug, '/customers'), { method: 'POST', body: input, headers: { 'Idempotency-Key': key } });

/** A walk-up is made once however often the button is pressed: TanStack retries a failed send with the same key. */
export function useCreateCustomer(slug: string) {
  const client = useQueryClient();
  return useMutation({
    mutationFn: ({ input, key }: { input: CreateCustomerInput; key: string }) => createCustomer(slug, input, key),
    retry: (count, error) => error instanceof ApiError && error.code === 'network' && count < 3,
    onSuccess: () => client.invalidateQueries({ queryKey: deskKeys.customers(slug) }),
  });
}
