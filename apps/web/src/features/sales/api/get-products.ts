import { queryOptions, useQuery } from '@tanstack/react-query';
import type { ProductRow } from '@rinkwright/core';
import { api } from '../../../lib/api-client';
import { rinkApi, salesKeys } from './keys';

export const getProducts = (slug: string, signal?: AbortSignal) => api<{ products: ProductRow[] }>(rinkApi(slug, '/products'), { signal });

export const productsQuery = (slug: string) => queryOptions({ queryKey: salesKeys.products(slug), queryFn: ({ signal }) => getProducts(slug, signal) });

export const useProducts = (slug: string, enabled = true) => useQuery({ ...productsQuery(slug), enabled });
