import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { ProductInput, ProductRow } from '@rinkwright/core';
import { api } from '../../../lib/api-client';
import { rinkApi, salesKeys } from './keys';

/** A changed product, or only stopping/resuming its sale; a new price becomes a new version on the server. */
export type ProductChange = { input?: ProductInput; active?: boolean };

export const updateProduct = (slug: string, productId: string, change: ProductChange) =>
  api<ProductRow>(rinkApi(slug, `/products/${encodeURIComponent(productId)}`), { method: 'PATCH', body: change });

export function useUpdateProduct(slug: string) {
  const client = useQueryClient();
  return useMutation({
    mutationFn: ({ productId, change }: { productId: string; change: ProductChange }) => updateProduct(slug, productId, change),
    onSuccess: () => client.invalidateQueries({ queryKey: salesKeys.products(slug) }),
  });
}
