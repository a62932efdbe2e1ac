import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { ProductInput, ProductRow } from '@rinkwright/core';
import { api } from '../../../lib/api-client';
import { rinkApi, salesKeys } from './keys';

export const createProduct = (slug: string, input: ProductInput) => api<ProductRow>(rinkApi(slug, '/products'), { method: 'POST', body: input });

export function useCreateProduct(slug: string) {
  const client = useQueryClient();
  return useMutation({
    mutationFn: (input: ProductInput) => createProduct(slug, input),
    onSuccess: () => client.invalidateQueries({ queryKey: salesKeys.products(slug) }),
  });
}
